// @ts-expect-error jstat ships no type declarations; it is used only as an independent reference
import jstatModule from 'jstat';
import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { capability, capabilityIndices, expectedPpm } from '../../shared/compute/spc/capability';
import { controlConstants } from '../../shared/compute/spc/constants';
import { pistonRings } from '../support/datasets';

const jStat = jstatModule as { normal: { cdf(x: number, m: number, s: number): number } };

function expectNear(actual: number | undefined, expected: number, tol: number): void {
  expect(actual).toBeDefined();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(tol);
}

// Montgomery, Introduction to Statistical Quality Control, Table 6.3 piston rings (25 × 5, mm).
const rings = pistonRings;

describe('capabilityIndices', () => {
  it('reproduces NIST e-Handbook §6.1.6', () => {
    const sut = capabilityIndices({ lsl: 8, usl: 20, mean: 16, sigma: 2 });
    expectNear(sut.cp, 1.0, 1e-12); // NIST §6.1.6: Cp = (20 − 8)/(6·2) = 1.0
    expectNear(sut.cpk, 0.6667, 5e-5); // NIST §6.1.6: Cpk = 0.6667
    expectNear(sut.cpu, 4 / 6, 1e-12); // NIST §6.1.6: Cpu = (20 − 16)/(3·2)
    expectNear(sut.cpl, 8 / 6, 1e-12); // NIST §6.1.6: Cpl = (16 − 8)/(3·2)
  });

  it('gives only the one-sided index for a single limit', () => {
    const upper = capabilityIndices({ usl: 20, mean: 16, sigma: 2 });
    expect(upper.cp).toBeUndefined();
    expect(upper.cpl).toBeUndefined();
    expectNear(upper.cpk, 4 / 6, 1e-12); // AIAG SPC: Cpk = Cpu with only USL
    const lower = capabilityIndices({ lsl: 8, mean: 16, sigma: 2 });
    expectNear(lower.cpk, 8 / 6, 1e-12); // AIAG SPC: Cpk = Cpl with only LSL
  });

  it('refuses impossible limits with a clear message', () => {
    expect(() => capabilityIndices({ lsl: 20, usl: 8, mean: 16, sigma: 2 })).toThrow('lsl must be below usl');
    expect(() => capabilityIndices({ lsl: 8, usl: 8, mean: 8, sigma: 2 })).toThrow('lsl must be below usl');
    expect(() => capabilityIndices({ mean: 16, sigma: 2 })).toThrow('at least one specification limit');
    expect(() => capabilityIndices({ usl: 20, mean: 16, sigma: 0 })).toThrow('spread is zero');
  });
});

describe('expectedPpm', () => {
  it('links a centred Cp to ppm out of specification', () => {
    expect(Math.round(expectedPpm({ lsl: -3, usl: 3, mean: 0, sigma: 1 }).total)).toBe(2700); // REFERENCES: Cp 1.0 ↔ 2700 ppm
    expect(Math.round(expectedPpm({ lsl: -3.99, usl: 3.99, mean: 0, sigma: 1 }).total)).toBe(66); // REFERENCES: Cp 1.33 ↔ 66 ppm
  });

  it('agrees with jstat normal.cdf on each tail', () => {
    const sut = expectedPpm({ lsl: 9.5, usl: 10.8, mean: 10.2, sigma: 0.2 });
    expectNear(sut.below, 1e6 * jStat.normal.cdf(9.5, 10.2, 0.2), 1e-6); // jstat normal.cdf
    expectNear(sut.above, 1e6 * (1 - jStat.normal.cdf(10.8, 10.2, 0.2)), 1e-6); // jstat normal.cdf
    expectNear(sut.total, sut.below + sut.above, 1e-12);
    expect(expectedPpm({ usl: 10.8, mean: 10.2, sigma: 0.2 }).below).toBe(0);
  });
});

describe('capability', () => {
  it('reproduces Montgomery’s piston-ring Cp', () => {
    const sut = capability({ subgroups: rings(), lsl: 73.95, usl: 74.05 });
    expect(sut.sigmaWithinMethod).toBe('rbar-d2');
    expectNear(sut.sigmaWithin, 0.02324 / controlConstants(5).d2, 1e-12);
    // Montgomery rounds σ̂ = R̄/d2 to 0.0099 and prints Cp = 1.68; unrounded it is 1.668.
    expectNear(sut.cp, 1.68, 0.015); // Montgomery: Cp = 1.68 for 74.000 ± 0.05
    expectNear(capabilityIndices({ lsl: 73.95, usl: 74.05, mean: 74.001, sigma: 0.0099 }).cp, 1.68, 5e-3); // Montgomery with σ̂ = 0.0099
    expect(sut.n).toBe(125);
    expectNear(sut.mean, 74.001176, 5e-7); // Montgomery Table 6.3 grand mean
  });

  it('computes Pp and Ppk from the overall sample standard deviation', () => {
    const groups = rings();
    const sut = capability({ subgroups: groups, lsl: 73.95, usl: 74.05 });
    // Second way: σ overall from Σx and Σx² on values shifted by 74 (small numbers, exact enough).
    const xs = groups.flat().map((v) => v - 74);
    const n = xs.length;
    const s1 = xs.reduce((a, b) => a + b, 0);
    const s2 = xs.reduce((a, b) => a + b * b, 0);
    const s = Math.sqrt((s2 - (s1 * s1) / n) / (n - 1));
    expectNear(sut.sigmaOverall, s, 1e-12);
    expectNear(sut.pp, 0.1 / (6 * s), 1e-9); // AIAG SPC: Pp = (USL − LSL)/6s
    expectNear(sut.ppk, Math.min(74.05 - sut.mean, sut.mean - 73.95) / (3 * s), 1e-9); // AIAG SPC: Ppk
  });

  it('uses MR̄/d2 for individual values and honours a given σ', () => {
    const values = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];
    const sut = capability({ values, usl: 60 });
    expect(sut.sigmaWithinMethod).toBe('mrbar-d2');
    expectNear(sut.sigmaWithin, 16.9 / 9 / controlConstants(2).d2, 1e-12); // NIST §6.3.2.2: MR̄ = 1.8778
    expect(sut.cp).toBeUndefined();
    expect(sut.pp).toBeUndefined();
    expectNear(sut.cpk, (60 - 50.81) / (3 * sut.sigmaWithin), 1e-12);
    expect(capability({ values, usl: 60, sigmaWithin: 2 }).sigmaWithin).toBe(2);
  });

  it('uses s̄/c4 for subgroups larger than 10', () => {
    const groups = [
      [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11],
      [2, 2, 3, 5, 5, 6, 7, 8, 9, 12, 11],
    ];
    expect(capability({ subgroups: groups, usl: 30 }).sigmaWithinMethod).toBe('sbar-c4');
  });

  it('refuses bad input', () => {
    expect(() => capability({ values: [1, 2, 3], lsl: 5, usl: 4 })).toThrow('lsl must be below usl');
    expect(() => capability({ values: [1, 2, 3] })).toThrow('at least one specification limit');
    expect(() => capability({ values: [1, 2], subgroups: [[1, 2]], usl: 3 })).toThrow('either values or subgroups');
    expect(() => capability({ values: [2, 2, 2], usl: 3 })).toThrow(ComputeError);
    expect(() => capability({ subgroups: [[1, 2], [1, 2, 3]], usl: 3 })).toThrow('same size');
  });
});
