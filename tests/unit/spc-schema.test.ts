import { describe, expect, it } from 'vitest';
import { spcAnalyzeInputSchema } from '../../shared/schemas/spc';

function makeXbar(overrides: Record<string, unknown> = {}) {
  return {
    chart: 'xbar-r',
    subgroups: [
      [1, 2, 3],
      [2, 3, 4],
    ],
    ...overrides,
  };
}

/** The issues of a failed parse as "path: message". */
function issues(input: unknown): string[] {
  const r = spcAnalyzeInputSchema.safeParse(input);
  expect(r.success).toBe(false);
  return r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
}

describe('spcAnalyzeInputSchema', () => {
  it('accepts each chart kind', () => {
    expect(spcAnalyzeInputSchema.safeParse(makeXbar({ lsl: 0, usl: 5, rules: 'nelson' })).success).toBe(true);
    expect(spcAnalyzeInputSchema.safeParse({ chart: 'xbar-s', subgroups: [[1, 2], [3, 5]] }).success).toBe(true);
    expect(spcAnalyzeInputSchema.safeParse({ chart: 'i-mr', values: [1, 2, 3], center: 2, sigma: 1 }).success).toBe(true);
    expect(spcAnalyzeInputSchema.safeParse({ chart: 'p', defectives: [1, 0], sizes: [10, 12], center: 0.05 }).success).toBe(true);
  });

  it('says lsl must be below usl', () => {
    expect(issues(makeXbar({ lsl: 5, usl: 5 }))).toEqual(['lsl: lsl must be below usl']);
    expect(issues(makeXbar({ lsl: 6, usl: 5 }))).toEqual(['lsl: lsl must be below usl']);
  });

  it('checks subgroups for X-bar charts', () => {
    expect(issues({ chart: 'xbar-r' })).toEqual(['subgroups: subgroups are required for an X-bar/R chart']);
    expect(issues(makeXbar({ subgroups: [[1, 2, 3]] }))).toEqual(['subgroups: an X-bar/R chart needs at least 2 subgroups (got 1)']);
    expect(issues(makeXbar({ subgroups: [[1, 2, 3], [1, 2]] }))).toEqual([
      'subgroups: subgroup 2 has 2 measurements but subgroup 1 has 3; subgroups must be the same size',
    ]);
    expect(issues(makeXbar({ subgroups: [[1], [2]] }))).toEqual(['subgroups: each subgroup needs at least 2 measurements']);
    const eleven = Array.from({ length: 11 }, (_, i) => i);
    expect(issues(makeXbar({ subgroups: [eleven, eleven] }))[0]).toContain('use xbar-s for larger subgroups');
    expect(spcAnalyzeInputSchema.safeParse({ chart: 'xbar-s', subgroups: [eleven, eleven] }).success).toBe(true);
    expect(spcAnalyzeInputSchema.safeParse(makeXbar({ subgroups: [[1, 2, 3]], center: 2, sigma: 1 })).success).toBe(true);
  });

  it('refuses non-finite numbers', () => {
    expect(issues(makeXbar({ subgroups: [[1, Infinity], [1, 2]] }))).toEqual(['subgroups.0.1: each measurement must be a finite number']);
    expect(issues({ chart: 'i-mr', values: [1, Number.NaN] })).toEqual(['values.1: each measurement must be a finite number']);
  });

  it('checks p chart counts', () => {
    expect(issues({ chart: 'p', defectives: [3, 12], sizes: [10, 10] })).toEqual([
      'defectives: sample 2: 12 defectives is more than the sample size of 10',
    ]);
    expect(issues({ chart: 'p', defectives: [-1, 2], sizes: [10, 10] })).toEqual(['defectives.0: defectives cannot be negative']);
    expect(issues({ chart: 'p', defectives: [1.5, 2], sizes: [10, 10] })).toEqual(['defectives.0: defectives must be a whole number']);
    expect(issues({ chart: 'p', defectives: [1, 2], sizes: [10, 0] })).toEqual(['sizes.1: each sample size must be at least 1']);
    expect(issues({ chart: 'p', defectives: [1, 2, 3], sizes: [10, 10] })).toEqual([
      'sizes: defectives has 3 entries but sizes has 2; give one of each per sample',
    ]);
    expect(issues({ chart: 'p', defectives: [1, 2], sizes: [10, 10], usl: 0.1 })).toEqual([
      'usl: specification limits apply to measured values, not to a p chart',
    ]);
    expect(issues({ chart: 'p', defectives: [1, 2], sizes: [10, 10], center: 2 })).toEqual([
      'center: for a p chart, center is a fraction defective between 0 and 1',
    ]);
    expect(issues({ chart: 'p', sizes: [10, 10] })).toEqual(['defectives: defectives are required for a p chart']);
  });

  it('needs center and sigma together for variables charts', () => {
    expect(issues(makeXbar({ center: 2 }))).toEqual(['sigma: give both center and sigma to judge against known limits, or neither']);
    expect(issues(makeXbar({ sigma: 1 }))).toEqual(['center: give both center and sigma to judge against known limits, or neither']);
    expect(issues(makeXbar({ center: 2, sigma: 0 }))).toEqual(['sigma: sigma must be above 0']);
  });

  it('refuses fields of another chart kind and unknown enums', () => {
    expect(issues(makeXbar({ values: [1, 2] }))).toEqual(['values: values does not apply to an X-bar/R chart']);
    expect(issues({ chart: 'c', values: [1, 2] })).toEqual(['chart: chart must be one of xbar-r, xbar-s, i-mr, p']);
    expect(issues(makeXbar({ rules: 'aiag' }))).toEqual(['rules: rules must be western-electric or nelson']);
  });
});
