import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { c4, controlConstants, d2, d3, knownSigmaRangeFactors, sConstants } from '../../shared/compute/spc/constants';

// Exact columns of REFERENCES.md "Control chart constants" (NIST/SEMATECH e-Handbook §6.3.2.1;
// ASTM E2587; ISO 7870-2), values from the d2, d3, c4 integrals to 6 (d2, d3, c4) or 5 decimals.
// n, d2, d3, c4, A2, A3, D3, D4, B3, B4
const TABLE: [number, number, number, number, number, number, number, number, number, number][] = [
  [2, 1.128379, 0.852502, 0.797885, 1.87997, 2.65868, 0, 3.26653, 0, 3.26653],
  [3, 1.692569, 0.888368, 0.886227, 1.02333, 1.95441, 0, 2.57459, 0, 2.56817],
  [4, 2.058751, 0.879808, 0.921318, 0.7286, 1.6281, 0, 2.28205, 0, 2.26605],
  [5, 2.325929, 0.864082, 0.939986, 0.57682, 1.4273, 0, 2.1145, 0, 2.089],
  [6, 2.534413, 0.84804, 0.951533, 0.48325, 1.28713, 0, 2.00383, 0.03036, 1.96964],
  [7, 2.704357, 0.833205, 0.959369, 0.41928, 1.18192, 0.07571, 1.92429, 0.11769, 1.88231],
  [8, 2.847201, 0.819831, 0.96503, 0.37253, 1.0991, 0.13617, 1.86383, 0.18509, 1.81491],
  [9, 2.970026, 0.807834, 0.969311, 0.3367, 1.03166, 0.18401, 1.81599, 0.23913, 1.76087],
  [10, 3.077505, 0.797051, 0.972659, 0.30826, 0.97535, 0.22302, 1.77698, 0.28371, 1.71629],
];

function expectNear(actual: number, expected: number, tol: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol);
}

