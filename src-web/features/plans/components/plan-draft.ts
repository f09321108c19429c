import { updatePlanSchema, type Characteristic, type Plan, type UpdatePlanInput } from '@shared/schemas/master-data';
import { parseNumberText } from '../../../components/form-fields';

/**
 * The plan editor's working copy. Number cells hold the text as typed, so "0." or a stray
 * letter is kept until the schema reports on it; everything converts to the API's shape on save.
 */
export interface RowDraft {
  key: string;
  code: string;
  name: string;
  kind: Characteristic['kind'];
  unit: string;
  nominal: string;
  lsl: string;
  usl: string;
  layout: Characteristic['layout'];
  angles: string;
  levels: string;
  readingsPerSample: string;
  gaugeKind: string;
  severity: Characteristic['severity'];
  chartKind: Characteristic['chartKind'];
  wearDriven: boolean;
  method: string;
  derivedFormula: string;
  inputs: string;
  subgroupSize: string;
  ruleSet: Characteristic['ruleSet'];
}

export interface PlanDraft {
  samplingKind: Plan['samplingKind'];
  inspectionLevel: string;
  aql: string;
  zeroSampleSize: string;
  notes: string;
  rows: RowDraft[];
}

let seq = 0;
export const newKey = () => `r${++seq}`;
const txt = (v: number | string | null | undefined) => (v == null ? '' : String(v));

export function rowFrom(c: Characteristic): RowDraft {
  return {
    key: newKey(),
    code: c.code,
    name: c.name,
    kind: c.kind,
    unit: c.unit ?? '',
    nominal: txt(c.nominal),
    lsl: txt(c.lsl),
    usl: txt(c.usl),
    layout: c.layout,
    angles: txt(c.angles),
    levels: txt(c.levels),
    readingsPerSample: txt(c.readingsPerSample),
    gaugeKind: c.gaugeKind ?? '',
    severity: c.severity,
    chartKind: c.chartKind,
    wearDriven: c.wearDriven,
    method: c.method ?? '',
    derivedFormula: c.derivedFormula ?? '',
    inputs: (c.inputs ?? []).join(', '),
    subgroupSize: txt(c.subgroupSize),
    ruleSet: c.ruleSet,
  };
}

export function blankRow(): RowDraft {
  return {
    key: newKey(), code: '', name: '', kind: 'variable', unit: 'mm', nominal: '', lsl: '', usl: '', layout: 'single', angles: '', levels: '',
    readingsPerSample: '1', gaugeKind: '', severity: 'major', chartKind: 'none', wearDriven: false, method: '', derivedFormula: '', inputs: '', subgroupSize: '', ruleSet: 'western-electric',
  };
}

export function draftFrom(p: Plan): PlanDraft {
  return {
    samplingKind: p.samplingKind,
    inspectionLevel: p.inspectionLevel ?? '',
    aql: txt(p.aql),
    zeroSampleSize: txt(p.zeroSampleSize),
    notes: p.notes ?? '',
    rows: p.characteristics.map(rowFrom),
  };
}

const num = (t: string) => parseNumberText(t, null);
const orNull = (t: string) => (t.trim() === '' ? null : t.trim());

/** The PATCH body for this draft (before validation). */
export function toUpdateInput(d: PlanDraft, version: number): UpdatePlanInput {
  const aql = d.samplingKind === 'aql';
  return {
    version,
    samplingKind: d.samplingKind,
    inspectionLevel: aql ? ((orNull(d.inspectionLevel) as UpdatePlanInput['inspectionLevel']) ?? null) : null,
    aql: aql ? (num(d.aql) as number | null) : null,
    zeroSampleSize: aql ? null : (num(d.zeroSampleSize) as number | null),
    notes: orNull(d.notes),
    characteristics: d.rows.map((r) => ({
      code: r.code,
      name: r.name,
      kind: r.kind,
      unit: (orNull(r.unit) as never) ?? null,
      nominal: num(r.nominal) as number | null,
      lsl: num(r.lsl) as number | null,
      usl: num(r.usl) as number | null,
      method: orNull(r.method),
      gaugeKind: (orNull(r.gaugeKind) as never) ?? null,
      layout: r.layout,
      angles: num(r.angles) as number | null,
      levels: num(r.levels) as number | null,
      readingsPerSample: (parseNumberText(r.readingsPerSample, undefined) as number | undefined) ?? undefined,
      derivedFormula: (orNull(r.derivedFormula) as never) ?? null,
      inputs: r.inputs.trim() ? r.inputs.split(/[\s,;]+/).filter(Boolean).map((x) => x.toUpperCase()) : null,
      chartKind: r.chartKind,
      subgroupSize: num(r.subgroupSize) as number | null,
      severity: r.severity,
      wearDriven: r.wearDriven,
      ruleSet: r.ruleSet,
    })),
  };
}

/** Runs the shared schema over the body; errors keyed like the API's (`characteristics.3.lsl`). */
export function validateDraft(body: UpdatePlanInput): Record<string, string> {
  const r = updatePlanSchema.safeParse(body);
  if (r.success) return {};
  const fields: Record<string, string> = {};
  for (const issue of r.error.issues) {
    const k = issue.path.length ? issue.path.join('.') : '_';
    if (!(k in fields)) fields[k] = issue.message;
  }
  return fields;
}

/** The number of readings one sample takes, from the layout (as the bench sheet will ask for them). */
export function readingsHint(r: Pick<RowDraft, 'layout' | 'angles' | 'levels' | 'readingsPerSample'>): string {
  const n = (t: string) => (Number.isFinite(Number(t)) && t.trim() !== '' ? Number(t) : null);
  switch (r.layout) {
    case 'two-point':
    case 'heights':
      return n(r.angles) != null ? String(n(r.angles)) : '';
    case 'probed':
      return n(r.angles) != null ? String((n(r.angles) ?? 1) * (n(r.levels) ?? 1)) : '';
    case 'pass-fail':
      return '—';
    default:
      return r.readingsPerSample;
  }
}
