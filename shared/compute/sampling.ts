/**
 * ISO 2859-1 attribute sampling: code letters, single sampling plans (normal, tightened,
 * reduced), zero-acceptance plans and the switching rules between severities.
 *
 * Everything here is pure. The switching rules are a state machine: the caller stores the
 * state per supplier × part and passes it back with each lot result.
 */
import { ComputeError } from './errors';
import {
  AQL_VALUES,
  CODE_LETTER_RANGES,
  CODE_LETTERS,
  INSPECTION_LEVELS,
  MIN_LOT_SIZE,
  NORMAL_LADDER,
  NORMAL_TABLE,
  PLAN_TABLES,
  SEVERITIES,
  type Aql,
  type CodeLetter,
  type InspectionLevel,
  type PlanTable,
  type Severity,
  type TableCell,
} from './sampling-tables';

export { AQL_VALUES, CODE_LETTERS, INSPECTION_LEVELS, SEVERITIES };
export type { Aql, CodeLetter, InspectionLevel, Severity };

// ---------------------------------------------------------------------------------------------
// Input checks
// ---------------------------------------------------------------------------------------------

function assertLotSize(lotSize: number, min: number): void {
  if (!Number.isInteger(lotSize) || lotSize < min) {
    throw new ComputeError(
      `Lot size must be a whole number of at least ${min} (got ${String(lotSize)}).`,
      'lotSize',
    );
  }
}

function levelIndex(level: InspectionLevel): number {
  const index = INSPECTION_LEVELS.indexOf(level);
  if (index < 0) {
    throw new ComputeError(
      `Unknown inspection level "${String(level)}". Use one of ${INSPECTION_LEVELS.join(', ')}.`,
      'level',
    );
  }
  return index;
}

function aqlIndex(aql: number): number {
  const index = (AQL_VALUES as readonly number[]).indexOf(aql);
  if (index < 0) {
    throw new ComputeError(
      `AQL ${String(aql)} is not a column of the sampling tables. Use one of ${AQL_VALUES.join(', ')}.`,
      'aql',
    );
  }
  return index;
}

function assertSeverity(severity: Severity): void {
  if (!SEVERITIES.includes(severity)) {
    throw new ComputeError(
      `Unknown inspection severity "${String(severity)}". Use one of ${SEVERITIES.join(', ')}.`,
      'severity',
    );
  }
}

function rowIndex(letter: CodeLetter): number {
  const index = CODE_LETTERS.indexOf(letter);
  if (index < 0) throw new ComputeError(`Unknown code letter "${String(letter)}".`, 'codeLetter');
  return index;
}

// ---------------------------------------------------------------------------------------------
// Code letters (ISO 2859-1 Table 1)
// ---------------------------------------------------------------------------------------------

/** Sample-size code letter for a lot (ISO 2859-1 Table 1). */
export function codeLetter(lotSize: number, level: InspectionLevel): CodeLetter {
  assertLotSize(lotSize, MIN_LOT_SIZE);
  const column = levelIndex(level);
  // The last range is open-ended (maxLotSize Infinity), so a valid lot size always finds one.
  const range = CODE_LETTER_RANGES.find((r) => lotSize <= r.maxLotSize);
  if (!range) throw new Error(`Table 1 has no range for lot size ${lotSize}`);
  return range.letters[column];
}

// ---------------------------------------------------------------------------------------------
// Single sampling plans (ISO 2859-1 Tables 2-A, 2-B; reduced per REFERENCES.md)
// ---------------------------------------------------------------------------------------------

/** The plan read from a table after following its arrows, before the lot size is considered. */
export interface ResolvedPlan {
  /** The row actually used. It differs from the code letter when an arrow was followed. */
  planLetter: CodeLetter;
  /** That row's sample size. */
  sampleSize: number;
  accept: number;
  reject: number;
  table: string;
}

export interface SamplingPlanInput {
  lotSize: number;
  level: InspectionLevel;
  aql: number;
  severity: Severity;
}

