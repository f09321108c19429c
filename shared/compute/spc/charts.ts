import { ComputeError } from '../errors';
import { controlConstants, d2 as d2Of, knownSigmaRangeFactors, sConstants } from './constants';
import { evaluateRules, limitSignals, RULE_SETS, type RuleSetName, type Signal } from './rules';
import { assertFiniteValues, mean, sampleSd } from './stats';

/**
 * Shewhart control charts (NIST/SEMATECH e-Handbook §6.3.2; Montgomery, Introduction to
 * Statistical Quality Control, ch. 6–7). Phase I estimates the limits from the data; phase II
 * (`known`) judges the data against a centre and σ fixed beforehand.
 *
 * `known.sigma` is always σ of the individual measurements (the process σ), not of the plotted
 * statistic: the chart derives σ/√n itself, so one number serves every chart.
 */

export interface KnownParameters {
  center: number;
  /** σ of individual measurements. */
  sigma: number;
}

export interface ChartOptions {
  known?: KnownParameters;
}

interface LocationChart {
  center: number;
  ucl: number;
  lcl: number;
  /** σ of the plotted statistic; the zones of the run rules are multiples of it. */
  sigma: number;
  /** σ of individual measurements within subgroups (R̄/d2, s̄/c4, MR̄/d2(2), or the known σ). */
  sigmaWithin: number;
  /** The plotted statistic, one per subgroup (or per value for individuals). */
  points: number[];
}

export interface XbarRChart extends LocationChart {
  chart: 'xbar-r';
  subgroupSize: number;
  rangeCenter: number;
  rangeUcl: number;
  rangeLcl: number;
  ranges: number[];
}

export interface XbarSChart extends LocationChart {
  chart: 'xbar-s';
  subgroupSize: number;
  sCenter: number;
  sUcl: number;
  sLcl: number;
  sValues: number[];
}

export interface IndividualsChart extends LocationChart {
  chart: 'i-mr';
  mrCenter: number;
  mrUcl: number;
  mrLcl: number;
  /** movingRanges[k] = |x[k+1] − x[k]|, so it belongs to point k + 1. */
  movingRanges: number[];
}

export interface PChart {
  chart: 'p';
  center: number;
  /** Per-point limits: they change with the sample size. */
  ucl: number[];
  lcl: number[];
  /** Per-point σ of the plotted proportion, √(p̄(1 − p̄)/nᵢ). */
  sigma: number[];
  /** √(p̄(1 − p̄)), the σ of a single item's 0/1 outcome. */
  sigmaWithin: number;
  points: number[];
  sizes: number[];
}

export type VariablesChart = XbarRChart | XbarSChart | IndividualsChart;
export type AnyChart = VariablesChart | PChart;
export type VariablesChartKind = VariablesChart['chart'];

// ---------------------------------------------------------------------------------------------
// Validation

const CHART_NAMES: Record<VariablesChartKind, string> = {
  'xbar-r': 'an X-bar/R chart',
  'xbar-s': 'an X-bar/s chart',
  'i-mr': 'an individuals chart',
};

function checkKnown(known: KnownParameters | undefined): KnownParameters | undefined {
  if (known === undefined) return undefined;
  if (!Number.isFinite(known.center)) throw new ComputeError('the known centre must be a finite number', 'center');
  if (!(Number.isFinite(known.sigma) && known.sigma > 0)) {
    throw new ComputeError('the known sigma must be a finite number above 0', 'sigma');
  }
  return known;
}

