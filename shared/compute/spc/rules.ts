import { ComputeError } from '../errors';

/**
 * Run rules for control charts: Western Electric 1–4 (Statistical Quality Control Handbook,
 * 1956, as stated in NIST/SEMATECH e-Handbook §6.3.2) and Nelson 1–8 (J. Quality Technology
 * 16(4), 1984).
 *
 * Conventions (each is pinned by a test in tests/unit/spc-rules.test.ts):
 * - σ is the standard deviation of the plotted statistic (σ/√n for an X-bar chart). It may be
 *   given per point (p charts with varying sample sizes); the centre line is one value.
 * - "Beyond kσ" is strict: a point exactly at c + 3σ is not beyond 3σ. Consequently "within
 *   kσ" includes the boundary: |x − c| ≤ kσ.
 * - Each side of the centre line is judged separately: "2 of 3 beyond 2σ" needs both points on
 *   the same side.
 * - A one-side run counts points strictly above (or strictly below) the centre; a point exactly
 *   on the centre line ends both runs.
 * - A trend counts strict rises (or falls) between consecutive points; a tie ends it. The same
 *   holds for alternation: a tie ends the zig-zag.
 * - Nelson 7 (15 within 1σ) and Nelson 8 (8 with none within 1σ) count points on either side,
 *   mixed freely; neither requires both sides to appear.
 * - Firing: a rule fires at every point that completes a qualifying window, and the completing
 *   point must itself meet the rule's condition. A run of 10 above the centre fires the
 *   8-in-a-row rule at indices 7, 8 and 9; points A, B beyond 2σ followed by a point inside
 *   fire "2 of 3" at B only (the third point does not complete anything).
 * - "Exactly on" allows for binary rounding: within 1e-12 of the values' magnitude counts as on
 *   the line, so 10.3 is exactly at 3σ for c = 10, σ = 0.1 although 10.3 − 10 > 0.3 in binary.
 * - One signal per rule per point; index is 0-based, the message counts points from 1.
 *
 * The evaluation is one pass with sliding counters: O(n) time whatever rules are chosen.
 */

export type RuleId =
  | 'we1'
  | 'we2'
  | 'we3'
  | 'we4'
  | 'trend6'
  | 'nelson1'
  | 'nelson2'
  | 'nelson3'
  | 'nelson4'
  | 'nelson5'
  | 'nelson6'
  | 'nelson7'
  | 'nelson8';

export type RuleSetName = 'western-electric' | 'nelson';

export const RULE_SETS: Readonly<Record<RuleSetName, readonly RuleId[]>> = {
  'western-electric': ['we1', 'we2', 'we3', 'we4', 'trend6'],
  nelson: ['nelson1', 'nelson2', 'nelson3', 'nelson4', 'nelson5', 'nelson6', 'nelson7', 'nelson8'],
};

export const RULE_DESCRIPTIONS: Readonly<Record<RuleId, string>> = {
  we1: 'one point beyond 3σ',
  we2: '2 of 3 consecutive points beyond 2σ on the same side',
  we3: '4 of 5 consecutive points beyond 1σ on the same side',
  we4: '8 points in a row on the same side of the centre line',
  trend6: '6 points in a row steadily increasing or decreasing',
  nelson1: 'one point beyond 3σ',
  nelson2: '9 points in a row on the same side of the centre line',
  nelson3: '6 points in a row steadily increasing or decreasing',
  nelson4: '14 points in a row alternating up and down',
  nelson5: '2 of 3 consecutive points beyond 2σ on the same side',
  nelson6: '4 of 5 consecutive points beyond 1σ on the same side',
  nelson7: '15 points in a row within 1σ of the centre line',
  nelson8: '8 points in a row with none within 1σ of the centre line',
};

export interface Signal {
  rule: RuleId;
  /** 0-based index of the point that completes the pattern. */
  index: number;
  message: string;
}

/** Relative size of the band around a boundary that counts as "on" it (floating-point rounding). */
const BOUNDARY_TOLERANCE = 1e-12;

const ALL_RULES = new Set<string>(Object.keys(RULE_DESCRIPTIONS));