export interface SamplingPlan {
  codeLetter: CodeLetter;
  planLetter: CodeLetter;
  /** Units to inspect: the plan's sample size, or the whole lot when that is smaller. */
  sampleSize: number;
  /** The sample size printed in the table row used, before capping at the lot size. */
  planSampleSize: number;
  accept: number;
  reject: number;
  /** True when the plan's sample size is at least the lot size: inspect every unit. */
  inspectAll: boolean;
  /** Which published table the plan follows. */
  table: string;
  severity: Severity;
  aql: Aql;
  level: InspectionLevel;
  lotSize: number;
}

/**
 * Follows the arrows of a severity's table from (code letter, AQL) to a plan. Per the note to
 * Tables 2-A/2-B: ↓ use the first plan below, ↑ the first plan above, and then use THAT row's
 * sample size. Cells passed on the way are not plans and are skipped.
 */
export function resolvePlan(letter: CodeLetter, aql: number, severity: Severity): ResolvedPlan {
  assertSeverity(severity);
  const column = aqlIndex(aql);
  const table: PlanTable = PLAN_TABLES[severity];
  const start = rowIndex(letter);
  const first: TableCell = table.rows[start].cells[column];
  const step = first.kind === 'down' ? 1 : first.kind === 'up' ? -1 : 0;

  let row = start;
  let cell = first;
  while (cell.kind !== 'plan') {
    row += step;
    if (row < 0 || row >= table.rows.length) {
      const edge = step < 0 ? 'up past the top' : 'down past the bottom';
      throw new ComputeError(
        `There is no ${severity} plan for code letter ${letter} at AQL ${aql}: ${table.label} ` +
          `points ${edge} of the table. Choose another AQL or inspection level.`,
        'aql',
      );
    }
    cell = table.rows[row].cells[column];
  }
  return {
    planLetter: table.rows[row].letter,
    sampleSize: table.rows[row].sampleSize,
    accept: cell.accept,
    reject: cell.reject,
    table: table.label,
  };
}

/**
 * Single sampling plan for a lot.
 *
 * When the plan's sample size is at least the lot size, the lot is inspected 100 %
 * (REFERENCES.md: "if n ≥ lot size inspect 100 %"). Then `sampleSize` becomes the lot size and Ac/Re
 * stay as the plan prints them. We chose to keep the plan's Ac/Re rather than demand zero
 * nonconforming units, because that is the usual practice (common practice) and it keeps the
 * verdict the one the plan would give. A part that must have no nonconforming units should
 * use `zeroAcceptancePlan`.
 */
export function samplingPlan(input: SamplingPlanInput): SamplingPlan {
  const { lotSize, level, aql, severity } = input;
  assertSeverity(severity);
  const letter = codeLetter(lotSize, level);
  const resolved = resolvePlan(letter, aql, severity);
  const inspectAll = resolved.sampleSize >= lotSize;
  return {
    codeLetter: letter,
    planLetter: resolved.planLetter,
    sampleSize: inspectAll ? lotSize : resolved.sampleSize,
    planSampleSize: resolved.sampleSize,
    accept: resolved.accept,
    reject: resolved.reject,
    inspectAll,
    table: resolved.table,
    severity,
    aql: aql as Aql,
    level,
    lotSize,
  };
}

// ---------------------------------------------------------------------------------------------
// Zero-acceptance plans (common practice: c = 0, the sample size is set by the inspection plan)
// ---------------------------------------------------------------------------------------------

export interface ZeroAcceptancePlanInput {
  lotSize: number;
  sampleSize: number;
}

export interface ZeroAcceptancePlan {
  sampleSize: number;
  accept: 0;
  reject: 1;
  inspectAll: boolean;
  table: string;
  lotSize: number;
}

