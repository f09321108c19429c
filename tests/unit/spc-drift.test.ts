import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  buildSeries,
  dieWearForecast,
  driftCapability,
  fieldsNeeded,
  histogram,
  judgeSeries,
  proposeLimits,
  versionInForce,
  type DriftCharacteristic,
  type FrozenLimits,
  type LotResults,
} from '../../shared/compute/spc/drift';
import { pistonRings } from '../support/datasets';

// Montgomery, Introduction to Statistical Quality Control, Table 6.3: piston-ring inside diameter, 25 × 5 (mm).
const PISTON_RINGS = pistonRings();

const day = (i: number) => new Date(Date.UTC(2026, 0, 1 + i)).toISOString();

/** One lot per row; each core's value is one number (or its readings, for core-readings mode). */
function lots(rows: (number | null | number[])[][], opts: { conforming?: (boolean | null)[][] } = {}): LotResults[] {
  return rows.map((cores, i) => ({
    lotId: `lot-${i + 1}`,
    lotRef: 1000 + i + 1,
    receivedAt: day(i),
    decidedAt: day(i),
    cores: cores.map((v, k) => ({
      sampleId: `s-${i + 1}-${k + 1}`,
      serial: k + 1,
      value: Array.isArray(v) ? v.reduce((a, b) => a + b, 0) / v.length : v,
      values: Array.isArray(v) ? v : v === null ? [] : [v],
      conforming: opts.conforming?.[i]?.[k] ?? (v === null ? null : true),
    })),
  }));
}

const variable = (over: Partial<DriftCharacteristic> = {}): DriftCharacteristic => ({
  code: 'BORE',
  kind: 'variable',
  layout: 'probed',
  readingsPerSample: 8,
  chartKind: 'xbar-r',
  subgroupSize: 5,
  lsl: 73.95,
  usl: 74.05,
  ruleSet: 'western-electric',
  ...over,
});

