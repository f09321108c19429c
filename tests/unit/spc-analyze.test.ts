import { describe, expect, expectTypeOf, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { analyze, type AnalyzeInput } from '../../shared/compute/spc/analyze';
import { controlConstants } from '../../shared/compute/spc/constants';
import { spcAnalyzeInputSchema, type SpcAnalyzeInput } from '../../shared/schemas/spc';
import { pistonRings } from '../support/datasets';

/** Montgomery, Introduction to Statistical Quality Control, Table 6.3 piston rings (first 10 subgroups). */
const rings = (): number[][] => pistonRings().slice(0, 10);

const NIST_INDIVIDUALS = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];

function makeInput(overrides: Partial<AnalyzeInput> = {}): AnalyzeInput {
  return { chart: 'xbar-r', subgroups: rings(), ...overrides };
}

describe('analyze', () => {
  it('returns an X-bar/R chart with capability', () => {
    const sut = analyze(makeInput({ lsl: 73.95, usl: 74.05 }));
    const groups = rings();
    const means = groups.map((g) => g.reduce((a, b) => a + b, 0) / 5);
    const center = means.reduce((a, b) => a + b, 0) / 10;
    const rBar = groups.map((g) => Math.max(...g) - Math.min(...g)).reduce((a, b) => a + b, 0) / 10;
    const k = controlConstants(5);
    expect(sut.center).toBeCloseTo(center, 12);
    expect(sut.ucl).toBeCloseTo(center + k.A2 * rBar, 12); // NIST §6.3.2.1: x̿ + A2·R̄
    expect(sut.rangeUcl).toBeCloseTo(k.D4 * rBar, 12); // NIST §6.3.2.1: D4·R̄
    expect(sut.dispersion).toBe('range');
    expect(sut.dispersionPoints).toHaveLength(10);
    expect(sut.phase).toBe('I');
    expect(sut.capability?.cp).toBeCloseTo(0.1 / (6 * (rBar / k.d2)), 12); // AIAG SPC: Cp with σ = R̄/d2
    expect(sut.capability?.pp).toBeDefined();
    expect(sut.signals).toEqual([]);
  });

  it('carries the s chart in the range fields for X-bar/s', () => {
    const sut = analyze(makeInput({ chart: 'xbar-s' }));
    expect(sut.dispersion).toBe('s');
    expect(sut.rangeCenter).toBeCloseTo(
      rings()
        .map((g) => {
          const m = g.reduce((a, b) => a + b, 0) / g.length;
          return Math.sqrt(g.reduce((a, b) => a + (b - m) ** 2, 0) / (g.length - 1));
        })
        .reduce((a, b) => a + b, 0) / 10,
      14,
    );
    expect(sut.capability).toBeUndefined();
  });

  it('returns the NIST individuals chart', () => {
    const sut = analyze({ chart: 'i-mr', values: NIST_INDIVIDUALS, rules: 'nelson' });
    expect(sut.center).toBeCloseTo(50.81, 12); // NIST §6.3.2.2: mean 50.81
    expect(sut.rangeCenter).toBeCloseTo(1.8778, 4); // NIST §6.3.2.2: MR̄ 1.8778
    expect(sut.dispersion).toBe('moving-range');
    expect(sut.signals).toEqual([]);
  });

  it('judges against known limits in phase II', () => {
    const sut = analyze({ chart: 'i-mr', values: [10, 10.5, 9.8, 13.4, 10.1], center: 10, sigma: 1 });
    expect(sut.phase).toBe('II');
    expect(sut.ucl).toBe(13);
    expect(sut.signals).toContainEqual(expect.objectContaining({ rule: 'we1', index: 3, chart: 'location' }));
  });

  it('returns per-point limits for a p chart', () => {
    const sut = analyze({ chart: 'p', defectives: [2, 5, 1, 4], sizes: [50, 100, 40, 80] });
    expect(Array.isArray(sut.ucl)).toBe(true);
    const pBar = 12 / 270;
    expect((sut.ucl as number[])[2]).toBeCloseTo(pBar + 3 * Math.sqrt((pBar * (1 - pBar)) / 40), 15); // p̄ + 3√(p̄(1−p̄)/n)
    expect(sut.dispersion).toBeUndefined();
  });

  it('throws ComputeError on inconsistent input', () => {
    expect(() => analyze(makeInput({ center: 74 }))).toThrow('give both center and sigma');
    expect(() => analyze({ chart: 'p', defectives: [1, 2], sizes: [10, 10], usl: 1 })).toThrow('not to a p chart');
    expect(() => analyze({ chart: 'i-mr' })).toThrow('values is required');
    expect(() => analyze(makeInput({ lsl: 75, usl: 74 }))).toThrow('lsl must be below usl');
    expect(() => analyze({ chart: 'c' as 'p' })).toThrow(ComputeError);
  });

  it('takes exactly what the schema produces', () => {
    expectTypeOf<SpcAnalyzeInput>().toEqualTypeOf<AnalyzeInput>();
    const parsed = spcAnalyzeInputSchema.parse({ chart: 'xbar-r', subgroups: rings(), usl: 74.05, lsl: 73.95 });
    expect(analyze(parsed).capability?.cpk).toBeGreaterThan(1);
  });
});
