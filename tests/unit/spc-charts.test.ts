import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { chartSignals, individualsMR, pChart, phaseOneLimits, xbarR, xbarS } from '../../shared/compute/spc/charts';
import { controlConstants } from '../../shared/compute/spc/constants';
import { pistonRings } from '../support/datasets';

/** NIST/SEMATECH e-Handbook §6.3.2.2 individuals example. */
const NIST_INDIVIDUALS = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];

function expectNear(actual: number, expected: number, tol: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol);
}

describe('xbarR', () => {
  it('reproduces Montgomery’s piston-ring X-bar and R chart', () => {
    const sut = xbarR(pistonRings());
    expectNear(sut.center, 74.001176, 5e-7); // Montgomery Table 6.3, grand mean unrounded 74.001176
    expectNear(sut.center, 74.001, 5e-4); // Montgomery: x̿ = 74.001
    expectNear(sut.rangeCenter, 0.02324, 5e-7); // Montgomery Table 6.3, R̄ unrounded 0.023240
    expectNear(sut.rangeCenter, 0.023, 5e-4); // Montgomery: R̄ = 0.023
    // Montgomery rounds x̿ and R̄ before applying A2 = 0.577, so the published limits are
    // within 1e-3 of the unrounded ones (74.01458, 73.98777).
    expectNear(sut.ucl, 74.014, 1e-3); // Montgomery: X-bar UCL 74.014
    expectNear(sut.lcl, 73.988, 1e-3); // Montgomery: X-bar LCL 73.988
    expectNear(sut.rangeUcl, 0.049, 5e-4); // Montgomery: R chart UCL = 2.114 × 0.023 = 0.049 (memory)
    expect(sut.rangeLcl).toBe(0); // Montgomery: D3 = 0 for n = 5
    expect(sut.subgroupSize).toBe(5);
    expect(sut.points).toHaveLength(25);
    expectNear(sut.points[0], (74.03 + 74.002 + 74.019 + 73.992 + 74.008) / 5, 1e-12);
    expectNear(sut.ranges[13], 74.006 - 73.967, 1e-12);
  });

  it('relates σ within and σ of the plotted mean', () => {
    const sut = xbarR(pistonRings());
    const k = controlConstants(5);
    expectNear(sut.sigmaWithin, sut.rangeCenter / k.d2, 1e-15);
    expectNear(sut.sigma, sut.sigmaWithin / Math.sqrt(5), 1e-15);
    expectNear(sut.ucl - sut.center, 3 * sut.sigma, 1e-12);
  });

  it('judges against known centre and σ in phase II', () => {
    const sut = xbarR(pistonRings(), { known: { center: 74, sigma: 0.01 } });
    const k = controlConstants(5);
    expectNear(sut.ucl, 74 + (3 * 0.01) / Math.sqrt(5), 1e-12); // Montgomery §6.2: μ ± 3σ/√n for known σ
    expectNear(sut.rangeCenter, k.d2 * 0.01, 1e-15); // Montgomery: R chart centre d2σ
    expectNear(sut.rangeUcl, (k.d2 + 3 * k.d3) * 0.01, 1e-15); // Montgomery: D2σ
    expect(sut.rangeLcl).toBe(0); // D1 = 0 for n = 5
    expect(sut.sigmaWithin).toBe(0.01);
  });

  it('gives the phase I limits again when fed its own estimates as known values', () => {
    const one = xbarR(pistonRings());
    const two = xbarR(pistonRings(), { known: { center: one.center, sigma: one.sigmaWithin } });
    expectNear(two.ucl, one.ucl, 1e-12);
    expectNear(two.rangeUcl, one.rangeUcl, 1e-12);
    expectNear(two.rangeCenter, one.rangeCenter, 1e-12);
  });

  it('refuses bad subgroups with clear messages', () => {
    expect(() => xbarR([[1, 2, 3], [1, 2]])).toThrow('subgroup 2 has 2 measurements but subgroup 1 has 3');
    expect(() => xbarR([[1, 2, 3]])).toThrow('needs at least 2 subgroups (got 1)');
    expect(() => xbarR([[1], [2]])).toThrow('needs 2 to 10 per subgroup');
    expect(() => xbarR([rep(11), rep(11)])).toThrow('use X-bar/s for larger subgroups');
    expect(() => xbarR([[1, Number.NaN], [1, 2]])).toThrow('subgroup 1, measurement 2 is not a finite number');
    expect(() => xbarR([[1, Infinity], [1, 2]])).toThrow(ComputeError);
    expect(() => xbarR([[1, 1], [2, 2]])).toThrow('every subgroup range is zero');
    expect(() => xbarR(pistonRings(), { known: { center: 74, sigma: 0 } })).toThrow('known sigma must be a finite number above 0');
    expect(() => xbarR('x' as unknown as number[][])).toThrow('subgroups must be a list');
  });

  it('accepts a single subgroup when judging against known limits', () => {
    expect(xbarR([[1, 2, 3]], { known: { center: 2, sigma: 1 } }).points).toEqual([2]);
  });
});

function rep(n: number): number[] {
  return Array.from({ length: n }, (_, i) => i);
}