/** Validates subgroups and returns their common size. */
function checkSubgroups(
  subgroups: readonly (readonly number[])[],
  kind: 'xbar-r' | 'xbar-s',
  minCount: number,
): number {
  const name = CHART_NAMES[kind];
  if (!Array.isArray(subgroups)) throw new ComputeError('subgroups must be a list of subgroups, each a list of measurements', 'subgroups');
  if (subgroups.length < minCount) {
    throw new ComputeError(
      `${name} needs at least ${minCount} subgroup${minCount === 1 ? '' : 's'} (got ${subgroups.length})`,
      'subgroups',
    );
  }
  const maxSize = kind === 'xbar-r' ? 10 : Infinity;
  let size = 0;
  subgroups.forEach((g, i) => {
    if (!Array.isArray(g)) throw new ComputeError(`subgroup ${i + 1} must be a list of measurements`, 'subgroups');
    if (i === 0) size = g.length;
    else if (g.length !== size) {
      throw new ComputeError(
        `subgroup ${i + 1} has ${g.length} measurements but subgroup 1 has ${size}; ${name} needs equal subgroup sizes`,
        'subgroups',
      );
    }
    if (g.length < 2 || g.length > maxSize) {
      throw new ComputeError(
        `subgroup ${i + 1} has ${g.length} measurement${g.length === 1 ? '' : 's'}; ${name} needs ${
          kind === 'xbar-r' ? '2 to 10' : 'at least 2'
        } per subgroup${kind === 'xbar-r' && g.length > 10 ? ' (use X-bar/s for larger subgroups)' : ''}`,
        'subgroups',
      );
    }
    g.forEach((v, j) => {
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new ComputeError(`subgroup ${i + 1}, measurement ${j + 1} is not a finite number`, 'subgroups');
      }
    });
  });
  return size;
}

function zeroSpread(what: string): ComputeError {
  return new ComputeError(
    `${what} is zero, so the process spread cannot be estimated (check that the gauge resolves the variation)`,
    'subgroups',
  );
}

function range(g: readonly number[]): number {
  let lo = g[0];
  let hi = g[0];
  for (const v of g) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return hi - lo;
}

// ---------------------------------------------------------------------------------------------
// Charts

/** X-bar and R chart; subgroups of equal size 2–10. Limits x̿ ± A2·R̄, R chart D3·R̄, D4·R̄. */
export function xbarR(subgroups: readonly (readonly number[])[], options: ChartOptions = {}): XbarRChart {
  const known = checkKnown(options.known);
  const n = checkSubgroups(subgroups, 'xbar-r', known ? 1 : 2);
  const points = subgroups.map((g) => mean(g));
  const ranges = subgroups.map(range);
  const k = controlConstants(n);
  if (known) {
    const sigma = known.sigma / Math.sqrt(n);
    const { D1, D2 } = knownSigmaRangeFactors(n);
    return {
      chart: 'xbar-r',
      subgroupSize: n,
      center: known.center,
      ucl: known.center + 3 * sigma,
      lcl: known.center - 3 * sigma,
      sigma,
      sigmaWithin: known.sigma,
      points,
      rangeCenter: k.d2 * known.sigma,
      rangeUcl: D2 * known.sigma,
      rangeLcl: D1 * known.sigma,
      ranges,
    };
  }
  const center = mean(points);
  const rBar = mean(ranges);
  if (rBar === 0) throw zeroSpread('every subgroup range');
  return {
    chart: 'xbar-r',
    subgroupSize: n,
    center,
    ucl: center + k.A2 * rBar,
    lcl: center - k.A2 * rBar,
    sigma: (k.A2 * rBar) / 3,
    sigmaWithin: rBar / k.d2,
    points,
    rangeCenter: rBar,
    rangeUcl: k.D4 * rBar,
    rangeLcl: k.D3 * rBar,
    ranges,
  };
}

