import { ComputeError } from '../errors';
import { capability, type CapabilityResult } from './capability';
import { chartSignals, individualsMR, pChart, phaseOneLimits, xbarR, xbarS, type AnyChart, type KnownParameters } from './charts';
import { d2 as d2Of, knownSigmaRangeFactors } from './constants';
import { wearForecast, type WearForecast } from './forecast';
import { evaluateRules, limitSignals, RULE_DESCRIPTIONS, RULE_SETS, type RuleId, type RuleSetName } from './rules';

/**
 * Drift watch: turns stored lot results into a control-chart series per supplier × part ×
 * characteristic, judges every point against the limits in force when its lot was decided, and
 * derives capability, a histogram and the die-wear forecast from the same series.
 *
 * Subgrouping (how lots become subgroups), in order of precedence:
 * 1. p chart (`chartKind` 'p', or any pass/fail check): one point per lot, defectives = sampled
 *    cores judged nonconforming on this characteristic, size = sampled cores with a result
 *    (so the size varies from lot to lot and the limits with it).
 * 2. Individuals (`chartKind` 'i-mr', or a subgroup size of 1): every sampled core's value is one
 *    point, lots in order of receipt and cores by serial within a lot.
 * 3. Core readings: when every reading of a core measures the same thing (layout 'single', e.g.
 *    burr height at 4 places) and the plan's subgroup size divides the readings per core
 *    (BURR: 4 readings, subgroup size 4), each core's raw readings form its own subgroup(s) —
 *    a lot then gives one subgroup per sampled core. The readings at several places of one core
 *    are taken together, which is what a rational subgroup asks for.
 * 4. Otherwise, one subgroup per lot: the values of the lot's sampled cores in serial order. Its
 *    size is the plan's subgroup size or, when the plan gives none, the most common number of
 *    cores per lot (ties → the smaller). A lot with more cores contributes its first n by serial
 *    (the sample is random, so any n are as good); a lot with fewer is left off the chart and
 *    listed in `skipped` with the reason, because X-bar charts need equal subgroups.
 * An X-bar/R chart with subgroups above 10 is drawn as X-bar/s (R loses efficiency there).
 */

export type DriftChart = 'xbar-r' | 'xbar-s' | 'i-mr' | 'p';
export type SubgroupMode = 'core-readings' | 'lot-cores' | 'individual' | 'lot-fraction';
export type ChartKindSetting = DriftChart | 'none';

export interface DriftCharacteristic {
  code: string;
  kind: 'variable' | 'attribute' | 'derived';
  layout: string;
  readingsPerSample: number;
  chartKind: ChartKindSetting;
  subgroupSize: number | null;
  lsl: number | null;
  usl: number | null;
  ruleSet: RuleSetName;
}

export interface CoreResult {
  sampleId: string;
  serial: number;
  /** The server-computed result (mean of readings, fitted diameter, derived value…). */
  value: number | null;
  /** The raw readings as entered. */
  values: readonly number[];
  conforming: boolean | null;
}

export interface LotResults {
  lotId: string;
  lotRef: number;
  receivedAt: string;
  decidedAt: string;
  /** In serial order. */
  cores: readonly CoreResult[];
}

export interface SeriesPoint {
  lotId: string;
  lotRef: number;
  /** 1-based position of the lot in the supplier × part history (the forecast's x). */
  lotSeq: number;
  receivedAt: string;
  decidedAt: string;
  /** The core a subgroup comes from (core-readings and individual modes). */
  sampleId: string | null;
  serial: number | null;
  /** 1-based part of a core's readings when a core gives several subgroups, else null. */
  chunk: number | null;
  /** The measurements of the subgroup (one for individuals; empty for p). */
  subgroup: number[];
  defectives?: number;
  size?: number;
}

export interface SkippedLot {
  lotId: string;
  lotRef: number;
  reason: string;
}