describe('buildSeries', () => {
  it('takes each core’s raw readings as its subgroup when the subgroup size divides the readings (BURR 4 / 4)', () => {
    const sut = buildSeries(variable({ code: 'BURR', layout: 'single', readingsPerSample: 4, subgroupSize: 4, usl: 50, lsl: null }), lots([[[20, 21, 19, 22], [18, 20, 21, 19]], [[22, 23, 21, 24]]]));
    expect(sut.mode).toBe('core-readings');
    expect(sut.chart).toBe('xbar-r');
    expect(sut.points.map((p) => [p.lotRef, p.serial, p.lotSeq, p.subgroup])).toEqual([
      [1001, 1, 1, [20, 21, 19, 22]],
      [1001, 2, 1, [18, 20, 21, 19]],
      [1002, 1, 2, [22, 23, 21, 24]],
    ]);
  });

  it('splits 8 readings into two subgroups of 4 per core, and leaves off a core with missing readings', () => {
    const sut = buildSeries(variable({ layout: 'single', readingsPerSample: 8, subgroupSize: 4 }), lots([[[1, 2, 3, 4, 5, 6, 7, 8], [1, 2, 3]]]));
    expect(sut.points.map((p) => [p.serial, p.chunk, p.subgroup])).toEqual([
      [1, 1, [1, 2, 3, 4]],
      [1, 2, [5, 6, 7, 8]],
    ]);
    expect(sut.skipped).toEqual([{ lotId: 'lot-1', lotRef: 1001, reason: 'core 2 left off: not all 8 readings' }]);
  });

  it('makes one subgroup per lot from its first n cores and skips lots with fewer', () => {
    const sut = buildSeries(variable({ subgroupSize: 3 }), lots([[1, 2, 3, 4], [5, null, 6], [7, 8, 9]]));
    expect(sut.mode).toBe('lot-cores');
    expect(sut.points.map((p) => p.subgroup)).toEqual([[1, 2, 3], [7, 8, 9]]);
    expect(sut.points.map((p) => p.lotSeq)).toEqual([1, 3]);
    expect(sut.skipped[0]).toMatchObject({ lotRef: 1002, reason: expect.stringMatching(/only 2 cores with a value; the subgroup size is 3/) });
  });

  it('uses the most common number of cores per lot when the plan gives no subgroup size (ties → the smaller)', () => {
    expect(buildSeries(variable({ subgroupSize: null }), lots([[1, 2], [3, 4, 5], [6, 7, 8], [9, 1]])).n).toBe(2);
    expect(buildSeries(variable({ subgroupSize: null }), lots([[1, 2], [3, 4, 5], [6, 7, 8]])).n).toBe(3);
  });

  it('charts individuals core by core for i-mr or a subgroup size of 1', () => {
    for (const c of [variable({ chartKind: 'i-mr', subgroupSize: null }), variable({ subgroupSize: 1 })]) {
      const sut = buildSeries(c, lots([[1, 2], [3]]));
      expect(sut.chart).toBe('i-mr');
      expect(sut.points.map((p) => [p.lotRef, p.serial, p.subgroup[0]])).toEqual([[1001, 1, 1], [1001, 2, 2], [1002, 1, 3]]);
    }
  });

  it('counts nonconforming sampled cores per lot for a p chart', () => {
    const c = variable({ code: 'RUST', kind: 'attribute', layout: 'pass-fail', chartKind: 'p', subgroupSize: null });
    const sut = buildSeries(c, lots([[null, null, null], [null, null]], { conforming: [[true, false, false], [true, true]] }));
    expect(sut.points.map((p) => [p.defectives, p.size])).toEqual([[2, 3], [0, 2]]);
  });

  it('draws X-bar/R with subgroups above 10 as X-bar/s', () => {
    expect(buildSeries(variable({ subgroupSize: 12 }), lots([Array(12).fill(1)])).chart).toBe('xbar-s');
  });

  it('refuses what cannot be charted', () => {
    expect(() => buildSeries(variable({ chartKind: 'none' }), [])).toThrow(ComputeError);
    expect(() => buildSeries(variable({ kind: 'attribute', chartKind: 'xbar-r' }), [])).toThrow(/p chart/);
  });
});

describe('versionInForce', () => {
  const v = (version: number, at: string): FrozenLimits => ({ version, frozenAt: at, chart: 'xbar-r', center: 0, sigma: 1 });
  it('picks the newest version frozen at or before the decision', () => {
    const versions = [v(1, day(5)), v(2, day(10))];
    expect(versionInForce(versions, day(4))).toBeNull();
    expect(versionInForce(versions, day(5))?.version).toBe(1);
    expect(versionInForce(versions, day(9))?.version).toBe(1);
    expect(versionInForce(versions, day(30))?.version).toBe(2);
  });
});