/** X-bar and s chart; subgroups of equal size ≥ 2. Limits x̿ ± A3·s̄, s chart B3·s̄, B4·s̄. */
export function xbarS(subgroups: readonly (readonly number[])[], options: ChartOptions = {}): XbarSChart {
  const known = checkKnown(options.known);
  const n = checkSubgroups(subgroups, 'xbar-s', known ? 1 : 2);
  const points = subgroups.map((g) => mean(g));
  const sValues = subgroups.map((g) => sampleSd(g));
  const k = sConstants(n);
  if (known) {
    const sigma = known.sigma / Math.sqrt(n);
    return {
      chart: 'xbar-s',
      subgroupSize: n,
      center: known.center,
      ucl: known.center + 3 * sigma,
      lcl: known.center - 3 * sigma,
      sigma,
      sigmaWithin: known.sigma,
      points,
      sCenter: k.c4 * known.sigma,
      sUcl: k.B6 * known.sigma,
      sLcl: k.B5 * known.sigma,
      sValues,
    };
  }
  const center = mean(points);
  const sBar = mean(sValues);
  if (sBar === 0) throw zeroSpread('every subgroup standard deviation');
  return {
    chart: 'xbar-s',
    subgroupSize: n,
    center,
    ucl: center + k.A3 * sBar,
    lcl: center - k.A3 * sBar,
    sigma: (k.A3 * sBar) / 3,
    sigmaWithin: sBar / k.c4,
    points,
    sCenter: sBar,
    sUcl: k.B4 * sBar,
    sLcl: k.B3 * sBar,
    sValues,
  };
}

function movingRanges(values: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length; i++) out.push(Math.abs(values[i] - values[i - 1]));
  return out;
}

function individualsLimits(
  values: readonly number[],
  center: number,
  sigmaWithin: number,
): IndividualsChart {
  const { D1, D2 } = knownSigmaRangeFactors(2);
  return {
    chart: 'i-mr',
    center,
    ucl: center + 3 * sigmaWithin,
    lcl: center - 3 * sigmaWithin,
    sigma: sigmaWithin,
    sigmaWithin,
    points: [...values],
    // MR̄ = d2(2)·σ, and D4(2)·MR̄ = D2(2)·σ, so one form serves both phases.
    mrCenter: d2Of(2) * sigmaWithin,
    mrUcl: D2 * sigmaWithin,
    mrLcl: D1 * sigmaWithin,
    movingRanges: movingRanges(values),
  };
}

/**
 * Individuals and moving-range chart: σ = MR̄/d2(2) with d2(2) = 2/√π = 1.128379 (tables round
 * it to 1.128); limits x̄ ± 3σ, MR chart 0 and D4(2)·MR̄.
 */
export function individualsMR(values: readonly number[], options: ChartOptions = {}): IndividualsChart {
  const known = checkKnown(options.known);
  if (!Array.isArray(values)) throw new ComputeError('values must be a list of measurements', 'values');
  if (values.length < 2) {
    throw new ComputeError(`an individuals chart needs at least 2 values (got ${values.length})`, 'values');
  }
  assertFiniteValues(values, 'values', 2);
  if (known) return individualsLimits(values, known.center, known.sigma);
  const mrBar = mean(movingRanges(values));
  if (mrBar === 0) throw zeroSpread('every moving range');
  return individualsLimits(values, mean(values), mrBar / d2Of(2));
}

export interface PChartOptions {
  /** Phase II: the known fraction defective p₀ (σ follows from it). */
  known?: { center: number };
}

/** p chart with limits per point, p̄ ± 3√(p̄(1 − p̄)/nᵢ), clipped to [0, 1]. */
export function pChart(defectives: readonly number[], sizes: readonly number[], options: PChartOptions = {}): PChart {
  if (!Array.isArray(defectives) || !Array.isArray(sizes)) {
    throw new ComputeError('defectives and sizes must be lists of counts', 'defectives');
  }
  if (defectives.length !== sizes.length) {
    throw new ComputeError(
      `defectives has ${defectives.length} entries but sizes has ${sizes.length}; give one of each per sample`,
      'sizes',
    );
  }
  const known = options.known;
  const minCount = known ? 1 : 2;
  if (defectives.length < minCount) {
    throw new ComputeError(`a p chart needs at least ${minCount} sample${minCount === 1 ? '' : 's'} (got ${defectives.length})`, 'defectives');
  }
  for (let i = 0; i < sizes.length; i++) {
    const d = defectives[i];
    const n = sizes[i];
    if (!(Number.isInteger(n) && n >= 1)) {
      throw new ComputeError(`sample ${i + 1}: the sample size must be a whole number of at least 1`, 'sizes');
    }
    if (!(Number.isInteger(d) && d >= 0)) {
      throw new ComputeError(`sample ${i + 1}: defectives must be a whole number of at least 0`, 'defectives');
    }
    if (d > n) {
      throw new ComputeError(`sample ${i + 1}: ${d} defectives is more than the sample size of ${n}`, 'defectives');
    }
  }
  if (known && !(Number.isFinite(known.center) && known.center >= 0 && known.center <= 1)) {
    throw new ComputeError('the known fraction defective must be between 0 and 1', 'center');
  }
  let totalDefective = 0;
  let totalSize = 0;
  for (let i = 0; i < sizes.length; i++) {
    totalDefective += defectives[i];
    totalSize += sizes[i];
  }
  const pBar = known ? known.center : totalDefective / totalSize;
  const spread = Math.sqrt(pBar * (1 - pBar));
  const sigma = sizes.map((n) => spread / Math.sqrt(n));
  return {
    chart: 'p',
    center: pBar,
    ucl: sigma.map((s) => Math.min(1, pBar + 3 * s)),
    lcl: sigma.map((s) => Math.max(0, pBar - 3 * s)),
    sigma,
    sigmaWithin: spread,
    points: defectives.map((d, i) => d / sizes[i]),
    sizes: [...sizes],
  };
}

