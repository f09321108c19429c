import { ComputeError } from './errors';

/**
 * The state machines of nonconformance reports and supplier corrective actions, as tables. The
 * API refuses anything not in them (409) and the tests walk every pair.
 */

// ───────── Nonconformance reports ─────────
export const NCR_STATUSES = ['open', 'in-review', 'dispositioned', 'closed'] as const;
export type NcrStatus = (typeof NCR_STATUSES)[number];

/** Every legal move. `in-review → dispositioned` happens only by recording signed dispositions. */
export const NCR_TRANSITIONS: Record<NcrStatus, readonly NcrStatus[]> = {
  open: ['in-review'],
  'in-review': ['dispositioned'],
  dispositioned: ['closed'],
  closed: [],
};

/** The moves a person makes with a plain transition (the rest need their own evidence). */
export const NCR_MANUAL_TRANSITIONS: Record<NcrStatus, readonly NcrStatus[]> = {
  open: ['in-review'],
  'in-review': [],
  dispositioned: ['closed'],
  closed: [],
};

export function canMoveNcr(from: NcrStatus, to: NcrStatus): boolean {
  return NCR_TRANSITIONS[from].includes(to);
}

// ───────── Supplier corrective actions (8D) ─────────
export const SCAR_STATUSES = ['issued', 'acknowledged', 'containment-in', 'root-cause-in', 'actions-in', 'accepted', 'returned', 'verifying', 'closed'] as const;
export type ScarStatus = (typeof SCAR_STATUSES)[number];

export const EIGHT_D_STEPS = ['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'D7', 'D8'] as const;
export type EightDStep = (typeof EIGHT_D_STEPS)[number];

/** open: may be answered · submitted: waits for the engineer · locked: not yet open. */
export const STEP_STATUSES = ['locked', 'open', 'submitted', 'accepted', 'returned'] as const;
export type StepStatus = (typeof STEP_STATUSES)[number];

export const SCAR_TRANSITIONS: Record<ScarStatus, readonly ScarStatus[]> = {
  issued: ['acknowledged'],
  acknowledged: ['containment-in', 'returned'],
  'containment-in': ['root-cause-in', 'returned'],
  'root-cause-in': ['actions-in', 'returned'],
  'actions-in': ['accepted', 'returned'],
  returned: ['acknowledged', 'containment-in', 'root-cause-in', 'actions-in'],
  accepted: ['verifying'],
  verifying: ['closed', 'returned'],
  closed: [],
};

/**
 * Moves made by a plain transition request: the supplier acknowledges; the engineer starts the
 * effectiveness check, closes, or reopens when the defect returns. All other moves follow from
 * step answers and reviews.
 */
export const SCAR_MANUAL_TRANSITIONS: Record<ScarStatus, readonly ScarStatus[]> = {
  issued: ['acknowledged'],
  acknowledged: [],
  'containment-in': [],
  'root-cause-in': [],
  'actions-in': [],
  returned: [],
  accepted: ['verifying'],
  verifying: ['closed', 'returned'],
  closed: [],
};

/** Which role makes each manual move. */
export const SCAR_MANUAL_ACTOR: Partial<Record<ScarStatus, 'supplier' | 'engineer'>> = {
  acknowledged: 'supplier',
  verifying: 'engineer',
  closed: 'engineer',
  returned: 'engineer',
};

export function canMoveScar(from: ScarStatus, to: ScarStatus): boolean {
  return SCAR_TRANSITIONS[from].includes(to);
}

/** The milestones in order; the status reached by answers never goes back along them. */
const MILESTONES: readonly ScarStatus[] = ['issued', 'acknowledged', 'containment-in', 'root-cause-in', 'actions-in', 'accepted'];

export interface StepState {
  step: EightDStep;
  status: StepStatus;
}

const wasIn = (s: StepStatus) => s === 'submitted' || s === 'accepted' || s === 'returned';

/** The furthest milestone the answers have reached. */
export function milestoneOf(steps: readonly StepState[], acknowledged: boolean): ScarStatus {
  const by = new Map(steps.map((s) => [s.step, s.status]));
  const st = (k: EightDStep) => by.get(k) ?? 'locked';
  if ((['D1', 'D2', 'D3', 'D4', 'D5', 'D6', 'D7'] as const).every((k) => st(k) === 'accepted')) return 'accepted';
  if ((['D5', 'D6', 'D7'] as const).every((k) => wasIn(st(k)))) return 'actions-in';
  if (wasIn(st('D4'))) return 'root-cause-in';
  if (wasIn(st('D3'))) return 'containment-in';
  if (acknowledged || steps.some((s) => wasIn(s.status))) return 'acknowledged';
  return 'issued';
}

/**
 * The status the answers put a corrective action in. Verifying and closed are set by the
 * engineer and stay; otherwise a step sent back makes it "returned" until answered again.
 */
export function derivedScarStatus(current: ScarStatus, steps: readonly StepState[], acknowledged: boolean): ScarStatus {
  if (current === 'verifying' || current === 'closed') return current;
  const returned = steps.some((s) => s.step !== 'D8' && s.status === 'returned');
  if (returned) return 'returned';
  return milestoneOf(steps, acknowledged);
}

/**
 * The legal statuses passed through from `from` to `to` (excluding `from`), one edge at a time,
 * so each hop can be recorded. Throws when the tables allow no such path.
 */
export function scarPath(from: ScarStatus, to: ScarStatus): ScarStatus[] {
  if (from === to) return [];
  if (canMoveScar(from, to)) return [to];
  const a = MILESTONES.indexOf(from);
  const b = MILESTONES.indexOf(to);
  if (a >= 0 && b > a) {
    const path = MILESTONES.slice(a + 1, b + 1);
    let prev = from;
    for (const p of path) {
      if (!canMoveScar(prev, p)) throw new ComputeError(`A corrective action cannot move from ${from} to ${to}`);
      prev = p;
    }
    return [...path];
  }
  throw new ComputeError(`A corrective action cannot move from ${from} to ${to}`);
}

/**
 * Which steps may be answered in a given state. D1–D3 open at once (containment cannot wait
 * for the team list), D4 once containment is in, D5–D7 once the root cause is in, D8 after
 * the engineer has accepted D1–D7.
 */
export function stepOpens(step: EightDStep, steps: readonly StepState[], status: ScarStatus): boolean {
  if (status === 'closed') return false;
  const by = new Map(steps.map((s) => [s.step, s.status]));
  const st = (k: EightDStep) => by.get(k) ?? 'locked';
  switch (step) {
    case 'D1':
    case 'D2':
    case 'D3':
      return true;
    case 'D4':
      return wasIn(st('D3'));
    case 'D5':
    case 'D6':
    case 'D7':
      return wasIn(st('D4'));
    case 'D8':
      return status === 'accepted' || status === 'verifying';
  }
}
