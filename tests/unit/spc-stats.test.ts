// @ts-expect-error jstat ships no type declarations; it is used only as an independent reference
import jstatModule from 'jstat';
import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  erfc,
  lnGamma,
  linearRegression,
  mean,
  normalCdf,
  normalQuantile,
  normalUpperTail,
  predictionInterval,
  sampleSd,
  sampleVariance,
  studentTCdf,
  studentTQuantile,
  upperPredictionBound,
} from '../../shared/compute/spc/stats';

interface JStat {
  studentt: { inv(p: number, df: number): number; cdf(t: number, df: number): number };
  normal: { cdf(x: number, m: number, s: number): number; inv(p: number, m: number, s: number): number };
  gammaln(x: number): number;
}
const jStat = jstatModule as JStat;

/** |actual − expected| ≤ tol·|expected| */
function expectRelative(actual: number, expected: number, tol: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tol * Math.abs(expected));
}

/** NIST StRD NumAcc datasets are defined by construction: a first value, then 500 low/high pairs. */
function numAcc(first: number, low: number, high: number): number[] {
  const v = [first];
  for (let i = 0; i < 500; i++) v.push(low, high);
  return v;
}

/** One-pass Σx² formula, kept here to show the NumAcc4 test really discriminates. */
function onePassSd(v: number[]): number {
  let s = 0;
  let s2 = 0;
  for (const x of v) {
    s += x;
    s2 += x * x;
  }
  return Math.sqrt(Math.max(0, (s2 - (s * s) / v.length) / (v.length - 1)));
}

// NIST StRD univariate "Michelso" (Michelson's speed of light, km/s − 299000 scaled), n = 100.
const MICHELSO = [
  299.85, 299.74, 299.9, 300.07, 299.93, 299.85, 299.95, 299.98, 299.98, 299.88, 300.0, 299.98, 299.93, 299.65, 299.76,
  299.81, 300.0, 300.0, 299.96, 299.96, 299.96, 299.94, 299.96, 299.94, 299.88, 299.8, 299.85, 299.88, 299.9, 299.84,
  299.83, 299.79, 299.81, 299.88, 299.88, 299.83, 299.8, 299.79, 299.76, 299.8, 299.88, 299.88, 299.88, 299.86, 299.72,
  299.72, 299.62, 299.86, 299.97, 299.95, 299.88, 299.91, 299.85, 299.87, 299.84, 299.84, 299.85, 299.84, 299.84, 299.84,
  299.89, 299.81, 299.81, 299.82, 299.8, 299.77, 299.76, 299.74, 299.75, 299.76, 299.91, 299.92, 299.89, 299.86, 299.88,
  299.72, 299.84, 299.85, 299.85, 299.78, 299.89, 299.84, 299.78, 299.81, 299.76, 299.81, 299.79, 299.81, 299.82, 299.85,
  299.87, 299.87, 299.81, 299.74, 299.81, 299.94, 299.95, 299.8, 299.81, 299.87,
];

// NIST StRD linear least squares "Norris" (calibration of ozone monitors), n = 36.
const NORRIS_X = [
  0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0, 447.5, 11.6,
  556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3, 229.2, 669.1, 448.9, 0.5,
];
const NORRIS_Y = [
  0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3, 448.9, 10.8,
  557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6, 228.9, 668.4, 449.2, 0.2,
];

describe('mean and sampleSd', () => {
  it('match NIST StRD NumAcc1', () => {
    const sut = [10000001, 10000003, 10000002];
    expect(mean(sut)).toBe(10000002); // NIST StRD NumAcc1 certified mean
    expect(sampleSd(sut)).toBe(1); // NIST StRD NumAcc1 certified sd
  });

  it('match NIST StRD NumAcc2', () => {
    const sut = numAcc(1.2, 1.1, 1.3);
    expect(sut).toHaveLength(1001);
    expectRelative(mean(sut), 1.2, 1e-15); // NIST StRD NumAcc2 certified mean
    expectRelative(sampleSd(sut), 0.1, 1e-13); // NIST StRD NumAcc2 certified sd
  });

  it('match NIST StRD NumAcc3', () => {
    const sut = numAcc(1000000.2, 1000000.1, 1000000.3);
    expectRelative(mean(sut), 1000000.2, 1e-15); // NIST StRD NumAcc3 certified mean
    // The inputs themselves carry ~1e-10 binary rounding, which bounds what any method can reach.
    expectRelative(sampleSd(sut), 0.1, 1e-8); // NIST StRD NumAcc3 certified sd
  });

  it('match NIST StRD NumAcc4, which a one-pass formula fails', () => {
    const sut = numAcc(10000000.2, 10000000.1, 10000000.3);
    expectRelative(mean(sut), 10000000.2, 1e-15); // NIST StRD NumAcc4 certified mean
    expectRelative(sampleSd(sut), 0.1, 1e-7); // NIST StRD NumAcc4 certified sd
    expect(Math.abs(onePassSd(sut) - 0.1)).toBeGreaterThan(1e-3);
  });

  it('match NIST StRD Michelso', () => {
    expect(MICHELSO).toHaveLength(100);
    expectRelative(mean(MICHELSO), 299.8524, 1e-15); // NIST StRD Michelso certified mean 299.852400000000
    expectRelative(sampleSd(MICHELSO), 0.0790105478190518, 1e-12); // NIST StRD Michelso certified sd
  });

  it('use the n − 1 divisor', () => {
    expect(sampleVariance([1, 2, 3, 4])).toBeCloseTo(5 / 3, 15);
  });

  it('refuse too few or non-finite values', () => {
    expect(() => mean([])).toThrow(ComputeError);
    expect(() => sampleSd([1])).toThrow('at least 2 values');
    expect(() => mean([1, Number.NaN])).toThrow('value 2 is not a finite number');
    expect(() => sampleSd([1, Infinity])).toThrow(ComputeError);
  });
});