describe('controlConstants', () => {
  it.each(TABLE)('n = %i matches the exact reference columns', (n, d2v, d3v, c4v, A2, A3, D3, D4, B3, B4) => {
    const sut = controlConstants(n);
    expectNear(sut.d2, d2v, 6e-7); // NIST §6.3.2.1 / ASTM E2587 d2, 6 decimals
    expectNear(sut.d3, d3v, 6e-7); // NIST §6.3.2.1 / ASTM E2587 d3, 6 decimals
    expectNear(sut.c4, c4v, 6e-7); // NIST §6.3.2.1 / ASTM E2587 c4, 6 decimals
    expectNear(sut.A2, A2, 6e-6); // ASTM E2587 A2, 5 decimals
    expectNear(sut.A3, A3, 6e-6); // ASTM E2587 A3, 5 decimals
    expectNear(sut.D3, D3, 6e-6); // ASTM E2587 D3, 5 decimals
    expectNear(sut.D4, D4, 6e-6); // ASTM E2587 D4, 5 decimals
    expectNear(sut.B3, B3, 6e-6); // ASTM E2587 B3, 5 decimals
    expectNear(sut.B4, B4, 6e-6); // ASTM E2587 B4, 5 decimals
  });

  it('clips D3 and B3 at zero for small subgroups', () => {
    for (let n = 2; n <= 6; n++) expect(controlConstants(n).D3).toBe(0); // NIST §6.3.2.1: D3 = 0 for n ≤ 6
    for (let n = 2; n <= 5; n++) expect(controlConstants(n).B3).toBe(0); // NIST §6.3.2.1: B3 = 0 for n ≤ 5
    expect(controlConstants(7).D3).toBeGreaterThan(0);
    expect(controlConstants(6).B3).toBeGreaterThan(0);
  });

  it('agrees with printed three-decimal tables', () => {
    expectNear(c4(10), 0.9727, 5e-5); // NIST e-Handbook §6.3.2.1: c4(10) = 0.9727
    expectNear(controlConstants(5).A2, 0.577, 1.5e-3); // three-decimal tables: A2(5) = 0.577
    // Tables print D4(3) as 2.574 or 2.575; the exact value lies between them.
    expectNear(controlConstants(3).D4, 2.574, 1.5e-3); // three-decimal tables: D4(3) = 2.574
    expectNear(controlConstants(3).D4, 2.575, 1.5e-3); // three-decimal tables: D4(3) = 2.575
    expectNear(controlConstants(5).D4, 2.114, 1.5e-3); // three-decimal tables: D4(5) = 2.114
    expectNear(controlConstants(10).D3, 0.223, 1.5e-3); // three-decimal tables: D3(10) = 0.223
  });

  it('reproduces the closed forms for n = 2 and 3', () => {
    // Range of two normals is |X1 − X2| with X1 − X2 ~ N(0, 2): E = 2/√π, E[R²] = 2.
    expectNear(d2(2), 2 / Math.sqrt(Math.PI), 1e-12); // exact: d2(2) = 2/√π
    expectNear(d3(2), Math.sqrt(2 - 4 / Math.PI), 1e-12); // exact: d3(2) = √(2 − 4/π)
    expectNear(d2(3), 3 / Math.sqrt(Math.PI), 1e-12); // exact: d2(3) = 3/√π
    expectNear(c4(2), Math.sqrt(2 / Math.PI), 1e-14); // exact: c4(2) = √(2/π)
    expectNear(c4(3), Math.sqrt(Math.PI) / 2, 1e-14); // exact: c4(3) = √π/2
  });

  it('extends to n = 25', () => {
    // Three-decimal d2 for n = 11..25 as printed in ASTM E2587 / Montgomery App. VI (memory).
    const d2Printed: Record<number, number> = {
      11: 3.173, 12: 3.258, 13: 3.336, 14: 3.407, 15: 3.472, 16: 3.532, 17: 3.588, 18: 3.64,
      19: 3.689, 20: 3.735, 21: 3.778, 22: 3.819, 23: 3.858, 24: 3.895, 25: 3.931,
    };
    for (const [n, v] of Object.entries(d2Printed)) expectNear(d2(Number(n)), v, 1.5e-3); // printed d2 (memory)
    expectNear(d3(25), 0.708, 1.5e-3); // printed d3(25) (memory)
    expectNear(c4(25), 0.9896, 5e-5); // printed c4(25) (memory)
    // d2 grows and d3 shrinks with n past n = 3.
    for (let n = 3; n < 25; n++) {
      expect(d2(n + 1)).toBeGreaterThan(d2(n));
      expect(d3(n + 1)).toBeLessThan(d3(n));
    }
  });

  it('computes c4 for any subgroup size', () => {
    // Common practice approximation c4 ≈ 4(n − 1)/(4n − 3), error about 1/(32n²).
    expectNear(c4(100), 396 / 397, 1e-5);
    expectNear(sConstants(100).B4, 1 + (3 * Math.sqrt(1 - c4(100) ** 2)) / c4(100), 1e-14);
  });

  it('gives known-σ factors consistent with the R-bar factors', () => {
    // D4·R̄ = D2·σ̂ when σ̂ = R̄/d2, and B4·s̄ = B6·σ̂ when σ̂ = s̄/c4.
    for (let n = 2; n <= 10; n++) {
      const k = controlConstants(n);
      expectNear(knownSigmaRangeFactors(n).D2, k.D4 * k.d2, 1e-12);
      expectNear(knownSigmaRangeFactors(n).D1, k.D3 * k.d2, 1e-12);
      expectNear(sConstants(n).B6, k.B4 * k.c4, 1e-12);
      expectNear(sConstants(n).B5, k.B3 * k.c4, 1e-12);
    }
  });

  it('refuses subgroup sizes it has no constants for', () => {
    expect(() => d2(1)).toThrow(ComputeError);
    expect(() => d2(26)).toThrow('from 2 to 25');
    expect(() => c4(2.5)).toThrow('whole number');
    expect(() => controlConstants(0)).toThrow(ComputeError);
  });
});