export interface Series {
  chart: DriftChart;
  mode: SubgroupMode;
  /** Subgroup size (1 for individuals, null for p). */
  n: number | null;
  points: SeriesPoint[];
  skipped: SkippedLot[];
  /** One sentence saying how the subgroups were formed. */
  explanation: string;
}

function modalCount(counts: number[]): number | null {
  if (!counts.length) return null;
  const freq = new Map<number, number>();
  for (const c of counts) freq.set(c, (freq.get(c) ?? 0) + 1);
  let best: number | null = null;
  let bestFreq = 0;
  for (const [c, f] of freq) {
    if (f > bestFreq || (f === bestFreq && best !== null && c < best)) {
      best = c;
      bestFreq = f;
    }
  }
  return best;
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** Forms the control-chart subgroups of one characteristic from its lots (oldest first). */
export function buildSeries(c: DriftCharacteristic, lots: readonly LotResults[]): Series {
  if (c.chartKind === 'none') throw new ComputeError(`${c.code} is not charted: its plan sets no chart kind`, 'characteristicCode');
  const points: SeriesPoint[] = [];
  const skipped: SkippedLot[] = [];
  const base = (lot: LotResults, seq: number) => ({ lotId: lot.lotId, lotRef: lot.lotRef, lotSeq: seq, receivedAt: lot.receivedAt, decidedAt: lot.decidedAt });

  if (c.chartKind === 'p' || c.kind === 'attribute') {
    if (c.chartKind !== 'p') throw new ComputeError(`${c.code} is a pass/fail check: chart it as a p chart`, 'chartKind');
    lots.forEach((lot, i) => {
      const judged = lot.cores.filter((k) => k.conforming !== null);
      if (!judged.length) {
        skipped.push({ lotId: lot.lotId, lotRef: lot.lotRef, reason: 'no core of this lot has a result for this check' });
        return;
      }
      const defectives = judged.filter((k) => k.conforming === false).length;
      points.push({ ...base(lot, i + 1), sampleId: null, serial: null, chunk: null, subgroup: [], defectives, size: judged.length });
    });
    return { chart: 'p', mode: 'lot-fraction', n: null, points, skipped, explanation: 'One point per lot: the fraction of sampled cores found nonconforming (sizes vary by lot, so do the limits).' };
  }

  const g = c.subgroupSize;
  if (c.chartKind === 'i-mr' || g === 1) {
    lots.forEach((lot, i) => {
      const cores = lot.cores.filter((k) => finite(k.value));
      if (!cores.length) skipped.push({ lotId: lot.lotId, lotRef: lot.lotRef, reason: 'no core of this lot has a value' });
      for (const k of cores) points.push({ ...base(lot, i + 1), sampleId: k.sampleId, serial: k.serial, chunk: null, subgroup: [k.value as number] });
    });
    return { chart: 'i-mr', mode: 'individual', n: 1, points, skipped, explanation: 'Individuals: each sampled core’s value is one point, lots in order of receipt, cores by serial.' };
  }

  const r = c.readingsPerSample;
  if (g != null && g >= 2 && r >= 2 && r % g === 0 && c.layout === 'single') {
    const chunks = r / g;
    lots.forEach((lot, i) => {
      let used = 0;
      const bad: number[] = [];
      for (const k of lot.cores) {
        if (k.values.length !== r || !k.values.every(finite)) {
          if (k.values.length) bad.push(k.serial);
          continue;
        }
        for (let j = 0; j < chunks; j++) {
          points.push({ ...base(lot, i + 1), sampleId: k.sampleId, serial: k.serial, chunk: chunks > 1 ? j + 1 : null, subgroup: k.values.slice(j * g, (j + 1) * g) as number[] });
        }
        used++;
      }
      if (!used) skipped.push({ lotId: lot.lotId, lotRef: lot.lotRef, reason: `no core of this lot has all ${r} readings` });
      else if (bad.length) skipped.push({ lotId: lot.lotId, lotRef: lot.lotRef, reason: `core${bad.length === 1 ? '' : 's'} ${bad.join(', ')} left off: not all ${r} readings` });
    });
    const chart = c.chartKind === 'xbar-r' && g > 10 ? 'xbar-s' : (c.chartKind as DriftChart);
    const per = chunks > 1 ? `each group of ${g} of a core’s ${r} readings` : `each core’s ${r} readings`;
    return { chart, mode: 'core-readings', n: g, points, skipped, explanation: `One subgroup per sampled core: ${per} (the plan’s subgroup size ${g}).` };
  }

  // One pass for the values of each lot (5 000 lots must stay cheap), then the size and subgroups.
  const valuesOf = lots.map((lot) => {
    const out: number[] = [];
    for (const k of lot.cores) if (finite(k.value)) out.push(k.value);
    return out;
  });
  const n = g ?? modalCount(valuesOf.map((v) => v.length).filter((v) => v > 0));
  if (n === 1) {
    return buildSeries({ ...c, chartKind: 'i-mr', subgroupSize: 1 }, lots);
  }
  for (let i = 0; i < lots.length; i++) {
    const lot = lots[i];
    const values = valuesOf[i];
    if (n === null || values.length < n) {
      skipped.push({ lotId: lot.lotId, lotRef: lot.lotRef, reason: `only ${values.length} core${values.length === 1 ? '' : 's'} with a value; the subgroup size is ${n ?? '—'}` });
      continue;
    }
    points.push({ lotId: lot.lotId, lotRef: lot.lotRef, lotSeq: i + 1, receivedAt: lot.receivedAt, decidedAt: lot.decidedAt, sampleId: null, serial: null, chunk: null, subgroup: values.length === n ? values : values.slice(0, n) });
  }
  const size = n ?? 0;
  const chart = c.chartKind === 'xbar-r' && size > 10 ? 'xbar-s' : (c.chartKind as DriftChart);
  const why = g != null ? `the plan’s subgroup size ${g}` : `the usual number of sampled cores per lot, ${size}`;
  return { chart, mode: 'lot-cores', n, points, skipped, explanation: `One subgroup per lot: the values of its first ${size} sampled cores by serial (${why}).` };
}

// ---------------------------------------------------------------------------------------------
// Judging points against the limits in force

/** A frozen limit version: the centre and σ of individual measurements (p: the fraction p̄). */
export interface FrozenLimits {
  version: number;
  /** ISO time the limits were frozen; they apply to lots decided from then on. */
  frozenAt: string;
  chart: DriftChart;
  center: number;
  /** σ of individual measurements; for p charts √(p̄(1 − p̄)) (not used to judge). */
  sigma: number;
}

export interface PointLimits {
  center: number;
  ucl: number;
  lcl: number;
  /** σ of the plotted statistic (zones are multiples of it). */
  sigma: number;
  /** The companion R, s or MR chart (null for p). */
  dispersionCenter: number | null;
  dispersionUcl: number | null;
  dispersionLcl: number | null;
}

export interface PointFlag {
  rule: RuleId;
  chart: 'location' | 'dispersion';
  /** What happened at this point, naming the lot (and core). */
  message: string;
  /** The rule in words. */
  description: string;
}

export interface JudgedPoint extends SeriesPoint {
  index: number;
  /** The plotted statistic: subgroup mean, individual value or fraction nonconforming. */
  value: number;
  /** Range, s or moving range (null for p and for the first point of a run of individuals). */
  dispersion: number | null;
  /** Shared by every point of a segment, except on p charts (limits per lot size). */
  limits: PointLimits | null;
  /** The frozen version that judged this point; null = trial limits from the unfrozen points. */
  limitVersion: number | null;
  /** Index into Judgement.segments. */
  segment: number;
  flags: PointFlag[];
}

/** Consecutive points judged against the same limits (the chart draws one set of lines per segment). */
export interface Segment {
  /** First and last point index, inclusive. */
  from: number;
  to: number;
  limitVersion: number | null;
  /** Centre and σ of individual measurements used; null when no limits could be computed. */
  center: number | null;
  sigmaWithin: number | null;
  /** The segment's limits (p charts: ucl/lcl vary per point, so these are at the first point). */
  limits: PointLimits | null;
}

export interface Judgement {
  chart: DriftChart;
  points: JudgedPoint[];
  segments: Segment[];
  /** Trial (phase I) parameters from the points no frozen version covers, when computable. */
  trial: { center: number; sigma: number; count: number } | null;
  /** Why there are no trial limits, when there are points that need them. */
  trialNote: string | null;
}

const family = (c: DriftChart) => (c === 'p' ? 'p' : 'variables');
const DISPERSION_NAME: Record<DriftChart, string> = { 'xbar-r': 'range', 'xbar-s': 'standard deviation', 'i-mr': 'moving range', p: '' };

export function pointLabel(p: Pick<SeriesPoint, 'lotRef' | 'serial' | 'chunk'>): string {
  return `lot ${p.lotRef}${p.serial != null ? ` core ${p.serial}` : ''}${p.chunk != null ? ` part ${p.chunk}` : ''}`;
}

/** The version in force for a lot decided at `decidedAt`: the newest frozen at or before it. */
export function versionInForce(versions: readonly FrozenLimits[], decidedAt: string): FrozenLimits | null {
  const t = Date.parse(decidedAt);
  let best: FrozenLimits | null = null;
  let bestAt = -Infinity;
  for (const v of versions) {
    const f = Date.parse(v.frozenAt);
    if (f <= t && (f > bestAt || (f === bestAt && best !== null && v.version > best.version))) {
      best = v;
      bestAt = f;
    }
  }
  return best;
}

/** Phase I (trial) parameters from the given points; throws ComputeError when they cannot be estimated. */
function estimate(series: Series, pts: readonly SeriesPoint[]): { center: number; sigma: number } {
  if (series.chart === 'p') {
    const c = pChart(pts.map((p) => p.defectives ?? 0), pts.map((p) => p.size ?? 1));
    return { center: c.center, sigma: c.sigmaWithin };
  }
  const ch = chartOf(series.chart, pts, undefined);
  return { center: ch.center, sigma: ch.sigmaWithin };
}

function chartOf(kind: DriftChart, pts: readonly SeriesPoint[], known: KnownParameters | undefined): AnyChart {
  switch (kind) {
    case 'xbar-r':
      return xbarR(pts.map((p) => p.subgroup), { known });
    case 'xbar-s':
      return xbarS(pts.map((p) => p.subgroup), { known });
    case 'i-mr':
      return individualsMR(pts.map((p) => p.subgroup[0]), { known });
    case 'p':
      return pChart(pts.map((p) => p.defectives ?? 0), pts.map((p) => p.size ?? 1), { known: known ? { center: known.center } : undefined });
  }
}

function relabel(message: string, label: string, chart: 'location' | 'dispersion', kind: DriftChart): string {
  if (chart === 'dispersion') return message.replace(/^point \d+/, `${label}: ${DISPERSION_NAME[kind]}`);
  return message.replace(/^point \d+/, label);
}

function judged(p: SeriesPoint, index: number, value: number, dispersion: number | null, limits: PointLimits | null, limitVersion: number | null, segment: number): JudgedPoint {
  return {
    lotId: p.lotId,
    lotRef: p.lotRef,
    lotSeq: p.lotSeq,
    receivedAt: p.receivedAt,
    decidedAt: p.decidedAt,
    sampleId: p.sampleId,
    serial: p.serial,
    chunk: p.chunk,
    subgroup: p.subgroup,
    ...(p.defectives !== undefined ? { defectives: p.defectives, size: p.size } : {}),
    index,
    value,
    dispersion,
    limits,
    limitVersion,
    segment,
    flags: [],
  };
}

/** Judges one run of consecutive points that share the same limits, appending to `out`. */
function judgeRun(kind: DriftChart, run: readonly SeriesPoint[], start: number, known: KnownParameters, rules: RuleSetName, version: number | null, segment: number, out: JudgedPoint[]): PointLimits {
  if (kind === 'i-mr' && run.length === 1) {
    // The chart function needs two values for a moving range; one point still gets its zone rules.
    const { D1, D2 } = knownSigmaRangeFactors(2);
    const v = run[0].subgroup[0];
    const limits = { center: known.center, ucl: known.center + 3 * known.sigma, lcl: known.center - 3 * known.sigma, sigma: known.sigma, dispersionCenter: d2Of(2) * known.sigma, dispersionUcl: D2 * known.sigma, dispersionLcl: D1 * known.sigma };
    const jp = judged(run[0], start, v, null, limits, version, segment);
    for (const s of evaluateRules([v], known.center, known.sigma, rules)) jp.flags.push({ rule: s.rule, chart: 'location', message: relabel(s.message, pointLabel(run[0]), 'location', kind), description: RULE_DESCRIPTIONS[s.rule] });
    out.push(jp);
    return limits;
  }
  const ch = chartOf(kind, run, known);
  const first = out.length;
  let shared: PointLimits;
  if (ch.chart === 'p') {
    shared = { center: ch.center, ucl: ch.ucl[0], lcl: ch.lcl[0], sigma: ch.sigma[0], dispersionCenter: null, dispersionUcl: null, dispersionLcl: null };
    for (let i = 0; i < run.length; i++) {
      const limits = { center: ch.center, ucl: ch.ucl[i], lcl: ch.lcl[i], sigma: ch.sigma[i], dispersionCenter: null, dispersionUcl: null, dispersionLcl: null };
      out.push(judged(run[i], start + i, ch.points[i], null, limits, version, segment));
    }
  } else {
    const base = { center: ch.center, ucl: ch.ucl, lcl: ch.lcl, sigma: ch.sigma };
    let disp: (i: number) => number | null;
    if (ch.chart === 'xbar-r') {
      shared = { ...base, dispersionCenter: ch.rangeCenter, dispersionUcl: ch.rangeUcl, dispersionLcl: ch.rangeLcl };
      disp = (i) => ch.ranges[i];
    } else if (ch.chart === 'xbar-s') {
      shared = { ...base, dispersionCenter: ch.sCenter, dispersionUcl: ch.sUcl, dispersionLcl: ch.sLcl };
      disp = (i) => ch.sValues[i];
    } else {
      shared = { ...base, dispersionCenter: ch.mrCenter, dispersionUcl: ch.mrUcl, dispersionLcl: ch.mrLcl };
      disp = (i) => (i > 0 ? ch.movingRanges[i - 1] : null);
    }
    for (let i = 0; i < run.length; i++) out.push(judged(run[i], start + i, ch.points[i], disp(i), shared, version, segment));
  }
  for (const s of chartSignals(ch, rules)) {
    out[first + s.index].flags.push({ rule: s.rule, chart: s.chart, message: relabel(s.message, pointLabel(run[s.index]), s.chart, kind), description: RULE_DESCRIPTIONS[s.rule] });
  }
  return shared;
}

function plotted(series: Series, p: SeriesPoint): number {
  if (series.chart === 'p') return (p.defectives ?? 0) / (p.size ?? 1);
  let sum = 0;
  for (const v of p.subgroup) sum += v;
  return sum / p.subgroup.length;
}

/**
 * Every point judged against the limits in force when its lot was decided: the newest frozen
 * version at that time (phase II), or — before any freeze — trial limits computed from all the
 * points no version covers (phase I). Run rules restart where the limits change, since a run
 * measured against one centre line says nothing about another.
 */
export function judgeSeries(series: Series, versions: readonly FrozenLimits[], rules: RuleSetName): Judgement {
  if (!RULE_SETS[rules]) throw new ComputeError(`unknown rule set "${rules}"; use "western-electric" or "nelson"`, 'rules');
  const usable = versions.filter((v) => family(v.chart) === family(series.chart));
  const assigned = series.points.map((p) => (usable.length ? versionInForce(usable, p.decidedAt) : null));
  const trialPts = series.points.filter((_, i) => assigned[i] === null);
  let trial: Judgement['trial'] = null;
  let trialNote: string | null = null;
  if (trialPts.length) {
    try {
      const t = estimate(series, trialPts);
      trial = { ...t, count: trialPts.length };
    } catch (err) {
      if (!(err instanceof ComputeError)) throw err;
      trialNote = `Trial limits cannot be computed yet: ${err.message}.`;
    }
  }

  const points: JudgedPoint[] = [];
  const segments: Segment[] = [];
  let start = 0;
  while (start < series.points.length) {
    const v = assigned[start];
    let end = start + 1;
    while (end < series.points.length && assigned[end] === v) end++;
    const run = series.points.slice(start, end);
    const known = v ? { center: v.center, sigma: v.sigma } : trial ? { center: trial.center, sigma: trial.sigma } : null;
    const seg = segments.length;
    const version = v?.version ?? null;
    if (known && (series.chart === 'p' || known.sigma > 0)) {
      const limits = judgeRun(series.chart, run, start, known, rules, version, seg, points);
      segments.push({ from: start, to: end - 1, limitVersion: version, center: known.center, sigmaWithin: known.sigma, limits });
    } else {
      run.forEach((p, k) => points.push(judged(p, start + k, plotted(series, p), null, null, version, seg)));
      segments.push({ from: start, to: end - 1, limitVersion: version, center: null, sigmaWithin: null, limits: null });
    }
    start = end;
  }
  return { chart: series.chart, points, segments, trial, trialNote };
}

/** Which stored fields a characteristic's chart reads (the chart query fetches only those). */
export function fieldsNeeded(c: Pick<DriftCharacteristic, 'kind' | 'layout' | 'readingsPerSample' | 'chartKind' | 'subgroupSize'>): { sampleId: boolean; value: boolean; values: boolean; conforming: boolean } {
  if (c.chartKind === 'p' || c.kind === 'attribute') return { sampleId: false, value: false, values: false, conforming: true };
  const g = c.subgroupSize;
  if (c.chartKind === 'i-mr' || g === 1) return { sampleId: true, value: true, values: false, conforming: false };
  if (g != null && g >= 2 && c.readingsPerSample >= 2 && c.readingsPerSample % g === 0 && c.layout === 'single') return { sampleId: true, value: false, values: true, conforming: false };
  // Lot subgroups: only values (should every lot have one core, the individuals carry no sample id).
  return { sampleId: false, value: true, values: false, conforming: false };
}

// ---------------------------------------------------------------------------------------------
// Freezing limits (phase I on a baseline)

export interface FrozenProposal {
  chart: DriftChart;
  n: number | null;
  center: number;
  /** σ of individual measurements (p: √(p̄(1 − p̄))). */
  sigma: number;
  /** Limits of the plotted statistic at subgroup size n (null for p, whose limits vary per lot). */
  ucl: number | null;
  lcl: number | null;
  rangeCenter: number | null;
  rangeUcl: number | null;
  rangeLcl: number | null;
  /** Series indices (0-based) of the baseline subgroups excluded as out of control. */
  excluded: number[];
  iterations: number;
  baselineCount: number;
}

/**
 * Phase I limits from the baseline subgroups (series indices): subgroups beyond the limits are
 * removed and the limits recomputed until none is (Montgomery §6.2 "revised control limits";
 * variables via phaseOneLimits, p charts by the same loop on rule 1 with per-lot limits).
 */
export function proposeLimits(series: Series, baseline: readonly number[], rules: RuleSetName): FrozenProposal {
  const pts = baseline.map((i) => {
    const p = series.points[i];
    if (!p) throw new ComputeError(`the baseline refers to subgroup ${i + 1}, which does not exist`, 'baseline');
    return p;
  });
  if (pts.length < 2) throw new ComputeError(`the baseline needs at least 2 subgroups (got ${pts.length})`, 'baseline');
  if (series.chart === 'p') {
    let kept = pts.map((_, i) => i);
    let iterations = 0;
    for (;;) {
      iterations++;
      if (kept.length < 2) throw new ComputeError(`removing lots beyond the limits left ${kept.length}; phase I limits need at least 2 in control`, 'baseline');
      const c = pChart(kept.map((i) => pts[i].defectives ?? 0), kept.map((i) => pts[i].size ?? 1));
      const out = new Set(limitSignals(c.points, c.ucl, c.lcl, 'we1').map((s) => kept[s.index]));
      if (!out.size) {
        const excluded = pts.map((_, i) => i).filter((i) => !kept.includes(i)).map((i) => baseline[i]);
        return { chart: 'p', n: null, center: c.center, sigma: c.sigmaWithin, ucl: null, lcl: null, rangeCenter: null, rangeUcl: null, rangeLcl: null, excluded, iterations, baselineCount: pts.length };
      }
      kept = kept.filter((i) => !out.has(i));
    }
  }
  const r = phaseOneLimits(pts.map((p) => p.subgroup), series.chart, rules);
  const ch = r.chart;
  const disp =
    ch.chart === 'xbar-r' ? [ch.rangeCenter, ch.rangeUcl, ch.rangeLcl] : ch.chart === 'xbar-s' ? [ch.sCenter, ch.sUcl, ch.sLcl] : [ch.mrCenter, ch.mrUcl, ch.mrLcl];
  return {
    chart: series.chart,
    n: series.n,
    center: r.center,
    sigma: r.sigmaWithin,
    ucl: ch.ucl,
    lcl: ch.lcl,
    rangeCenter: disp[0],
    rangeUcl: disp[1],
    rangeLcl: disp[2],
    excluded: r.excluded.map((i) => baseline[i]),
    iterations: r.iterations,
    baselineCount: pts.length,
  };
}

// ---------------------------------------------------------------------------------------------
// Capability, histogram, wear forecast

export interface DriftCapability {
  result: (Pick<CapabilityResult, 'cp' | 'cpk' | 'pp' | 'ppk' | 'mean' | 'sigmaWithin' | 'sigmaOverall' | 'n'> & { subgroups: number }) | null;
  warnings: string[];
}

/** Subgroups behind capability: at least 25 is the usual minimum for a stable estimate (AIAG SPC manual). */
export const MIN_CAPABILITY_SUBGROUPS = 25;

/**
 * Cp/Cpk with σ within subgroups (the chart's own estimate: R̄/d2, s̄/c4 or MR̄/d2(2)) and Pp/Ppk
 * with the overall σ, over the given points. Warns when the points are not in control or too few.
 */
export function driftCapability(series: Series, pts: readonly JudgedPoint[], lsl: number | null, usl: number | null): DriftCapability {
  const warnings: string[] = [];
  if (series.chart === 'p') return { result: null, warnings: ['Capability applies to measured values; a p chart has none.'] };
  if (lsl == null && usl == null) return { result: null, warnings: ['No specification limit to compare with.'] };
  const flagged = pts.filter((p) => p.flags.length).length;
  if (flagged) warnings.push(`Not in control: ${flagged} point${flagged === 1 ? '' : 's'} flagged by the run rules, so the indices do not predict future lots.`);
  if (pts.length < MIN_CAPABILITY_SUBGROUPS) warnings.push(`Only ${pts.length} subgroup${pts.length === 1 ? '' : 's'}; at least ${MIN_CAPABILITY_SUBGROUPS} are needed for a dependable estimate.`);
  if (lsl == null || usl == null) warnings.push('One-sided limit: Cp and Pp are not defined, Cpk and Ppk are the one-sided indices.');
  try {
    const sigmaWithin = estimate(series, pts).sigma;
    const limits = { lsl: lsl ?? undefined, usl: usl ?? undefined };
    const c = series.chart === 'i-mr' ? capability({ values: pts.map((p) => p.subgroup[0]), sigmaWithin, ...limits }) : capability({ subgroups: pts.map((p) => p.subgroup), sigmaWithin, ...limits });
    return { result: { cp: c.cp, cpk: c.cpk, pp: c.pp, ppk: c.ppk, mean: c.mean, sigmaWithin: c.sigmaWithin, sigmaOverall: c.sigmaOverall, n: c.n, subgroups: pts.length }, warnings };
  } catch (err) {
    if (!(err instanceof ComputeError)) throw err;
    return { result: null, warnings: [...warnings, `Capability cannot be computed: ${err.message}.`] };
  }
}

export interface HistogramBin {
  from: number;
  to: number;
  count: number;
}

/** Equal-width bins over the values and the specification limits (√n bins, 5 to 30). */
export function histogram(values: readonly number[], lsl: number | null, usl: number | null): HistogramBin[] {
  const xs = values.filter(finite);
  if (!xs.length) return [];
  let lo = xs[0];
  let hi = lo;
  for (const v of xs) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lsl != null) lo = Math.min(lo, lsl);
  if (usl != null) hi = Math.max(hi, usl);
  const count = Math.min(30, Math.max(5, Math.ceil(Math.sqrt(xs.length))));
  if (hi === lo) return [{ from: lo, to: hi, count: xs.length }];
  const w = (hi - lo) / count;
  const bins: HistogramBin[] = Array.from({ length: count }, (_, i) => ({ from: lo + i * w, to: i === count - 1 ? hi : lo + (i + 1) * w, count: 0 }));
  for (const v of xs) bins[Math.min(count - 1, Math.floor((v - lo) / w))].count++;
  return bins;
}