describe('lnGamma', () => {
  it('matches exact values', () => {
    expect(lnGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 14); // Γ(½) = √π
    expect(lnGamma(1)).toBeCloseTo(0, 14); // Γ(1) = 1
    expect(lnGamma(5)).toBeCloseTo(Math.log(24), 14); // Γ(5) = 4!
    expect(lnGamma(10)).toBeCloseTo(Math.log(362880), 13); // Γ(10) = 9!
    expect(lnGamma(101)).toBeCloseTo(363.73937555556347, 10); // ln 100! (memory), also jstat below
  });

  it('agrees with jstat gammaln', () => {
    for (const x of [0.1, 0.3, 1.5, 2.5, 7.25, 14.9, 15.1, 33.3, 120]) {
      expectRelative(lnGamma(x), jStat.gammaln(x), 1e-12); // jstat gammaln (independent implementation)
    }
  });
});

describe('normalCdf and erfc', () => {
  it('agree with jstat normal.cdf', () => {
    // Beyond |z| = 5 jstat itself loses digits (1e-8 relative at 6), so the tail is checked below.
    for (let z = -5; z <= 5; z += 0.25) {
      const ref = jStat.normal.cdf(z, 0, 1);
      expectRelative(normalCdf(z), ref, 1e-9); // jstat normal.cdf
      expectRelative(normalUpperTail(z), jStat.normal.cdf(-z, 0, 1), 1e-9); // jstat normal.cdf, by symmetry
    }
  });

  it('match published values', () => {
    expectRelative(normalCdf(-3), 0.00134989803163009, 1e-12); // Abramowitz & Stegun Table 26.1 (memory): Q(3) = 1.3498980316301e-3
    expectRelative(normalCdf(1.96), 0.9750021048517795, 1e-14); // A&S Table 26.1 (memory)
    expect(erfc(0)).toBe(1);
    expectRelative(erfc(1), 0.15729920705028513, 1e-14); // A&S Table 7.1 (memory): erfc(1) = 0.157299207050285
    expectRelative(erfc(-1), 2 - 0.15729920705028513, 1e-15);
  });

  it('keeps relative accuracy in the far tail', () => {
    // Q(8) = 6.22096057427178e-16 (memory); 1 − Φ(8) computed naively would be 0 or 1e-16.
    expectRelative(normalUpperTail(8), 6.22096057427178e-16, 1e-12);
    expectRelative(normalCdf(-6), 9.86587645037698e-10, 1e-12); // Q(6) (memory)
  });
});

describe('normalQuantile', () => {
  it('agrees with jstat normal.inv and inverts normalCdf', () => {
    for (const p of [1e-6, 0.001, 0.01, 0.025, 0.1, 0.3, 0.5, 0.7, 0.9, 0.975, 0.99, 0.999]) {
      const sut = normalQuantile(p);
      if (p === 0.5) expect(sut).toBe(0);
      else expectRelative(sut, jStat.normal.inv(p, 0, 1), 1e-9); // jstat normal.inv
      expectRelative(normalCdf(sut), p, 1e-13);
    }
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 13); // z(0.975), A&S Table 26.5 (memory)
  });

  it('refuses probabilities outside [0, 1]', () => {
    expect(() => normalQuantile(1.5)).toThrow('between 0 and 1');
  });
});