describe('xbarS', () => {
  it('reproduces Montgomery’s piston-ring s̄', () => {
    const sut = xbarS(pistonRings());
    expectNear(sut.sCenter, 0.0094, 5e-5); // Montgomery: s̄ = 0.0094
    expectNear(sut.sUcl, 0.0196, 5e-5); // Montgomery: s chart UCL = B4 s̄ = 0.0196 (memory)
    expect(sut.sLcl).toBe(0); // B3 = 0 for n = 5
    // Montgomery: X-bar limits from s̄ agree with those from R̄ at 3 decimals (74.014, 73.988).
    expectNear(sut.ucl, 74.014, 1e-3); // Montgomery: X-bar/s UCL 74.014 (memory)
    expectNear(sut.lcl, 73.988, 1e-3); // Montgomery: X-bar/s LCL 73.988 (memory)
    expectNear(sut.sigmaWithin, sut.sCenter / controlConstants(5).c4, 1e-15);
  });

  it('accepts subgroups larger than 10 and refuses ragged ones', () => {
    const big = [rep(12), rep(12).map((v) => v * 1.1)];
    expect(xbarS(big).subgroupSize).toBe(12);
    expect(() => xbarS([[1, 2, 3], [1, 2, 3, 4]])).toThrow('needs equal subgroup sizes');
    expect(() => xbarS([[1, 2]])).toThrow('at least 2 subgroups');
  });
});

describe('individualsMR', () => {
  it('reproduces the NIST e-Handbook §6.3.2.2 individuals chart', () => {
    const sut = individualsMR(NIST_INDIVIDUALS);
    expectNear(sut.center, 50.81, 1e-12); // NIST §6.3.2.2: mean 50.81
    expectNear(sut.mrCenter, 1.8778, 5e-5); // NIST §6.3.2.2: MR̄ 1.8778
    // NIST uses d2 = 1.128; the exact 2/√π = 1.128379 moves the limits by 0.0017.
    expectNear(sut.ucl, 55.8041, 2e-3); // NIST §6.3.2.2: UCL 55.8041
    expectNear(sut.lcl, 45.8159, 2e-3); // NIST §6.3.2.2: LCL 45.8159
    expectNear(sut.center + (3 * sut.mrCenter) / 1.128, 55.8041, 1e-4); // NIST §6.3.2.2 with its d2 = 1.128
    expectNear(sut.center - (3 * sut.mrCenter) / 1.128, 45.8159, 1e-4); // NIST §6.3.2.2 with its d2 = 1.128
    expectNear(sut.mrUcl, controlConstants(2).D4 * sut.mrCenter, 1e-12); // MR chart UCL = D4(2)·MR̄
    expect(sut.mrLcl).toBe(0);
    expect(sut.movingRanges).toHaveLength(9);
    expectNear(sut.movingRanges[3], 3.5, 1e-12);
  });

  it('refuses too few values and constant data', () => {
    expect(() => individualsMR([1])).toThrow('at least 2 values (got 1)');
    expect(() => individualsMR([4, 4, 4])).toThrow('every moving range is zero');
    expect(() => individualsMR([4, Number.NaN])).toThrow('not a finite number');
  });
});

describe('pChart', () => {
  it('draws p̄ ± 3√(p̄(1 − p̄)/nᵢ) per point, checked by integer arithmetic', () => {
    const defectives = [2, 5, 1, 4, 0];
    const sizes = [50, 100, 40, 80, 50];
    const sut = pChart(defectives, sizes);
    // Second way: with D = Σd and N = Σn, p̄(1 − p̄)/nᵢ = D(N − D)/(N²·nᵢ).
    const D = 12;
    const N = 320;
    expect(sut.center).toBe(D / N);
    for (let i = 0; i < sizes.length; i++) {
      const half = 3 * Math.sqrt((D * (N - D)) / (N * N * sizes[i]));
      expectNear(sut.ucl[i], D / N + half, 1e-15); // Montgomery §7.2 / NIST §6.3.3.2 (memory): p̄ + 3√(p̄(1−p̄)/nᵢ)
      expectNear(sut.lcl[i], Math.max(0, D / N - half), 1e-15); // same source; LCL clipped at 0
      expectNear(sut.sigma[i], half / 3, 1e-15);
      expect(sut.points[i]).toBe(defectives[i] / sizes[i]);
    }
    expect(sut.lcl.every((l) => l === 0)).toBe(true);
  });

  it('uses p₀ in phase II and flags a high proportion', () => {
    const sut = pChart([1, 9], [100, 100], { known: { center: 0.02 } });
    expect(sut.center).toBe(0.02);
    expectNear(sut.ucl[0], 0.02 + 3 * Math.sqrt((0.02 * 0.98) / 100), 1e-15);
    expect(chartSignals(sut).map((s) => [s.rule, s.index])).toEqual([['we1', 1]]);
  });

  it('refuses impossible counts', () => {
    expect(() => pChart([3, 12], [10, 10])).toThrow('sample 2: 12 defectives is more than the sample size of 10');
    expect(() => pChart([-1, 2], [10, 10])).toThrow('sample 1: defectives must be a whole number of at least 0');
    expect(() => pChart([1, 2], [10, 0])).toThrow('sample 2: the sample size must be a whole number of at least 1');
    expect(() => pChart([1.5, 2], [10, 10])).toThrow('whole number');
    expect(() => pChart([1, 2, 3], [10, 10])).toThrow('defectives has 3 entries but sizes has 2');
    expect(() => pChart([1], [10])).toThrow('at least 2 samples');
    expect(() => pChart([1, 2], [10, 10], { known: { center: 1.5 } })).toThrow('between 0 and 1');
  });
});