// ---------------------------------------------------------------------------------------------
// Signals

export interface ChartSignal extends Signal {
  /** 'location' = the X-bar, individuals or p chart; 'dispersion' = its R, s or MR chart. */
  chart: 'location' | 'dispersion';
}

/**
 * All signals for a chart: the chosen run rules on the location chart, and rule 1 (a point
 * beyond its limits) on the dispersion chart. Zone rules are not applied to R, s or MR charts
 * because their distributions are skewed and their lower limit is often clipped at 0.
 * A moving-range signal is reported at the later of its two points.
 */
export function chartSignals(chart: AnyChart, rules: RuleSetName = 'western-electric'): ChartSignal[] {
  const location: ChartSignal[] = evaluateRules(chart.points, chart.center, chart.sigma, rules).map((s) => ({
    ...s,
    chart: 'location',
  }));
  const rule1 = RULE_SETS[rules][0];
  let dispersion: Signal[] = [];
  if (chart.chart === 'xbar-r') dispersion = limitSignals(chart.ranges, chart.rangeUcl, chart.rangeLcl, rule1);
  else if (chart.chart === 'xbar-s') dispersion = limitSignals(chart.sValues, chart.sUcl, chart.sLcl, rule1);
  else if (chart.chart === 'i-mr') dispersion = limitSignals(chart.movingRanges, chart.mrUcl, chart.mrLcl, rule1, 1);
  const all = [...location, ...dispersion.map((s): ChartSignal => ({ ...s, chart: 'dispersion' }))];
  // Stable sort: by index, location before dispersion at the same index.
  return all.sort((a, b) => a.index - b.index || (a.chart === b.chart ? 0 : a.chart === 'location' ? -1 : 1));
}

// ---------------------------------------------------------------------------------------------
// Phase I

export interface PhaseOneResult<C extends VariablesChart = VariablesChart> {
  /** Every subgroup, judged against the revised limits. */
  chart: C;
  /** Revised centre and within-subgroup σ, from the subgroups that were kept. */
  center: number;
  sigmaWithin: number;
  /** 0-based indices of the subgroups removed, in the order of the original data. */
  excluded: number[];
  /** Number of times the limits were computed. */
  iterations: number;
  /** Signals of the full rule set for every subgroup against the revised limits. */
  signals: ChartSignal[];
}

/**
 * Phase I limits: remove every subgroup that is beyond 3σ (rule 1) on the location or the
 * dispersion chart, recompute from what is left, and repeat until nothing more is removed
 * (Montgomery §6.2, "revised control limits"; common practice is to remove only points with an
 * assignable cause — the caller should show `excluded` for review rather than hide it).
 *
 * For individuals (`chart` 'i-mr', one value per subgroup) only the individuals chart removes
 * points: a large moving range belongs to two points and does not say which one is out. After a
 * removal, only moving ranges between two kept, originally adjacent values enter MR̄.
 */
