import { ComputeError } from './errors';

/**
 * Review-board arithmetic: a nonconforming quantity split across dispositions, each with its
 * cost of poor quality. Kinds follow the ISO 9000:2015 vocabulary (§3.12: concession, regrade,
 * rework, repair, scrap — memory), plus the trade's sort (100 % screen) and return to supplier.
 */
export const DISPOSITION_KINDS = ['use-as-is', 'rework', 'repair', 'sort', 'return-to-supplier', 'scrap', 'regrade'] as const;
export type DispositionKind = (typeof DISPOSITION_KINDS)[number];

export interface CostInput {
  /** Labour hours for rework, repair or sorting. */
  hours?: number | null;
  /** Cost of one labour hour. */
  rate?: number | null;
  /** Value of the material written off. */
  scrapValue?: number | null;
  /** Freight (return to supplier, outside sorting). */
  freight?: number | null;
}

export interface SplitLine extends CostInput {
  kind: DispositionKind;
  quantity: number;
}

const cents = (v: number) => Math.round(v * 100) / 100;

/** Cost of one line: hours × rate + scrap value + freight, to the cent. */
export function lineCost(c: CostInput): number {
  const parts = [c.hours ?? 0, c.rate ?? 0, c.scrapValue ?? 0, c.freight ?? 0];
  if (parts.some((v) => !Number.isFinite(v) || v < 0)) throw new ComputeError('Costs, hours and rates cannot be negative', 'cost');
  return cents((c.hours ?? 0) * (c.rate ?? 0) + (c.scrapValue ?? 0) + (c.freight ?? 0));
}

export interface SplitCheck {
  assigned: number;
  /** Suspect quantity minus what the lines assign: > 0 still to assign, < 0 over-assigned. */
  remaining: number;
  ok: boolean;
  /** For the person at the review board; null when the split adds up. */
  message: string | null;
  totalCost: number;
}

/** Whether the lines account for exactly the suspect quantity (each core gets one fate). */
export function checkSplit(lines: readonly SplitLine[], suspectQuantity: number): SplitCheck {
  const assigned = lines.reduce((s, l) => s + (Number.isFinite(l.quantity) ? l.quantity : 0), 0);
  const remaining = suspectQuantity - assigned;
  let totalCost = 0;
  for (const l of lines) {
    try {
      totalCost += lineCost(l);
    } catch {
      /* a bad cost is reported by the schema on its own field */
    }
  }
  let message: string | null = null;
  if (lines.length === 0) message = 'Add at least one disposition';
  else if (lines.some((l) => !Number.isInteger(l.quantity) || l.quantity < 1)) message = 'Each line needs a quantity of at least one core';
  else if (remaining > 0) message = `${assigned} of ${suspectQuantity} cores assigned: ${remaining} still need a disposition`;
  else if (remaining < 0) message = `${assigned} cores assigned but only ${suspectQuantity} are suspect: ${-remaining} too many`;
  return { assigned, remaining, ok: message === null, message, totalCost: cents(totalCost) };
}

/** Where cores go after each kind: to production (after any action), back to the supplier, or to scrap. */
export const DISPOSITION_OUTCOME: Record<DispositionKind, 'released' | 'returned' | 'scrapped'> = {
  'use-as-is': 'released',
  regrade: 'released',
  rework: 'released',
  repair: 'released',
  sort: 'released',
  'return-to-supplier': 'returned',
  scrap: 'scrapped',
};

/**
 * The lot's status once dispositioned. One outcome → that outcome. A split lot is released when
 * any part of it goes on to production (the NCR keeps the split), otherwise returned when any
 * part goes back, otherwise scrapped.
 */
export function lotStatusAfter(lines: readonly Pick<SplitLine, 'kind' | 'quantity'>[]): 'released' | 'returned' | 'scrapped' {
  if (lines.length === 0) throw new ComputeError('A disposition needs at least one line', 'lines');
  const outcomes = new Set(lines.filter((l) => l.quantity > 0).map((l) => DISPOSITION_OUTCOME[l.kind]));
  if (outcomes.has('released')) return 'released';
  if (outcomes.has('returned')) return 'returned';
  return 'scrapped';
}

/** Quantities per outcome, for the lot's record. */
export function outcomeQuantities(lines: readonly Pick<SplitLine, 'kind' | 'quantity'>[]): Record<'released' | 'returned' | 'scrapped', number> {
  const q = { released: 0, returned: 0, scrapped: 0 };
  for (const l of lines) q[DISPOSITION_OUTCOME[l.kind]] += l.quantity;
  return q;
}
