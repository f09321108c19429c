// @ts-expect-error jstat ships no type declarations; it is used only as an independent reference
import jstatModule from 'jstat';
import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { wearForecast } from '../../shared/compute/spc/forecast';

const jStat = jstatModule as { studentt: { inv(p: number, df: number): number } };

// NIST StRD linear least squares "Norris", n = 36; certified B0 −0.262323073774029,
// B1 1.00211681802045, residual sd 0.884796396144373.
const NORRIS_X = [
  0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0, 447.5, 11.6,
  556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3, 229.2, 669.1, 448.9, 0.5,
];
const NORRIS_Y = [
  0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3, 448.9, 10.8,
  557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6, 228.9, 668.4, 449.2, 0.2,
];

/** Burr height (mm) over 12 lots from one die, rising with wear; factory with overrides. */
function makeBurr(overrides: Partial<{ x: number[]; y: number[]; usl: number; confidence: number }> = {}) {
  return {
    x: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12],
    y: [0.012, 0.013, 0.015, 0.014, 0.016, 0.018, 0.017, 0.019, 0.021, 0.02, 0.022, 0.024],
    usl: 0.04,
    ...overrides,
  };
}

/** Upper prediction bound recomputed in the test from plain sums and a jstat t quantile. */
function referenceBound(x: number[], y: number[], x0: number, confidence: number): number {
  const n = x.length;
  const xBar = x.reduce((a, b) => a + b, 0) / n;
  const yBar = y.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i] - xBar) ** 2;
    sxy += (x[i] - xBar) * (y[i] - yBar);
  }
  const b1 = sxy / sxx;
  const b0 = yBar - b1 * xBar;
  const sse = y.reduce((a, yi, i) => a + (yi - b0 - b1 * x[i]) ** 2, 0);
  const s = Math.sqrt(sse / (n - 2));
  // One-sided upper prediction bound for a new observation (Montgomery & Runger, Applied
  // Statistics and Probability for Engineers, ch. 11 (memory)), t from jstat.
  return b0 + b1 * x0 + jStat.studentt.inv(confidence, n - 2) * s * Math.sqrt(1 + 1 / n + (x0 - xBar) ** 2 / sxx);
}

function expectRelative(actual: number | null, expected: number, tol: number): void {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(tol * Math.abs(expected));
}

describe('wearForecast', () => {
  it('fits the NIST StRD Norris line and extrapolates it to the limit', () => {
    const sut = wearForecast({ x: NORRIS_X, y: NORRIS_Y, usl: 1200 });
    expectRelative(sut.slope, 1.00211681802045, 1e-13); // NIST StRD Norris certified B1
    expectRelative(sut.intercept, -0.262323073774029, 1e-12); // NIST StRD Norris certified B0
    expectRelative(sut.r2, 0.999993745883712, 1e-14); // NIST StRD Norris certified R²
    expect(sut.xLast).toBe(999.0);
    const xAtLimit = (1200 + 0.262323073774029) / 1.00211681802045; // from the certified line
    expectRelative(sut.lotsToLimit, xAtLimit - 999.0, 1e-10); // NIST StRD Norris line reaches 1200
  });

  it('puts the conservative figure where the upper prediction bound meets the limit', () => {
    const sut = wearForecast({ x: NORRIS_X, y: NORRIS_Y, usl: 1200 });
    expect(sut.xAtLimitLower).not.toBeNull();
    const x0 = sut.xAtLimitLower as number;
    // NIST StRD Norris data, bound recomputed with jstat's t (one-sided 95 %).
    expectRelative(referenceBound(NORRIS_X, NORRIS_Y, x0, 0.95), 1200, 1e-9);
    expect(sut.lotsToLimitLower as number).toBeLessThan(sut.lotsToLimit as number);
    expect(sut.t).toBeCloseTo(jStat.studentt.inv(0.95, 34), 6); // jstat t(0.95, 34)
  });

  it('forecasts lots to the burr limit for a wearing die', () => {
    const input = makeBurr();
    const sut = wearForecast(input);
    expect(sut.slope).toBeGreaterThan(0);
    const xLine = (0.04 - sut.intercept) / sut.slope;
    expectRelative(sut.lotsToLimit, xLine - 12, 1e-12);
    const x0 = sut.xAtLimitLower as number;
    expectRelative(referenceBound(input.x, input.y, x0, 0.95), 0.04, 1e-9); // bound with jstat t
    // A higher confidence is more cautious: it reaches the limit sooner.
    const cautious = wearForecast(makeBurr({ confidence: 0.99 }));
    expect(cautious.lotsToLimitLower as number).toBeLessThan(sut.lotsToLimitLower as number);
    expectRelative(referenceBound(input.x, input.y, cautious.xAtLimitLower as number, 0.99), 0.04, 1e-9);
  });

  it('returns null when there is no upward trend', () => {
    const sut = wearForecast(makeBurr({ y: [0.02, 0.019, 0.02, 0.018, 0.019, 0.018, 0.017, 0.018, 0.017, 0.016, 0.017, 0.016] }));
    expect(sut.slope).toBeLessThan(0);
    expect(sut.lotsToLimit).toBeNull();
    expect(sut.lotsToLimitLower).toBeNull();
    expect(wearForecast(makeBurr({ y: new Array(12).fill(0.02) })).lotsToLimit).toBeNull();
  });

  it('returns 0 when the limit is already reached', () => {
    const sut = wearForecast(makeBurr({ usl: 0.02 }));
    expect(sut.lotsToLimit).toBe(0);
    expect(sut.lotsToLimitLower).toBe(0);
  });

  it('refuses data it cannot forecast from', () => {
    expect(() => wearForecast({ x: [1, 2], y: [0.01, 0.02], usl: 0.05 })).toThrow('at least 3 measurements');
    expect(() => wearForecast({ x: [1, 1, 1], y: [0.01, 0.02, 0.03], usl: 0.05 })).toThrow('x values are all equal');
    expect(() => wearForecast({ x: [1, 2, 3], y: [0.01, 0.02], usl: 0.05 })).toThrow(ComputeError);
    expect(() => wearForecast(makeBurr({ confidence: 1 }))).toThrow('confidence must be between 0 and 1');
    expect(() => wearForecast(makeBurr({ usl: Number.NaN }))).toThrow('usl must be a finite number');
  });
});