/** A c = 0 plan: inspect n = min(sample size, lot size); one nonconforming unit rejects. */
export function zeroAcceptancePlan(input: ZeroAcceptancePlanInput): ZeroAcceptancePlan {
  const { lotSize, sampleSize } = input;
  // A single-unit lot is a valid zero-acceptance case (inspect it), unlike Table 1, which starts at 2.
  assertLotSize(lotSize, 1);
  if (!Number.isInteger(sampleSize) || sampleSize < 1) {
    throw new ComputeError(
      `Sample size must be a whole number of at least 1 (got ${String(sampleSize)}).`,
      'sampleSize',
    );
  }
  const n = Math.min(sampleSize, lotSize);
  return {
    sampleSize: n,
    accept: 0,
    reject: 1,
    inspectAll: n >= lotSize,
    table: 'Zero acceptance, c = 0 (common practice)',
    lotSize,
  };
}

// ---------------------------------------------------------------------------------------------
// Judging a lot
// ---------------------------------------------------------------------------------------------

/** The parts of a plan needed to judge a lot; both plan kinds above fit. */
export interface JudgeablePlan {
  sampleSize: number;
  accept: number;
  reject: number;
  severity?: Severity;
}

export interface LotJudgement {
  accepted: boolean;
  /**
   * Reduced inspection only: the result was above Ac, so normal inspection resumes with the
   * next lot. This covers a result in the gap (Ac < d < Re), where the lot is still accepted,
   * and a rejection (MIL-STD-105E reduced-inspection rule, (memory); REFERENCES.md).
   */
  returnToNormal: boolean;
}

export function judgeLot(plan: JudgeablePlan, nonconforming: number): LotJudgement {
  if (!Number.isInteger(nonconforming) || nonconforming < 0 || nonconforming > plan.sampleSize) {
    throw new ComputeError(
      `Nonconforming count must be a whole number from 0 to the sample size ${plan.sampleSize} ` +
        `(got ${String(nonconforming)}).`,
      'nonconforming',
    );
  }
  // d ≤ Ac accepts and d ≥ Re rejects. On normal and tightened Re = Ac + 1, so d < Re is the whole
  // rule. On reduced, a d in the gap is still accepted.
  const accepted = nonconforming < plan.reject;
  const returnToNormal = plan.severity === 'reduced' && nonconforming > plan.accept;
  return { accepted, returnToNormal };
}

// ---------------------------------------------------------------------------------------------
// Switching rules (ISO 2859-1 §9.3; subclause numbers below are recalled, (memory))
// ---------------------------------------------------------------------------------------------

export interface SwitchingState {
  severity: Severity;
  /** Lots accepted in a row on the current severity. */
  consecutiveAccepted: number;
  /** Results (true = accepted) of the last up to 5 lots on the current severity, oldest first. */
  recentResults: boolean[];
  /** Switching score; kept only on normal inspection and reset when normal inspection starts. */
  switchingScore: number;
  /** Lots not accepted since tightened inspection started (cumulative, for discontinuation). */
  notAcceptedOnTightened: number;
  /** Acceptance stopped: receiving is blocked until the supplier has acted. */
  discontinued: boolean;
  /** Score ≥ 30 with steady production, waiting for the engineer to approve reduced inspection. */
  reducedEligible: boolean;
}

export type SwitchingEvent =
  | 'to-tightened'
  | 'to-normal'
  | 'to-reduced'
  | 'discontinued'
  | 'reduced-eligible';

export interface LotResult {
  /** Verdict on original inspection. It may be false with d < Re (lot refused for another reason). */
  accepted: boolean;
  nonconforming: number;
  /** The plan the lot was inspected with. */
  plan: SamplingPlan;
  aql: number;
  level: InspectionLevel;
  lotSize: number;
}

export interface SwitchingOptions {
  /** The responsible engineer considers reduced inspection desirable. */
  engineerApprovesReduced?: boolean;
  /** Production is at a steady rate. Taken as true unless the caller says otherwise. */
  productionSteady?: boolean;
}

export interface SwitchingStep {
  state: SwitchingState;
  event?: SwitchingEvent;
  reason: string;
}

