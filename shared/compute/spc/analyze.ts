import { ComputeError } from '../errors';
import { capability, type CapabilityResult } from './capability';
import { chartSignals, individualsMR, pChart, xbarR, xbarS, type AnyChart, type ChartSignal } from './charts';
import { RULE_SETS, type RuleSetName } from './rules';

/**
 * One entry point for a control chart request: limits, points, run-rule signals and, when
 * specification limits are given, capability. The input is validated at the edge by
 * `spcAnalyzeInputSchema` (shared/schemas/spc.ts); the chart functions check it again and throw
 * ComputeError, so a direct caller gets the same messages.
 */

export type AnalyzeChart = 'xbar-r' | 'xbar-s' | 'i-mr' | 'p';

export interface AnalyzeInput {
  chart: AnalyzeChart;
  subgroups?: number[][];
  values?: number[];
  defectives?: number[];
  sizes?: number[];
  lsl?: number;
  usl?: number;
  rules?: RuleSetName;
  /** With `sigma` (variables charts) or alone (p chart: the known fraction defective): phase II. */
  center?: number;
  /** σ of individual measurements for phase II of a variables chart. */
  sigma?: number;
}

export interface AnalyzeSignal {
  rule: string;
  index: number;
  chart: ChartSignal['chart'];
  message: string;
}

export interface AnalyzeResult {
  chart: AnalyzeChart;
  center: number;
  /** One value, or one per point for a p chart. */
  ucl: number | number[];
  lcl: number | number[];
  /** Which companion chart range* describes: R, s or moving range (absent for p). */
  dispersion?: 'range' | 's' | 'moving-range';
  rangeCenter?: number;
  rangeUcl?: number;
  rangeLcl?: number;
  /** The companion chart's plotted values (moving range k belongs to point k + 1). */
  dispersionPoints?: number[];
  sigmaWithin: number;
  /** σ of the plotted statistic (per point for p). */
  sigma: number | number[];
  points: number[];
  /** 'I': limits from these data; 'II': judged against the given centre and σ. */
  phase: 'I' | 'II';
  signals: AnalyzeSignal[];
  capability?: CapabilityResult;
}

function required<T>(value: T | undefined, field: string, what: string): T {
  if (value === undefined) throw new ComputeError(`${field} is required for ${what}`, field);
  return value;
}

export function analyze(input: AnalyzeInput): AnalyzeResult {
  const rules = input.rules ?? 'western-electric';
  if (!RULE_SETS[rules]) throw new ComputeError(`unknown rule set "${rules}"; use "western-electric" or "nelson"`, 'rules');
  const hasCenter = input.center !== undefined;
  const hasSigma = input.sigma !== undefined;
  let chart: AnyChart;
  if (input.chart === 'p') {
    if (hasSigma) throw new ComputeError('sigma does not apply to a p chart; give center as the known fraction defective', 'sigma');
    if (input.lsl !== undefined || input.usl !== undefined) {
      throw new ComputeError('specification limits apply to measured values, not to a p chart', 'usl');
    }
    chart = pChart(required(input.defectives, 'defectives', 'a p chart'), required(input.sizes, 'sizes', 'a p chart'), {
      known: hasCenter ? { center: input.center as number } : undefined,
    });
  } else {
    if (hasCenter !== hasSigma) {
      throw new ComputeError('give both center and sigma to judge against known limits, or neither', hasCenter ? 'sigma' : 'center');
    }
    const known = hasCenter ? { center: input.center as number, sigma: input.sigma as number } : undefined;
    if (input.chart === 'xbar-r') chart = xbarR(required(input.subgroups, 'subgroups', 'an X-bar/R chart'), { known });
    else if (input.chart === 'xbar-s') chart = xbarS(required(input.subgroups, 'subgroups', 'an X-bar/s chart'), { known });
    else if (input.chart === 'i-mr') chart = individualsMR(required(input.values, 'values', 'an individuals chart'), { known });
    else throw new ComputeError(`unknown chart "${String(input.chart)}"; use xbar-r, xbar-s, i-mr or p`, 'chart');
  }

  const result: AnalyzeResult = {
    chart: chart.chart,
    center: chart.center,
    ucl: chart.ucl,
    lcl: chart.lcl,
    sigmaWithin: chart.sigmaWithin,
    sigma: chart.sigma,
    points: chart.points,
    phase: hasCenter ? 'II' : 'I',
    signals: chartSignals(chart, rules).map((s) => ({ rule: s.rule, index: s.index, chart: s.chart, message: s.message })),
  };
  if (chart.chart === 'xbar-r') {
    Object.assign(result, { dispersion: 'range', rangeCenter: chart.rangeCenter, rangeUcl: chart.rangeUcl, rangeLcl: chart.rangeLcl, dispersionPoints: chart.ranges });
  } else if (chart.chart === 'xbar-s') {
    Object.assign(result, { dispersion: 's', rangeCenter: chart.sCenter, rangeUcl: chart.sUcl, rangeLcl: chart.sLcl, dispersionPoints: chart.sValues });
  } else if (chart.chart === 'i-mr') {
    Object.assign(result, { dispersion: 'moving-range', rangeCenter: chart.mrCenter, rangeUcl: chart.mrUcl, rangeLcl: chart.mrLcl, dispersionPoints: chart.movingRanges });
  }

  if (chart.chart !== 'p' && (input.lsl !== undefined || input.usl !== undefined)) {
    // σw is the chart's own (R̄/d2, s̄/c4, MR̄/d2, or the known σ in phase II), so Cp agrees
    // with the limits drawn; the mean is the data's mean in both phases.
    result.capability = capability({
      ...(chart.chart === 'i-mr' ? { values: input.values } : { subgroups: input.subgroups }),
      sigmaWithin: chart.sigmaWithin,
      lsl: input.lsl,
      usl: input.usl,
    });
  }
  return result;
}
