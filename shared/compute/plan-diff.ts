/**
 * The change view between two revisions of an inspection plan (issue 3 point 4).
 *
 * Order is stable so the view and the audit trail read the same every time: sampling fields
 * first, then characteristics in the after-plan's order (added ones, or their changed fields in
 * schema field order), then removed characteristics in the before-plan's order.
 *
 * Characteristics are matched by code (trimmed, upper case, as the schema stores it). A field
 * left out compares as the schema default (layout 'single', severity 'major', …) and
 * `undefined` as null, so a draft input and its stored row do not differ on paper only.
 * Moving a characteristic up or down the list is not a change of the plan's content.
 */
import { z } from 'zod';
import { characteristicInputSchema, type PlanChange } from '../schemas/master-data';
import { ComputeError } from './errors';

/** A characteristic as given to a plan (input) or as stored (with id, seq); extra keys are ignored. */
export type CharacteristicLike = { code: string } & { [field: string]: unknown };

export interface PlanLike {
  samplingKind: string;
  inspectionLevel?: string | null;
  aql?: number | null;
  zeroSampleSize?: number | null;
  notes?: string | null;
  characteristics: readonly CharacteristicLike[];
}

/** Plan-level fields, in the order the view lists them. */
export const SAMPLING_FIELDS = ['samplingKind', 'inspectionLevel', 'aql', 'zeroSampleSize', 'notes'] as const;

const shape = characteristicInputSchema.shape;

/** Every characteristic field the schema knows except the code, in schema order. */
export const CHARACTERISTIC_FIELDS: readonly string[] = Object.keys(shape).filter((k) => k !== 'code');

// Read from the schema so the diff follows it when a default changes.
const DEFAULTS: Record<string, unknown> = Object.fromEntries(
  Object.entries(shape).flatMap(([k, s]) => (s instanceof z.ZodDefault ? [[k, (s as z.ZodDefault<z.ZodType>).def.defaultValue]] : [])),
);

function normCode(code: unknown): string {
  return String(code ?? '').trim().toUpperCase();
}

function normValue(field: string, value: unknown): unknown {
  if (value === undefined || value === null) return field in DEFAULTS ? DEFAULTS[field] : null;
  if (typeof value === 'string') {
    const t = value.trim();
    // The schema trims text; an empty method or note means "none".
    return t === '' && (field === 'method' || field === 'notes') ? null : t;
  }
  if (field === 'inputs' && Array.isArray(value)) return value.length === 0 ? null : value.map(normCode);
  return value;
}

function same(a: unknown, b: unknown): boolean {
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((v, i) => same(v, b[i]));
  return a === b;
}

/** The comparable form of a characteristic: its code and every schema field, defaults filled in. */
export function normalizeCharacteristic(c: CharacteristicLike): Record<string, unknown> {
  const out: Record<string, unknown> = { code: normCode(c.code) };
  for (const f of CHARACTERISTIC_FIELDS) out[f] = normValue(f, c[f]);
  return out;
}

function byCode(plan: PlanLike, label: string): Map<string, Record<string, unknown>> {
  const map = new Map<string, Record<string, unknown>>();
  for (const c of plan.characteristics) {
    const n = normalizeCharacteristic(c);
    const code = n.code as string;
    if (code === '') throw new ComputeError(`A characteristic in the ${label} plan has no code`, 'characteristics');
    if (map.has(code)) throw new ComputeError(`Code ${code} is used twice in the ${label} plan`, 'characteristics');
    map.set(code, n);
  }
  return map;
}

/** What changed from `before` to `after`; [] when the plans have the same content. */
export function diffPlans(before: PlanLike, after: PlanLike): PlanChange[] {
  const changes: PlanChange[] = [];

  for (const field of SAMPLING_FIELDS) {
    const b = normValue(field, before[field]);
    const a = normValue(field, after[field]);
    if (!same(b, a)) changes.push({ kind: 'changed', scope: 'sampling', code: null, field, before: b, after: a });
  }

  const old = byCode(before, 'earlier');
  const now = byCode(after, 'later');

  for (const [code, a] of now) {
    const b = old.get(code);
    if (!b) {
      changes.push({ kind: 'added', scope: 'characteristic', code, field: null, before: null, after: a });
      continue;
    }
    for (const field of CHARACTERISTIC_FIELDS) {
      if (!same(b[field], a[field])) changes.push({ kind: 'changed', scope: 'characteristic', code, field, before: b[field], after: a[field] });
    }
  }

  for (const [code, b] of old) {
    if (!now.has(code)) changes.push({ kind: 'removed', scope: 'characteristic', code, field: null, before: b, after: null });
  }
  return changes;
}