export function phaseOneLimits<K extends VariablesChartKind>(
  subgroups: readonly (readonly number[])[],
  chart: K,
  rules: RuleSetName = 'western-electric',
): PhaseOneResult<Extract<VariablesChart, { chart: K }>> {
  if (!RULE_SETS[rules]) throw new ComputeError(`unknown rule set "${rules}"; use "western-electric" or "nelson"`, 'rules');
  if (!Array.isArray(subgroups)) throw new ComputeError('subgroups must be a list of subgroups', 'subgroups');
  const count = subgroups.length;
  const kept = new Array<boolean>(count).fill(true);
  let values: number[] = [];
  if (chart === 'i-mr') {
    values = subgroups.map((g, i) => {
      if (!Array.isArray(g) || g.length !== 1) {
        throw new ComputeError(`subgroup ${i + 1} must hold exactly one value for an individuals chart`, 'subgroups');
      }
      return g[0];
    });
    assertFiniteValues(values, 'values', 2);
  } else if (chart !== 'xbar-r' && chart !== 'xbar-s') {
    throw new ComputeError(`phase I limits are available for xbar-r, xbar-s and i-mr charts, not "${String(chart)}"`, 'chart');
  }

  let iterations = 0;
  let center = 0;
  let sigmaWithin = 0;
  for (;;) {
    iterations++;
    const keptIdx = kept.flatMap((k, i) => (k ? [i] : []));
    if (keptIdx.length < 2) {
      throw new ComputeError(
        `removing subgroups beyond the limits left ${keptIdx.length}; phase I limits need at least 2 in control`,
        'subgroups',
      );
    }
    const flagged: number[] = [];
    if (chart === 'i-mr') {
      const mrs: number[] = [];
      for (let i = 1; i < count; i++) if (kept[i] && kept[i - 1]) mrs.push(Math.abs(values[i] - values[i - 1]));
      if (mrs.length === 0) {
        throw new ComputeError('no two kept values are adjacent, so the moving range cannot be estimated', 'subgroups');
      }
      const mrBar = mean(mrs);
      if (mrBar === 0) throw zeroSpread('every moving range');
      center = mean(keptIdx.map((i) => values[i]));
      sigmaWithin = mrBar / d2Of(2);
      const keptValues = keptIdx.map((i) => values[i]);
      for (const s of limitSignals(keptValues, center + 3 * sigmaWithin, center - 3 * sigmaWithin, 'we1')) {
        flagged.push(keptIdx[s.index]);
      }
    } else {
      const subset = keptIdx.map((i) => subgroups[i]);
      const c = chart === 'xbar-r' ? xbarR(subset) : xbarS(subset);
      center = c.center;
      sigmaWithin = c.sigmaWithin;
      const dispersion = c.chart === 'xbar-r' ? c.ranges : c.sValues;
      const dUcl = c.chart === 'xbar-r' ? c.rangeUcl : c.sUcl;
      const dLcl = c.chart === 'xbar-r' ? c.rangeLcl : c.sLcl;
      const out = new Set<number>();
      for (const s of limitSignals(c.points, c.ucl, c.lcl, 'we1')) out.add(s.index);
      for (const s of limitSignals(dispersion, dUcl, dLcl, 'we1')) out.add(s.index);
      for (const j of [...out].sort((a, b) => a - b)) flagged.push(keptIdx[j]);
    }
    if (flagged.length === 0) break;
    for (const i of flagged) kept[i] = false;
  }

  const known = { center, sigma: sigmaWithin };
  const final =
    chart === 'xbar-r' ? xbarR(subgroups, { known }) : chart === 'xbar-s' ? xbarS(subgroups, { known }) : individualsMR(values, { known });
  return {
    chart: final as Extract<VariablesChart, { chart: K }>,
    center,
    sigmaWithin,
    excluded: kept.flatMap((k, i) => (k ? [] : [i])),
    iterations,
    signals: chartSignals(final, rules),
  };
}