function resolveRules(rules: RuleSetName | readonly RuleId[]): readonly RuleId[] {
  if (typeof rules === 'string') {
    const set = RULE_SETS[rules as RuleSetName];
    if (!set) throw new ComputeError(`unknown rule set "${rules}"; use "western-electric" or "nelson"`, 'rules');
    return set;
  }
  for (const r of rules) {
    if (!ALL_RULES.has(r)) throw new ComputeError(`unknown rule "${r}"`, 'rules');
  }
  return rules;
}

type Kind = 'beyond3' | 'twoOfThree' | 'fourOfFive' | 'run8' | 'run9' | 'trend6' | 'alternate14' | 'within15' | 'outside8';

const KIND: Record<RuleId, Kind> = {
  we1: 'beyond3',
  nelson1: 'beyond3',
  we2: 'twoOfThree',
  nelson5: 'twoOfThree',
  we3: 'fourOfFive',
  nelson6: 'fourOfFive',
  we4: 'run8',
  nelson2: 'run9',
  trend6: 'trend6',
  nelson3: 'trend6',
  nelson4: 'alternate14',
  nelson7: 'within15',
  nelson8: 'outside8',
};

/**
 * Evaluates run rules over `points` around `center` with σ of the plotted statistic.
 * Signals are ordered by index, then by the order of the rule list.
 */