/** Switching score at which reduced inspection may start (ISO 2859-1 §9.3.3.2, (memory)). */
export const REDUCED_SWITCHING_SCORE = 30;
/** Lots looked back over for the normal → tightened rule, and accepted in a row to leave tightened. */
const SWITCHING_WINDOW = 5;
/** Lots not accepted on tightened inspection that stop acceptance. */
const DISCONTINUE_AFTER = 5;

/** State at the start of inspection: normal, score 0 (ISO 2859-1 §9.1, normal unless specified). */
export function initialSwitchingState(): SwitchingState {
  return freshState('normal');
}

function freshState(severity: Severity): SwitchingState {
  return {
    severity,
    consecutiveAccepted: 0,
    recentResults: [],
    switchingScore: 0,
    notAcceptedOnTightened: 0,
    discontinued: false,
    reducedEligible: false,
  };
}

function pushRecent(recent: readonly boolean[], accepted: boolean): boolean[] {
  return [...recent, accepted].slice(-SWITCHING_WINDOW);
}

/**
 * Ac of the plan one AQL step tighter in the same row. The same row means the same sample, so
 * the lot's d can be judged against it. REFERENCES: J/1.0 (80, 2/3) → J/0.65 (80, 1/2). The row
 * is the plan letter rather than the code letter because, after a ↑ arrow (for example K/15 →
 * J/15), only the plan row's n matches the sample actually inspected. For Ac ≥ 2 the left
 * neighbour in Table 2-A is always a plan. In the 0.10 column that neighbour (AQL 0.065) is
 * not printed, so the previous rung of the normal ladder is used: the diagonal pattern, (memory).
 */
export function acceptanceOneStepTighter(planLetter: CodeLetter, aql: number): number {
  const column = aqlIndex(aql);
  const row = NORMAL_TABLE.rows[rowIndex(planLetter)];
  const here = row.cells[column];
  if (here.kind !== 'plan') {
    throw new Error(`Table 2-A ${planLetter}/${aql} is an arrow; the switching score needs a plan`);
  }
  if (column > 0) {
    const left = row.cells[column - 1];
    if (left.kind === 'plan') return left.accept;
    throw new Error(`Table 2-A left of ${planLetter}/${aql} is an arrow; expected a plan for Ac ≥ 2`);
  }
  const rung = NORMAL_LADDER.indexOf(`${here.accept}/${here.reject}`);
  if (rung <= 0) throw new Error(`Table 2-A ${planLetter}/${aql}: no tighter rung on the ladder`);
  return Number(NORMAL_LADDER[rung - 1].split('/')[0]);
}

/**
 * Switching score after one lot on normal inspection (ISO 2859-1 §9.3.3.2, (memory), close
 * paraphrase in REFERENCES.md):
 * - single sampling with Ac ≥ 2: +3 if the lot would have been accepted at the AQL one step
 *   tighter, otherwise reset to 0;
 * - Ac 0 or 1: +2 if the lot is accepted, otherwise reset to 0.
 */
export function nextSwitchingScore(score: number, lot: LotResult): number {
  const { plan } = lot;
  if (plan.accept >= 2) {
    const tighterAc = acceptanceOneStepTighter(plan.planLetter, plan.aql);
    return lot.accepted && lot.nonconforming <= tighterAc ? score + 3 : 0;
  }
  return lot.accepted ? score + 2 : 0;
}

function assertLotResult(state: SwitchingState, lot: LotResult): void {
  const { plan } = lot;
  if (plan.severity !== state.severity) {
    throw new ComputeError(
      `The lot was inspected on a ${plan.severity} plan, but ${state.severity} inspection is in effect.`,
      'plan',
    );
  }
  if (plan.aql !== lot.aql || plan.level !== lot.level || plan.lotSize !== lot.lotSize) {
    throw new ComputeError(
      'The plan was drawn for a different AQL, inspection level or lot size than this lot.',
      'plan',
    );
  }
  const verdict = judgeLot(plan, lot.nonconforming);
  if (lot.accepted && !verdict.accepted) {
    throw new ComputeError(
      `${lot.nonconforming} nonconforming reaches Re ${plan.reject}: the lot cannot be recorded as ` +
        'accepted on original inspection.',
      'accepted',
    );
  }
}

