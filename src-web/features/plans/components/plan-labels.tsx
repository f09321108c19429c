import type { Plan, PlanStatus, PlanSummary } from '@shared/schemas/master-data';
import { type CHART_KINDS, type CHARACTERISTIC_KINDS, type LAYOUTS, type SEVERITY_CLASSES } from '@shared/schemas/master-data';
import { StatusPill, type Tone } from '../../../components/status-pill';

export const PLAN_STATUS_LABELS: Record<PlanStatus, string> = { draft: 'Draft', active: 'Active', superseded: 'Superseded' };
const STATUS_TONE: Record<PlanStatus, Tone> = { draft: 'info', active: 'ok', superseded: 'neutral' };

export function PlanStatusPill({ status }: { status: PlanStatus }) {
  return <StatusPill tone={STATUS_TONE[status]}>{PLAN_STATUS_LABELS[status]}</StatusPill>;
}

export const KIND_LABELS: Record<(typeof CHARACTERISTIC_KINDS)[number], string> = { variable: 'Variable', attribute: 'Attribute', derived: 'Derived' };
/** Short names for the dense table; the long ones (LAYOUT_LABELS) show as a tooltip. */
export const LAYOUT_SHORT: Record<(typeof LAYOUTS)[number], string> = { single: 'Single', 'two-point': 'Two-point', probed: 'Probed', heights: 'Heights', 'pass-fail': 'Pass/fail' };
export const CHART_LABELS: Record<(typeof CHART_KINDS)[number], string> = { 'xbar-r': 'X̄–R', 'xbar-s': 'X̄–S', 'i-mr': 'I–MR', p: 'p', none: 'None' };
export const SEVERITY_LABELS: Record<(typeof SEVERITY_CLASSES)[number], string> = { critical: 'Critical', major: 'Major', minor: 'Minor' };

/** Names of plan and characteristic fields as the change view and error list show them. */
export const FIELD_LABELS: Record<string, string> = {
  samplingKind: 'Sampling',
  inspectionLevel: 'Inspection level',
  aql: 'AQL',
  zeroSampleSize: 'Fixed sample size',
  notes: 'Notes',
  code: 'Code',
  name: 'Name',
  kind: 'Kind',
  unit: 'Unit',
  nominal: 'Nominal',
  lsl: 'Lower limit',
  usl: 'Upper limit',
  method: 'Method',
  gaugeKind: 'Gauge kind',
  layout: 'Reading layout',
  angles: 'Angles',
  levels: 'Levels',
  readingsPerSample: 'Readings per sample',
  derivedFormula: 'Derived formula',
  inputs: 'Formula inputs',
  chartKind: 'Chart',
  subgroupSize: 'Subgroup size',
  severity: 'Severity',
  wearDriven: 'Wear-driven',
  ruleSet: 'Run rules',
  seq: 'Position',
  characteristics: 'Characteristics',
};

export function samplingSummary(p: Pick<Plan | PlanSummary, 'samplingKind' | 'inspectionLevel' | 'aql' | 'zeroSampleSize'>): string {
  if (p.samplingKind === 'zero-acceptance') return `Zero acceptance, n = ${p.zeroSampleSize ?? '?'}`;
  return `Level ${p.inspectionLevel ?? '?'}, AQL ${p.aql ?? '?'}`;
}