describe('chartSignals', () => {
  it('finds nothing in Montgomery’s in-control piston rings', () => {
    // Montgomery concludes the 25 samples show no out-of-control points (memory).
    expect(chartSignals(xbarR(pistonRings())).filter((s) => s.rule === 'we1')).toEqual([]);
  });

  it('reports a range beyond its limit on the dispersion chart', () => {
    const groups = pistonRings();
    groups[4] = [73.95, 74.05, 74.0, 74.0, 74.0]; // mean 74.0, range 0.1
    const sut = chartSignals(xbarR(groups));
    expect(sut).toContainEqual(expect.objectContaining({ rule: 'we1', index: 4, chart: 'dispersion' }));
    expect(sut.filter((s) => s.chart === 'location' && s.index === 4)).toEqual([]);
  });

  it('places a moving-range signal at the later point', () => {
    const sut = chartSignals(individualsMR([10, 10.1, 9.9, 10, 10.1, 9.9, 10, 12, 10, 10.1]));
    expect(sut.filter((s) => s.chart === 'dispersion').map((s) => s.index)).toEqual([7, 8]);
  });
});

describe('phaseOneLimits', () => {
  it('keeps everything when nothing is out (Montgomery piston rings)', () => {
    const sut = phaseOneLimits(pistonRings(), 'xbar-r');
    expect(sut.excluded).toEqual([]);
    expect(sut.iterations).toBe(1);
    expectNear(sut.chart.ucl, xbarR(pistonRings()).ucl, 1e-12);
  });

  it('removes subgroups beyond the limits, recomputes, and repeats until stable', () => {
    const groups = pistonRings();
    groups[3] = groups[3].map((v) => v + 0.03); // shifted mean
    groups[17] = [73.95, 74.05, 74.0, 74.0, 74.0]; // wide range
    const sut = phaseOneLimits(groups, 'xbar-r', 'nelson');
    expect(sut.excluded).toEqual([3, 17]);
    expect(sut.iterations).toBeGreaterThanOrEqual(2);
    const kept = groups.filter((_, i) => i !== 3 && i !== 17);
    const expected = xbarR(kept);
    expectNear(sut.center, expected.center, 1e-12);
    expectNear(sut.sigmaWithin, expected.sigmaWithin, 1e-12);
    expectNear(sut.chart.ucl, expected.ucl, 1e-12);
    expectNear(sut.chart.rangeUcl, expected.rangeUcl, 1e-12);
    // Every subgroup is judged against the revised limits; the excluded ones still show.
    expect(sut.chart.points).toHaveLength(25);
    expect(sut.signals).toContainEqual(expect.objectContaining({ rule: 'nelson1', index: 3, chart: 'location' }));
    expect(sut.signals).toContainEqual(expect.objectContaining({ rule: 'nelson1', index: 17, chart: 'dispersion' }));
  });

  it('works for X-bar/s', () => {
    const groups = pistonRings();
    groups[9] = groups[9].map((v) => v - 0.03);
    const sut = phaseOneLimits(groups, 'xbar-s');
    expect(sut.excluded).toEqual([9]);
    expectNear(sut.chart.sUcl, xbarS(groups.filter((_, i) => i !== 9)).sUcl, 1e-12);
  });

  it('for individuals, drops the outlier and the moving ranges that touch it', () => {
    const values = [...NIST_INDIVIDUALS, 70, ...NIST_INDIVIDUALS];
    const sut = phaseOneLimits(values.map((v) => [v]), 'i-mr');
    expect(sut.excluded).toEqual([10]);
    const mrs: number[] = [];
    for (let i = 1; i < values.length; i++) if (i !== 10 && i !== 11) mrs.push(Math.abs(values[i] - values[i - 1]));
    const mrBar = mrs.reduce((a, b) => a + b, 0) / mrs.length;
    expectNear(sut.sigmaWithin, mrBar / controlConstants(2).d2, 1e-12); // σ = MR̄/d2(2) over kept pairs
    expectNear(sut.center, 50.81, 1e-12); // the two NIST copies have mean 50.81 (NIST §6.3.2.2)
  });

  it('refuses when too little is left or the chart is unknown', () => {
    expect(() => phaseOneLimits([[0, 0.001], [10, 10.001]], 'xbar-r')).toThrow('left 0');
    expect(() => phaseOneLimits([[1, 2], [3]], 'i-mr')).toThrow('exactly one value');
    expect(() => phaseOneLimits(pistonRings(), 'p' as 'xbar-r')).toThrow('not "p"');
  });
});