/** The individual measurements of a series, as the specification limits judge them. */
export function measurements(series: Series, pts: readonly SeriesPoint[] = series.points): number[] {
  return series.chart === 'p' ? [] : pts.flatMap((p) => p.subgroup);
}

export interface DieWearOptions {
  /** How many of the most recent lots the line is fitted to (default 30). */
  windowLots?: number;
  /** "Die service due" when the conservative count of lots left is below this (default 5). */
  serviceLots?: number;
  confidence?: number;
}

export interface DieWear extends WearForecast {
  usl: number;
  /** Lots in the fit and their sequence range. */
  lotsUsed: number;
  firstLotSeq: number;
  lastLotSeq: number;
  serviceLots: number;
  serviceDue: boolean;
}

export const DEFAULT_SERVICE_LOTS = 5;
export const DEFAULT_WEAR_WINDOW_LOTS = 30;

/**
 * Die-wear forecast: a straight line through the individual measurements (the ones the upper
 * limit judges: each burr reading) against lot sequence, over the most recent lots. "Die service
 * due" uses the conservative count (the upper prediction bound), so the notice comes early
 * rather than late. Returns null when fewer than 3 lots have measurements.
 */
export function dieWearForecast(series: Series, usl: number, opts: DieWearOptions = {}): DieWear | null {
  if (series.chart === 'p') return null;
  const windowLots = opts.windowLots ?? DEFAULT_WEAR_WINDOW_LOTS;
  const serviceLots = opts.serviceLots ?? DEFAULT_SERVICE_LOTS;
  const seqs = [...new Set(series.points.map((p) => p.lotSeq))];
  if (seqs.length < 3) return null;
  const recent = new Set(seqs.slice(-windowLots));
  const x: number[] = [];
  const y: number[] = [];
  for (const p of series.points) {
    if (!recent.has(p.lotSeq)) continue;
    for (const v of p.subgroup) {
      x.push(p.lotSeq);
      y.push(v);
    }
  }
  const f = wearForecast({ x, y, usl, confidence: opts.confidence });
  const kept = [...recent];
  return {
    ...f,
    usl,
    lotsUsed: kept.length,
    firstLotSeq: kept[0],
    lastLotSeq: kept[kept.length - 1],
    serviceLots,
    serviceDue: f.lotsToLimitLower !== null && f.lotsToLimitLower < serviceLots,
  };
}