describe('judgeSeries', () => {
  const rings = () => buildSeries(variable(), lots(PISTON_RINGS));

  it('judges unfrozen lots against trial limits from all of them (the piston rings, in control)', () => {
    const sut = judgeSeries(rings(), [], 'western-electric');
    expect(sut.trial?.center).toBeCloseTo(74.001176, 5); // Montgomery Table 6.3: x̿ 74.001 (unrounded 74.001176)
    expect(sut.trial?.sigma).toBeCloseTo(0.02324 / 2.326, 4); // Montgomery: σ̂ = R̄/d2 = 0.023/2.326
    const p = sut.points[0];
    expect(Math.abs(p.limits!.ucl - 74.014)).toBeLessThan(1e-3); // Montgomery: UCL 74.014
    expect(Math.abs(p.limits!.lcl - 73.988)).toBeLessThan(1e-3); // Montgomery: LCL 73.988
    expect(p.limits!.dispersionCenter).toBeCloseTo(0.02324, 5); // Montgomery: R̄ 0.023
    expect(p.dispersion).toBeCloseTo(74.03 - 73.992, 12);
    expect(p.limitVersion).toBeNull();
    expect(sut.points.flatMap((x) => x.flags)).toEqual([]);
  });

  it('judges lots decided after a freeze against the frozen centre and σ (phase II) and names lot and core in flags', () => {
    const series = buildSeries(variable({ chartKind: 'i-mr', subgroupSize: null }), lots([[10], [10.1], [9.9], [10.05], [10.5], [10]]));
    const sut = judgeSeries(series, [{ version: 3, frozenAt: day(3), chart: 'i-mr', center: 10, sigma: 0.1 }], 'western-electric');
    expect(sut.points.map((p) => p.limitVersion)).toEqual([null, null, null, 3, 3, 3]);
    expect(sut.points[4].limits!.ucl).toBeCloseTo(10.3, 12); // NIST §6.3.2: UCL = centre + 3σ
    const we1 = sut.points[4].flags.find((f) => f.rule === 'we1' && f.chart === 'location');
    expect(we1?.message).toBe('lot 1005 core 1 is above the upper 3σ limit (we1)');
    expect(we1?.description).toBe('one point beyond 3σ');
  });

  it('restarts run rules where the limits change', () => {
    // 8 points above the centre, 4 on trial limits and 4 on a frozen version: no 8-in-a-row.
    const values = [[0.2], [0.3], [0.2], [0.3], [0.2], [0.3], [0.2], [0.3], [-0.5], [-0.4], [0.1], [-0.3]];
    const series = buildSeries(variable({ chartKind: 'i-mr', subgroupSize: null }), lots(values));
    const together = judgeSeries(series, [{ version: 1, frozenAt: day(0), chart: 'i-mr', center: 0, sigma: 1 }], 'western-electric');
    expect(together.points.some((p) => p.flags.some((f) => f.rule === 'we4'))).toBe(true); // WE rule 4, NIST §6.3.2: 8 in a row on one side
    const split = judgeSeries(series, [{ version: 1, frozenAt: day(0), chart: 'i-mr', center: 0, sigma: 1 }, { version: 2, frozenAt: day(4), chart: 'i-mr', center: 0, sigma: 1 }], 'western-electric');
    expect(split.points.some((p) => p.flags.some((f) => f.rule === 'we4'))).toBe(false);
  });

  it('groups points into segments of shared limits, one per run of the same version', () => {
    const series = buildSeries(variable({ chartKind: 'i-mr', subgroupSize: null }), lots([[10], [10.2], [9.9], [10.1], [10.3], [9.8]]));
    const sut = judgeSeries(series, [{ version: 1, frozenAt: day(2), chart: 'i-mr', center: 10, sigma: 0.2 }], 'western-electric');
    expect(sut.segments.map((g) => [g.from, g.to, g.limitVersion])).toEqual([[0, 1, null], [2, 5, 1]]);
    expect(sut.segments[1].limits?.ucl).toBeCloseTo(10.6, 12); // NIST §6.3.2: centre + 3σ
    expect(sut.points.map((p) => p.segment)).toEqual([0, 0, 1, 1, 1, 1]);
    // The first point of a run has no moving range: it would span two sets of limits.
    expect(sut.points[2].dispersion).toBeNull();
    expect(sut.points[3].dispersion).toBeCloseTo(0.2, 12);
  });

  it('says why there are no trial limits when the spread is zero', () => {
    const sut = judgeSeries(buildSeries(variable({ subgroupSize: 2 }), lots([[5, 5], [5, 5]])), [], 'western-electric');
    expect(sut.trial).toBeNull();
    expect(sut.trialNote).toMatch(/zero/);
    expect(sut.points.every((p) => p.limits === null && p.flags.length === 0)).toBe(true);
  });

  it('gives per-lot p chart limits from the pooled fraction', () => {
    const c = variable({ code: 'RUST', kind: 'attribute', layout: 'pass-fail', chartKind: 'p', subgroupSize: null });
    const conf = [[true, false, true, true], [true, true], [true, true, true, true]];
    const sut = judgeSeries(buildSeries(c, lots(conf.map((r) => r.map(() => null)), { conforming: conf })), [], 'western-electric');
    const pBar = 1 / 10;
    expect(sut.trial?.center).toBeCloseTo(pBar, 12); // NIST §6.3.3.2: p̄ = Σ defectives / Σ sizes
    expect(sut.points[1].limits!.ucl).toBeCloseTo(pBar + 3 * Math.sqrt((pBar * (1 - pBar)) / 2), 12); // NIST §6.3.3.2: p̄ + 3√(p̄(1 − p̄)/nᵢ)
  });
});