describe('studentTQuantile', () => {
  it('agrees with jstat studentt.inv', () => {
    for (const df of [1, 2, 3, 4, 5, 7.5, 10, 20, 34, 100, 1000]) {
      for (const p of [0.0005, 0.01, 0.05, 0.1, 0.25, 0.6, 0.9, 0.95, 0.975, 0.99, 0.9995]) {
        // jstat's own iteration stops near 1e-8, so the comparison cannot be tighter than that.
        expectRelative(studentTQuantile(p, df), jStat.studentt.inv(p, df), 1e-7); // jstat studentt.inv
      }
    }
  });

  it('inverts its own distribution function to near machine precision', () => {
    for (const df of [1, 3, 10, 34, 200]) {
      for (const p of [0.001, 0.05, 0.5, 0.95, 0.999]) {
        expect(studentTCdf(studentTQuantile(p, df), df)).toBeCloseTo(p, 13);
      }
    }
  });

  it('matches printed t tables', () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.2 (memory of the section number), t critical values, 3 decimals
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(12.706, 3); // NIST §1.3.6.7.2: ν 1, 0.975
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3); // NIST §1.3.6.7.2: ν 10, 0.975
    expect(studentTQuantile(0.95, 10)).toBeCloseTo(1.812, 3); // NIST §1.3.6.7.2: ν 10, 0.95
    expect(studentTQuantile(0.995, 5)).toBeCloseTo(4.032, 3); // NIST §1.3.6.7.2: ν 5, 0.995
    expect(studentTQuantile(0.975, 30)).toBeCloseTo(2.042, 3); // NIST §1.3.6.7.2: ν 30, 0.975
  });

  it('is symmetric and tends to the normal quantile', () => {
    expect(studentTQuantile(0.025, 8)).toBeCloseTo(-studentTQuantile(0.975, 8), 13);
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(normalQuantile(0.975), 5);
  });

  it('refuses bad arguments', () => {
    expect(() => studentTQuantile(0.5, 0)).toThrow('degrees of freedom');
    expect(() => studentTQuantile(-0.1, 5)).toThrow('between 0 and 1');
  });
});

describe('linearRegression', () => {
  it('matches the NIST StRD Norris certified values', () => {
    const sut = linearRegression(NORRIS_X, NORRIS_Y);
    expectRelative(sut.intercept, -0.262323073774029, 1e-12); // NIST StRD Norris certified B0
    expectRelative(sut.slope, 1.00211681802045, 1e-13); // NIST StRD Norris certified B1
    expectRelative(sut.interceptSe, 0.232818234301152, 1e-12); // NIST StRD Norris sd of B0
    expectRelative(sut.slopeSe, 0.429796848199937e-3, 1e-12); // NIST StRD Norris sd of B1
    expectRelative(sut.residualSd, 0.884796396144373, 1e-12); // NIST StRD Norris residual sd
    expectRelative(sut.r2, 0.999993745883712, 1e-14); // NIST StRD Norris R-squared
    expectRelative(sut.sse, 26.6173985294224, 1e-11); // NIST StRD Norris residual sum of squares
    expect(sut.df).toBe(34);
  });

  it('gives prediction bounds that match the textbook formula with jstat t quantiles', () => {
    const sut = linearRegression(NORRIS_X, NORRIS_Y);
    // Recomputed here from the certified coefficients and plain sums, t from jstat:
    // ŷ ± t·s·√(1 + 1/n + (x0 − x̄)²/Sxx), the prediction interval for a new observation
    // (Montgomery & Runger, Applied Statistics and Probability for Engineers, ch. 11 (memory)).
    const n = NORRIS_X.length;
    const xBar = NORRIS_X.reduce((a, b) => a + b, 0) / n;
    const sxx = NORRIS_X.reduce((a, x) => a + (x - xBar) ** 2, 0);
    const x0 = 1200;
    const yHat = -0.262323073774029 + 1.00211681802045 * x0;
    const se = 0.884796396144373 * Math.sqrt(1 + 1 / n + (x0 - xBar) ** 2 / sxx);
    const two = predictionInterval(sut, x0, 0.95);
    expectRelative(two.fit, yHat, 1e-12);
    expectRelative(two.upper - two.fit, jStat.studentt.inv(0.975, 34) * se, 1e-7); // jstat t, two-sided 95 %
    expectRelative(two.fit - two.lower, jStat.studentt.inv(0.975, 34) * se, 1e-7);
    expectRelative(upperPredictionBound(sut, x0, 0.95) - yHat, jStat.studentt.inv(0.95, 34) * se, 1e-7); // one-sided 95 %
  });

  it('handles an exact line and a flat line', () => {
    const sut = linearRegression([0, 1, 2, 3], [1, 3, 5, 7]);
    expect(sut.slope).toBeCloseTo(2, 14);
    expect(sut.intercept).toBeCloseTo(1, 14);
    expect(sut.r2).toBe(1);
    expect(sut.residualSd).toBeCloseTo(0, 14);
    expect(linearRegression([1, 2, 3], [4, 4, 4]).r2).toBe(1);
  });

  it('refuses data it cannot fit', () => {
    expect(() => linearRegression([2, 2, 2], [1, 2, 3])).toThrow('x values are all equal');
    expect(() => linearRegression([1, 2], [1])).toThrow(ComputeError);
    expect(() => predictionInterval(linearRegression([1, 2], [1, 2]), 3)).toThrow('at least 3 points');
    expect(() => predictionInterval(linearRegression([1, 2, 3], [1, 2, 4]), 3, 1.2)).toThrow('confidence');
  });
});
