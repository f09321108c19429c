import { describe, expect, it } from 'vitest';
import { addYears, periodKeyOf, ppm, rankSuppliers, scorecardRange } from '../../shared/compute/scorecard';
import { ComputeError } from '../../shared/compute/errors';

describe('ppm', () => {
  it('is rejected quantity over received quantity, per million', () => {
    expect(ppm(300, 1000)).toBe(300_000); // 300 ÷ 1000 × 10⁶ = 300 000 (common practice definition of PPM)
    expect(ppm(1, 3)).toBeCloseTo(333_333.333, 3); // 1 ÷ 3 × 10⁶
    expect(ppm(0, 5000)).toBe(0);
  });

  it('is null when nothing was received, and refuses impossible quantities', () => {
    expect(ppm(0, 0)).toBeNull();
    expect(() => ppm(5, 4)).toThrow(ComputeError);
    expect(() => ppm(-1, 4)).toThrow(/not negative/);
    expect(() => ppm(Number.NaN, 4)).toThrow(ComputeError);
  });
});

describe('rankSuppliers', () => {
  it('ranks lower PPM first, ties by fewer lots rejected, equal on both share a rank', () => {
    const sut = rankSuppliers([
      { id: 'a', ppm: 300_000, lotsRejected: 1 },
      { id: 'b', ppm: 0, lotsRejected: 0 },
      { id: 'c', ppm: 300_000, lotsRejected: 2 },
      { id: 'd', ppm: null, lotsRejected: 0 },
      { id: 'e', ppm: 300_000, lotsRejected: 1 },
      { id: 'f', ppm: 500_000, lotsRejected: 1 },
    ]);
    expect(Object.fromEntries(sut)).toEqual({ b: 1, a: 2, e: 2, c: 4, f: 5, d: null }); // standard competition ranking "1, 2, 2, 4" (common practice)
  });
});

describe('scorecardRange', () => {
  it('defaults to the last 6 months by month, up to today', () => {
    const sut = scorecardRange({}, '2026-05-14');
    expect(sut.from).toBe('2025-12-01');
    expect(sut.to).toBe('2026-05-14');
    expect(sut.periods.map((p) => p.key)).toEqual(['2025-12', '2026-01', '2026-02', '2026-03', '2026-04', '2026-05']);
    expect(sut.periods[5]).toEqual({ key: '2026-05', label: 'May 2026', start: '2026-05-01', end: '2026-05-14' });
    expect(sut.periods[2].end).toBe('2026-02-28');
  });

  it('defaults to 4 quarters by quarter and clips the first and last period to the range', () => {
    expect(scorecardRange({ period: 'quarter' }, '2026-05-14').periods.map((p) => p.key)).toEqual(['2025-Q3', '2025-Q4', '2026-Q1', '2026-Q2']);
    const sut = scorecardRange({ from: '2025-02-10', to: '2025-08-03', period: 'quarter' }, '2026-05-14');
    expect(sut.periods).toEqual([
      { key: '2025-Q1', label: 'Q1 2025', start: '2025-02-10', end: '2025-03-31' },
      { key: '2025-Q2', label: 'Q2 2025', start: '2025-04-01', end: '2025-06-30' },
      { key: '2025-Q3', label: 'Q3 2025', start: '2025-07-01', end: '2025-08-03' },
    ]);
  });

  it('refuses an inverted range and one over 3 years, naming the limit', () => {
    expect(() => scorecardRange({ from: '2026-03-01', to: '2026-01-31' }, '2026-05-14')).toThrow(/inverted/);
    expect(() => scorecardRange({ from: '2022-01-01', to: '2025-01-02' }, '2026-05-14')).toThrow(/at most 3 years: from 2022-01-01, to may be 2025-01-01 at the latest/);
    expect(scorecardRange({ from: '2022-01-01', to: '2025-01-01' }, '2026-05-14').periods).toHaveLength(37);
    // Without `to`, today is the end: a `from` more than 3 years back is too long too.
    expect(() => scorecardRange({ from: '2020-01-01' }, '2026-05-14')).toThrow(ComputeError);
    expect(() => scorecardRange({ from: '2026-02-30' }, '2026-05-14')).toThrow(/not a real calendar date/);
  });

  it('keys periods in UTC calendar terms', () => {
    expect(periodKeyOf('2026-12-31', 'month')).toBe('2026-12');
    expect(periodKeyOf('2026-10-01', 'quarter')).toBe('2026-Q4');
    expect(addYears('2024-02-29', 3)).toBe('2027-02-28');
  });
});