/**
 * Applies one lot's result to the switching state. Throws ComputeError while acceptance is
 * discontinued, or when the lot result does not fit the state.
 */
export function nextSwitchingState(
  state: SwitchingState,
  lot: LotResult,
  opts: SwitchingOptions = {},
): SwitchingStep {
  if (state.discontinued) {
    throw new ComputeError(
      'Acceptance is stopped: 5 lots were not accepted on tightened inspection. Record the ' +
        "supplier's corrective action to resume on tightened inspection.",
      'state',
    );
  }
  assertLotResult(state, lot);
  switch (state.severity) {
    case 'normal':
      return stepNormal(state, lot, opts);
    case 'tightened':
      return stepTightened(state, lot);
    case 'reduced':
      return stepReduced(state, lot, opts);
  }
}

function stepNormal(state: SwitchingState, lot: LotResult, opts: SwitchingOptions): SwitchingStep {
  const recentResults = pushRecent(state.recentResults, lot.accepted);

  // ISO 2859-1 §9.3 (§9.3.1, (memory)): normal → tightened as soon as 2 out of 5 or fewer
  // consecutive lots are not accepted on original inspection. Switching happens on the second
  // such lot, so counting within the last 5 is exactly this rule.
  if (recentResults.filter((accepted) => !accepted).length >= 2) {
    return {
      state: freshState('tightened'),
      event: 'to-tightened',
      reason:
        `2 of the last ${recentResults.length} lots on normal inspection were not accepted: ` +
        'tightened inspection starts with the next lot (ISO 2859-1 §9.3).',
    };
  }

  // ISO 2859-1 §9.3.3.2, (memory): normal → reduced needs ALL of: switching score ≥ 30, production
  // at a steady rate, and the responsible authority (here the engineer) approving.
  const switchingScore = nextSwitchingScore(state.switchingScore, lot);
  const steady = opts.productionSteady ?? true;
  const reducedEligible = switchingScore >= REDUCED_SWITCHING_SCORE && steady;
  if (reducedEligible && opts.engineerApprovesReduced === true) {
    return {
      state: freshState('reduced'),
      event: 'to-reduced',
      reason:
        `Switching score ${switchingScore} ≥ ${REDUCED_SWITCHING_SCORE}, production steady and ` +
        'the engineer approves: reduced inspection starts with the next lot (ISO 2859-1 §9.3).',
    };
  }

  const next: SwitchingState = {
    ...state,
    recentResults,
    consecutiveAccepted: lot.accepted ? state.consecutiveAccepted + 1 : 0,
    switchingScore,
    reducedEligible,
  };
  if (reducedEligible && !state.reducedEligible) {
    return {
      state: next,
      event: 'reduced-eligible',
      reason:
        `Switching score ${switchingScore} ≥ ${REDUCED_SWITCHING_SCORE} with steady production: ` +
        'reduced inspection may start once the engineer approves (ISO 2859-1 §9.3).',
    };
  }
  const blocked =
    switchingScore >= REDUCED_SWITCHING_SCORE && !steady ? ' Production is not steady, so reduced inspection is not allowed.' : '';
  return {
    state: next,
    reason: `Normal inspection continues; switching score ${switchingScore}.${blocked}`,
  };
}