describe('proposeLimits', () => {
  it('keeps every piston-ring subgroup (in control) and gives the published limits', () => {
    const series = buildSeries(variable(), lots(PISTON_RINGS));
    const sut = proposeLimits(series, series.points.map((_, i) => i), 'western-electric');
    expect(sut.excluded).toEqual([]);
    expect(sut.center).toBeCloseTo(74.001176, 5); // Montgomery Table 6.3: x̿ 74.001
    expect(Math.abs((sut.ucl ?? 0) - 74.014)).toBeLessThan(1e-3); // Montgomery: UCL 74.014
    expect(sut.rangeCenter).toBeCloseTo(0.02324, 5); // Montgomery: R̄ 0.023
    expect(sut.baselineCount).toBe(25);
  });

  it('excludes a subgroup beyond the limits and recomputes (Montgomery §6.2 revised limits)', () => {
    const rows = PISTON_RINGS.slice(0, 12).map((g) => [...g]);
    rows[7] = rows[7].map((v) => v + 0.05);
    const series = buildSeries(variable(), lots(rows));
    const sut = proposeLimits(series, series.points.map((_, i) => i), 'western-electric');
    expect(sut.excluded).toEqual([7]);
    expect(sut.iterations).toBe(2);
    const kept = rows.filter((_, i) => i !== 7).map((g) => g.reduce((a, b) => a + b, 0) / 5);
    expect(sut.center).toBeCloseTo(kept.reduce((a, b) => a + b, 0) / kept.length, 12);
  });

  it('excludes a lot far above p̄ on a p chart', () => {
    const c = variable({ code: 'RUST', kind: 'attribute', layout: 'pass-fail', chartKind: 'p', subgroupSize: null });
    const conf = Array.from({ length: 20 }, (_, i) => Array.from({ length: 50 }, (_, k) => !(k < (i === 12 ? 20 : i % 3))));
    const series = buildSeries(c, lots(conf.map((r) => r.map(() => null)), { conforming: conf }));
    const sut = proposeLimits(series, series.points.map((_, i) => i), 'western-electric');
    expect(sut.excluded).toEqual([12]);
    const d = conf.filter((_, i) => i !== 12).reduce((a, r) => a + r.filter((x) => !x).length, 0);
    expect(sut.center).toBeCloseTo(d / (19 * 50), 12); // NIST §6.3.3.2: p̄ from the kept lots
  });

  it('needs at least 2 subgroups', () => {
    const series = buildSeries(variable(), lots(PISTON_RINGS.slice(0, 3)));
    expect(() => proposeLimits(series, [0], 'western-electric')).toThrow(/at least 2/);
  });
});

describe('driftCapability', () => {
  it('computes Cp with σ within subgroups and warns below 25 subgroups', () => {
    const series = buildSeries(variable(), lots(PISTON_RINGS.slice(0, 10)));
    const j = judgeSeries(series, [], 'western-electric');
    const sut = driftCapability(series, j.points, 73.95, 74.05);
    const groups = PISTON_RINGS.slice(0, 10);
    const rBar = groups.map((g) => Math.max(...g) - Math.min(...g)).reduce((a, b) => a + b, 0) / 10;
    expect(sut.result?.cp).toBeCloseTo(0.1 / (6 * (rBar / 2.325929)), 6); // AIAG SPC manual: Cp = (USL − LSL)/6σ, σ = R̄/d2(5)
    expect(sut.result?.subgroups).toBe(10);
    expect(sut.warnings.join(' ')).toMatch(/Only 10 subgroups/);
  });

  it('warns when the points are not in control and for a one-sided limit', () => {
    const series = buildSeries(variable({ chartKind: 'i-mr', subgroupSize: null }), lots(Array.from({ length: 30 }, (_, i) => [i < 29 ? 10 + (i % 2) * 0.1 : 14])));
    const sut = driftCapability(series, judgeSeries(series, [], 'western-electric').points, null, 15);
    expect(sut.result?.cp).toBeUndefined();
    expect(sut.warnings.join(' ')).toMatch(/Not in control/);
    expect(sut.warnings.join(' ')).toMatch(/One-sided/);
  });
});