export function evaluateRules(
  points: readonly number[],
  center: number,
  sigma: number | readonly number[],
  rules: RuleSetName | readonly RuleId[] = 'western-electric',
): Signal[] {
  const selected = resolveRules(rules);
  const n = points.length;
  if (!Number.isFinite(center)) throw new ComputeError('the centre line must be a finite number', 'center');
  const perPoint = typeof sigma !== 'number';
  if (perPoint) {
    if (sigma.length !== n) throw new ComputeError('give one sigma per point', 'sigma');
  } else if (!(Number.isFinite(sigma) && sigma >= 0)) {
    throw new ComputeError('sigma must be a finite number of at least 0', 'sigma');
  }
  const kinds = selected.map((r) => KIND[r]);
  const signals: Signal[] = [];

  // Sliding windows: ring buffers of the last 3 and 5 zone flags per side with running counts.
  const up2 = new Uint8Array(3);
  const dn2 = new Uint8Array(3);
  const up1 = new Uint8Array(5);
  const dn1 = new Uint8Array(5);
  let up2Count = 0;
  let dn2Count = 0;
  let up1Count = 0;
  let dn1Count = 0;
  let runAbove = 0;
  let runBelow = 0;
  let rises = 0; // consecutive strict rises ending here
  let falls = 0;
  let alternations = 0; // consecutive alternating differences ending here
  let lastDiffSign = 0;
  let withinRun = 0;
  let outsideRun = 0;

  for (let i = 0; i < n; i++) {
    const x = points[i];
    if (typeof x !== 'number' || !Number.isFinite(x)) {
      throw new ComputeError(`point ${i + 1} is not a finite number`, 'points');
    }
    const s = perPoint ? (sigma as readonly number[])[i] : (sigma as number);
    if (perPoint && !(Number.isFinite(s) && s >= 0)) {
      throw new ComputeError(`sigma for point ${i + 1} must be a finite number of at least 0`, 'sigma');
    }
    // Compare differences with multiples of σ (never divide) so σ = 0 is handled. A point within
    // rounding (1e-12 relative) of a boundary is on it: 10.3 against c = 10, σ = 0.1 gives
    // d = 0.3000000000000007 in binary, which must not count as beyond 3σ.
    const d = x - center;
    const tol = BOUNDARY_TOLERANCE * (Math.abs(x) + Math.abs(center));
    const above3 = d - 3 * s > tol;
    const below3 = -d - 3 * s > tol;
    const above2 = d - 2 * s > tol;
    const below2 = -d - 2 * s > tol;
    const above1 = d - s > tol;
    const below1 = -d - s > tol;
    const above0 = d > tol;
    const below0 = -d > tol;

    const r3 = i % 3;
    up2Count += (above2 ? 1 : 0) - up2[r3];
    dn2Count += (below2 ? 1 : 0) - dn2[r3];
    up2[r3] = above2 ? 1 : 0;
    dn2[r3] = below2 ? 1 : 0;
    const r5 = i % 5;
    up1Count += (above1 ? 1 : 0) - up1[r5];
    dn1Count += (below1 ? 1 : 0) - dn1[r5];
    up1[r5] = above1 ? 1 : 0;
    dn1[r5] = below1 ? 1 : 0;

    runAbove = above0 ? runAbove + 1 : 0;
    runBelow = below0 ? runBelow + 1 : 0;

    if (i > 0) {
      const prev = points[i - 1];
      const diffSign = x > prev ? 1 : x < prev ? -1 : 0;
      rises = diffSign === 1 ? rises + 1 : 0;
      falls = diffSign === -1 ? falls + 1 : 0;
      if (diffSign === 0) alternations = 0;
      else if (alternations > 0 && diffSign === -lastDiffSign) alternations += 1;
      else alternations = 1;
      lastDiffSign = diffSign;
    }

    const outside1 = above1 || below1;
    withinRun = outside1 ? 0 : withinRun + 1;
    outsideRun = outside1 ? outsideRun + 1 : 0;

    const pointNo = i + 1;
    for (let k = 0; k < kinds.length; k++) {
      let message: string | undefined;
      switch (kinds[k]) {
        case 'beyond3':
          if (above3) message = `point ${pointNo} is above the upper 3σ limit`;
          else if (below3) message = `point ${pointNo} is below the lower 3σ limit`;
          break;
        case 'twoOfThree':
          if (above2 && up2Count >= 2) message = `point ${pointNo}: 2 of the last 3 points are beyond 2σ above the centre`;
          else if (below2 && dn2Count >= 2) message = `point ${pointNo}: 2 of the last 3 points are beyond 2σ below the centre`;
          break;
        case 'fourOfFive':
          if (above1 && up1Count >= 4) message = `point ${pointNo}: 4 of the last 5 points are beyond 1σ above the centre`;
          else if (below1 && dn1Count >= 4) message = `point ${pointNo}: 4 of the last 5 points are beyond 1σ below the centre`;
          break;
        case 'run8':
        case 'run9': {
          const len = kinds[k] === 'run8' ? 8 : 9;
          if (runAbove >= len) message = `point ${pointNo} ends a run of ${runAbove} points above the centre`;
          else if (runBelow >= len) message = `point ${pointNo} ends a run of ${runBelow} points below the centre`;
          break;
        }
        case 'trend6':
          if (rises >= 5) message = `point ${pointNo} ends ${rises + 1} points in a row steadily increasing`;
          else if (falls >= 5) message = `point ${pointNo} ends ${falls + 1} points in a row steadily decreasing`;
          break;
        case 'alternate14':
          if (alternations >= 13) message = `point ${pointNo} ends ${alternations + 1} points in a row alternating up and down`;
          break;
        case 'within15':
          if (withinRun >= 15) message = `point ${pointNo} ends ${withinRun} points in a row within 1σ of the centre`;
          break;
        case 'outside8':
          if (outsideRun >= 8) message = `point ${pointNo} ends ${outsideRun} points in a row with none within 1σ`;
          break;
      }
      if (message !== undefined) signals.push({ rule: selected[k], index: i, message: `${message} (${selected[k]})` });
    }
  }
  return signals;
}

/**
 * Rule 1 for a chart with its own limits (range, s and moving-range charts, whose limits are not
 * symmetric): a point fires when it is strictly above `ucl` or strictly below `lcl` (a point on a
 * limit, allowing for rounding as in evaluateRules, does not).
 * `indexOffset` shifts reported indices (moving range k belongs to point k + 1).
 */
export function limitSignals(
  points: readonly number[],
  ucl: number | readonly number[],
  lcl: number | readonly number[],
  rule: RuleId,
  indexOffset = 0,
): Signal[] {
  const out: Signal[] = [];
  for (let i = 0; i < points.length; i++) {
    const u = typeof ucl === 'number' ? ucl : ucl[i];
    const l = typeof lcl === 'number' ? lcl : lcl[i];
    const x = points[i];
    const index = i + indexOffset;
    if (x - u > BOUNDARY_TOLERANCE * (Math.abs(x) + Math.abs(u))) out.push({ rule, index, message: `point ${index + 1} is above the upper control limit (${rule})` });
    else if (l - x > BOUNDARY_TOLERANCE * (Math.abs(x) + Math.abs(l))) out.push({ rule, index, message: `point ${index + 1} is below the lower control limit (${rule})` });
  }
  return out;
}