function stepTightened(state: SwitchingState, lot: LotResult): SwitchingStep {
  const recentResults = pushRecent(state.recentResults, lot.accepted);

  if (!lot.accepted) {
    // ISO 2859-1 §9.4, (memory): if the cumulative number of lots not accepted in a sequence of
    // consecutive lots on original tightened inspection reaches 5, acceptance is discontinued
    // until the supplier has acted to improve quality.
    const notAcceptedOnTightened = state.notAcceptedOnTightened + 1;
    const next: SwitchingState = {
      ...state,
      recentResults,
      consecutiveAccepted: 0,
      notAcceptedOnTightened,
    };
    if (notAcceptedOnTightened >= DISCONTINUE_AFTER) {
      return {
        state: { ...next, discontinued: true },
        event: 'discontinued',
        reason:
          `${notAcceptedOnTightened} lots not accepted on tightened inspection: acceptance is ` +
          'stopped until the supplier has acted to improve quality (ISO 2859-1 §9.3, discontinuation).',
      };
    }
    return {
      state: next,
      reason:
        `Lot not accepted on tightened inspection (${notAcceptedOnTightened} of ${DISCONTINUE_AFTER}, ` +
        'at which acceptance stops).',
    };
  }

  // ISO 2859-1 §9.3 (§9.3.2, (memory)): tightened → normal when 5 consecutive lots are accepted
  // on original inspection.
  const consecutiveAccepted = state.consecutiveAccepted + 1;
  if (consecutiveAccepted >= SWITCHING_WINDOW) {
    return {
      state: freshState('normal'),
      event: 'to-normal',
      reason:
        `${consecutiveAccepted} consecutive lots accepted on tightened inspection: normal ` +
        'inspection starts with the next lot (ISO 2859-1 §9.3).',
    };
  }
  return {
    state: { ...state, recentResults, consecutiveAccepted },
    reason: `Tightened inspection continues; ${consecutiveAccepted} of ${SWITCHING_WINDOW} consecutive lots accepted.`,
  };
}

function stepReduced(state: SwitchingState, lot: LotResult, opts: SwitchingOptions): SwitchingStep {
  // ISO 2859-1 §9.3 (§9.3.4, (memory)): reduced → normal if a lot is not accepted, or production
  // becomes irregular or delayed. With the MIL-STD-105E Table II-C gap (REFERENCES.md, memory),
  // a result between Ac and Re accepts the lot but also returns to normal.
  const verdict = judgeLot(lot.plan, lot.nonconforming);
  const steady = opts.productionSteady ?? true;
  const why = !lot.accepted
    ? 'A lot was not accepted on reduced inspection'
    : verdict.returnToNormal
      ? `The lot is accepted, but ${lot.nonconforming} nonconforming exceeds Ac ${lot.plan.accept}`
      : !steady
        ? 'Production is no longer steady'
        : undefined;
  if (why !== undefined) {
    return {
      state: freshState('normal'),
      event: 'to-normal',
      reason: `${why}: normal inspection starts with the next lot (ISO 2859-1 §9.3).`,
    };
  }
  const recentResults = pushRecent(state.recentResults, true);
  return {
    state: { ...state, recentResults, consecutiveAccepted: state.consecutiveAccepted + 1 },
    reason: 'Reduced inspection continues.',
  };
}

/**
 * Engineer approval given between lots. Moves to reduced inspection when the state is already
 * eligible (ISO 2859-1 §9.3.3.2, (memory)).
 */
export function approveReducedInspection(state: SwitchingState): SwitchingStep {
  if (state.discontinued || state.severity !== 'normal' || !state.reducedEligible) {
    throw new ComputeError(
      `Reduced inspection needs normal inspection with a switching score of at least ` +
        `${REDUCED_SWITCHING_SCORE} and steady production (score now ${state.switchingScore}, ` +
        `${state.severity} inspection).`,
      'state',
    );
  }
  return {
    state: freshState('reduced'),
    event: 'to-reduced',
    reason: 'The engineer approves reduced inspection; it starts with the next lot (ISO 2859-1 §9.3).',
  };
}

/**
 * After the supplier's corrective action, inspection resumes on tightened inspection, as if
 * the normal → tightened rule had just been invoked (ISO 2859-1 §9.4, (memory)).
 */
export function resumeAfterSupplierAction(state: SwitchingState): SwitchingState {
  if (!state.discontinued) {
    throw new ComputeError('Acceptance is not stopped; there is nothing to resume.', 'state');
  }
  return freshState('tightened');
}