describe('histogram', () => {
  it('spans the values and the limits and counts every value once', () => {
    const sut = histogram([1, 2, 2, 3, 9], 0, 10);
    expect(sut[0].from).toBe(0);
    expect(sut[sut.length - 1].to).toBe(10);
    expect(sut.reduce((a, b) => a + b.count, 0)).toBe(5);
    expect(sut).toHaveLength(5);
  });
});

describe('dieWearForecast', () => {
  const burr = variable({ code: 'BURR', layout: 'single', readingsPerSample: 2, subgroupSize: 2, lsl: null, usl: 50 });

  it('counts the lots until the wear line reaches the upper limit', () => {
    // y = 20 + lot ± 0.5 within each core: the line reaches 50 at lot 30, 20 lots after lot 10.
    const rows = Array.from({ length: 10 }, (_, i) => [[20 + (i + 1) - 0.5, 20 + (i + 1) + 0.5]]);
    const sut = dieWearForecast(buildSeries(burr, lots(rows)), 50)!;
    expect(sut.slope).toBeCloseTo(1, 12);
    expect(sut.lotsToLimit).toBeCloseTo(20, 9); // least squares line y = 20 + x meets 50 at x = 30 (Montgomery & Runger ch. 11)
    expect(sut.lotsToLimitLower!).toBeLessThan(20);
    expect(sut.serviceDue).toBe(false);
  });

  it('says "die service due" when the conservative count is below the threshold', () => {
    const rows = Array.from({ length: 10 }, (_, i) => [[44 + 0.5 * i - 0.3, 44 + 0.5 * i + 0.3]]);
    const sut = dieWearForecast(buildSeries(burr, lots(rows)), 50, { serviceLots: 5 })!;
    expect(sut.lotsToLimitLower!).toBeLessThan(5);
    expect(sut.serviceDue).toBe(true);
  });

  it('fits only the most recent lots (a die serviced earlier does not bend the line)', () => {
    const rows = [...Array.from({ length: 5 }, () => [[45, 46]]), ...Array.from({ length: 10 }, (_, i) => [[20 + i - 0.5, 20 + i + 0.5]])];
    const sut = dieWearForecast(buildSeries(burr, lots(rows)), 50, { windowLots: 10 })!;
    expect(sut.firstLotSeq).toBe(6);
    expect(sut.slope).toBeCloseTo(1, 12);
  });

  it('needs measurements from 3 lots', () => {
    expect(dieWearForecast(buildSeries(burr, lots([[[1, 2]], [[2, 3]]])), 50)).toBeNull();
  });
});

describe('fieldsNeeded', () => {
  it('asks the chart query only for what the subgrouping reads', () => {
    expect(fieldsNeeded(variable({ layout: 'single', readingsPerSample: 4, subgroupSize: 4 }))).toEqual({ sampleId: true, value: false, values: true, conforming: false });
    expect(fieldsNeeded(variable({ subgroupSize: 5 }))).toEqual({ sampleId: false, value: true, values: false, conforming: false });
    expect(fieldsNeeded(variable({ chartKind: 'i-mr' }))).toEqual({ sampleId: true, value: true, values: false, conforming: false });
    expect(fieldsNeeded(variable({ kind: 'attribute', chartKind: 'p' }))).toEqual({ sampleId: false, value: false, values: false, conforming: true });
  });
});
