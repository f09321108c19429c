import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { evaluateRules, limitSignals, RULE_SETS, type RuleId } from '../../shared/compute/spc/rules';

// Rule definitions: Western Electric, Statistical Quality Control Handbook (1956), as stated in
// NIST/SEMATECH e-Handbook §6.3.2; Nelson, J. Quality Technology 16(4), 1984.
// Vectors use centre 0 and σ 1 so every boundary is exact in binary.

/** Indices at which `rule` fires, for centre 0 and σ 1 unless given. */
function fired(points: number[], rule: RuleId, center = 0, sigma: number | number[] = 1): number[] {
  return evaluateRules(points, center, sigma, [rule]).map((s) => s.index);
}

const rep = (v: number, k: number) => new Array<number>(k).fill(v);

/** Small deterministic PRNG (mulberry32) so random tests are reproducible. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normals(count: number, seed: number): number[] {
  const u = rng(seed);
  const out: number[] = [];
  while (out.length < count) {
    const r = Math.sqrt(-2 * Math.log(1 - u()));
    const th = 2 * Math.PI * u();
    out.push(r * Math.cos(th), r * Math.sin(th));
  }
  return out.slice(0, count);
}

describe('evaluateRules: rule 1 (we1, nelson1)', () => {
  it('fires once for a point beyond 3σ', () => {
    expect(fired([0, 0.5, -0.5, 3.2, 0], 'we1')).toEqual([3]); // WE rule 1 / NIST §6.3.2
    expect(fired([0, -3.5, 0], 'nelson1')).toEqual([1]); // Nelson test 1
  });

  it('does not fire exactly at 3σ ("beyond" is strict)', () => {
    expect(fired([3, -3, 2.99], 'we1')).toEqual([]);
    expect(fired([3, -3], 'nelson1')).toEqual([]);
  });

  it('treats a limit that is only off by binary rounding as exactly on it', () => {
    // 10.3 − 10 = 0.3000000000000007 > 3 × 0.1 in binary; in decimal it is exactly on the limit.
    expect(fired([10.3, 9.7], 'we1', 10, 0.1)).toEqual([]);
    expect(fired([10.31, 9.69], 'we1', 10, 0.1)).toEqual([0, 1]);
  });

  it('uses per-point σ (p charts)', () => {
    // 0.1 is beyond 3 × 0.02 but not beyond 3 × 0.05.
    expect(fired([0.1, 0.1], 'we1', 0, [0.05, 0.02])).toEqual([1]);
  });

  it('handles σ = 0 without dividing', () => {
    expect(fired([0, 0, 0], 'we1', 0, 0)).toEqual([]);
    expect(fired([0, 1e-3], 'we1', 0, 0)).toEqual([1]);
  });
});

describe('evaluateRules: 2 of 3 beyond 2σ (we2, nelson5)', () => {
  it('fires once when the second point beyond 2σ completes the window', () => {
    expect(fired([0, 2.5, 0.5, 2.1, 0], 'we2')).toEqual([3]); // WE rule 2
    expect(fired([0, -2.5, -2.1, 0], 'nelson5')).toEqual([2]); // Nelson test 5
  });

  it('fires at the completing point only, not at a later point inside 2σ', () => {
    expect(fired([2.5, 2.5, 0, 0], 'we2')).toEqual([1]);
  });

  it('does not fire exactly at 2σ, across sides, or when 3 points apart', () => {
    expect(fired([2, 2, 2, 2], 'we2')).toEqual([]);
    expect(fired([2.5, -2.5, 0, 2.5, -2.5, 0], 'we2')).toEqual([]);
    expect(fired([2.5, 0, 0, 2.5], 'nelson5')).toEqual([]);
  });
});

describe('evaluateRules: 4 of 5 beyond 1σ (we3, nelson6)', () => {
  it('fires once when the fourth point beyond 1σ completes the window', () => {
    expect(fired([1.5, 1.5, 0.2, 1.5, 1.5, 0], 'we3')).toEqual([4]); // WE rule 3
    expect(fired([0, -1.2, -1.5, -1.1, 0.3, -2.5, 0], 'nelson6')).toEqual([5]); // Nelson test 6
  });

  it('does not fire exactly at 1σ or across sides', () => {
    expect(fired(rep(1, 6), 'we3')).toEqual([]);
    expect(fired([1.5, -1.5, 1.5, -1.5, 1.5, -1.5], 'we3')).toEqual([]);
    expect(fired([1.5, 1.5, 1.5, 0, 0, 1.5], 'nelson6')).toEqual([]);
  });
});

describe('evaluateRules: runs on one side (we4 = 8, nelson2 = 9)', () => {
  it('fires once at the 8th / 9th point in a row', () => {
    expect(fired([-1, ...rep(0.1, 8), -1], 'we4')).toEqual([8]); // WE rule 4
    expect(fired([1, ...rep(-0.1, 9), 1], 'nelson2')).toEqual([9]); // Nelson test 2
    expect(fired([...rep(0.1, 8)], 'nelson2')).toEqual([]);
  });

  it('fires on every point that continues a qualifying run', () => {
    expect(fired(rep(0.5, 10), 'we4')).toEqual([7, 8, 9]);
    expect(fired(rep(0.5, 10), 'nelson2')).toEqual([8, 9]);
  });

  it('is broken by a point exactly on the centre line', () => {
    expect(fired([...rep(0.1, 4), 0, ...rep(0.1, 4)], 'we4')).toEqual([]);
    expect(fired([...rep(-0.1, 5), 0, ...rep(-0.1, 5)], 'nelson2')).toEqual([]);
  });
});

describe('evaluateRules: trend of 6 (trend6, nelson3)', () => {
  it('fires once at the 6th point of a steady rise or fall', () => {
    expect(fired([0, 1, 2, 3, 4, 5], 'trend6')).toEqual([5]); // Nelson test 3
    expect(fired([9, 5, 4, 3, 2, 1, 0, 0.5], 'nelson3')).toEqual([5, 6]); // falls 9→…→1 and 9→…→0: two completions
    expect(fired([3, 2.5, 2, 1.5, 1, 0.5, 1], 'nelson3')).toEqual([5]); // Nelson test 3
  });

  it('is broken by a tie between consecutive points', () => {
    expect(fired([0, 1, 2, 3, 3, 4, 5, 6, 7], 'trend6')).toEqual([]);
    expect(fired([0, 1, 2, 3, 4], 'trend6')).toEqual([]);
  });
});

describe('evaluateRules: 14 alternating (nelson4)', () => {
  const zigzag = (k: number) => Array.from({ length: k }, (_, i) => (i % 2 === 0 ? 0.2 : 0.8));

  it('fires once at the 14th point of an up-down sequence', () => {
    expect(fired(zigzag(14), 'nelson4')).toEqual([13]); // Nelson test 4
    expect(fired(zigzag(13), 'nelson4')).toEqual([]);
  });

  it('is broken by a tie', () => {
    const sut = zigzag(16);
    sut[7] = sut[6]; // a tie in the middle
    expect(fired(sut, 'nelson4')).toEqual([]);
  });
});

describe('evaluateRules: 15 within 1σ (nelson7)', () => {
  const calm = [0.2, -0.5, 0.3, 0.1, -0.2, 0.4, -0.1, 0.6, -0.6, 0.2, 0.05, -0.3, 0.7, -0.4];

  it('fires once at the 15th point within 1σ, on either side', () => {
    expect(calm).toHaveLength(14);
    expect(fired([2, ...calm, 0.1, 1.5], 'nelson7')).toEqual([15]); // Nelson test 7
  });

  it('counts a point exactly at 1σ as within and a point beyond it as breaking the run', () => {
    expect(fired([...calm, 1], 'nelson7')).toEqual([14]);
    expect(fired([...calm.slice(0, 7), 1.01, ...calm.slice(7)], 'nelson7')).toEqual([]);
  });
});

describe('evaluateRules: 8 with none within 1σ (nelson8)', () => {
  it('fires once at the 8th point outside 1σ, either side', () => {
    expect(fired([0, 1.5, -1.5, 2, -2, 1.2, -1.2, 1.5, -1.5, 0], 'nelson8')).toEqual([8]); // Nelson test 8
  });

  it('is broken by a point exactly at 1σ (it is within)', () => {
    expect(fired([1.5, -1.5, 2, 1, -2, 1.2, -1.2, 1.5, -1.5], 'nelson8')).toEqual([]);
  });
});

describe('evaluateRules: rule sets and messages', () => {
  it('names the rule sets', () => {
    expect(RULE_SETS['western-electric']).toEqual(['we1', 'we2', 'we3', 'we4', 'trend6']);
    expect(RULE_SETS.nelson).toEqual(['nelson1', 'nelson2', 'nelson3', 'nelson4', 'nelson5', 'nelson6', 'nelson7', 'nelson8']);
  });

  it('defaults to Western Electric and orders signals by index, then rule', () => {
    const sut = evaluateRules([0, 3.5, 3.5, 0], 0, 1);
    expect(sut.map((s) => [s.index, s.rule])).toEqual([
      [1, 'we1'],
      [2, 'we1'],
      [2, 'we2'],
    ]);
    expect(sut[0].message).toBe('point 2 is above the upper 3σ limit (we1)');
  });

  it('evaluates all of Nelson on one series', () => {
    const sut = evaluateRules([0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, -4], 0, 1, 'nelson');
    expect(sut.map((s) => `${s.rule}@${s.index}`)).toEqual(['nelson2@8', 'nelson1@9']);
  });

  it('refuses bad input with readable messages', () => {
    expect(() => evaluateRules([1, Number.NaN], 0, 1)).toThrow('point 2 is not a finite number');
    expect(() => evaluateRules([1], 0, -1)).toThrow('sigma must be a finite number of at least 0');
    expect(() => evaluateRules([1, 2], 0, [1])).toThrow('one sigma per point');
    expect(() => evaluateRules([1], Number.NaN, 1)).toThrow(ComputeError);
    expect(() => evaluateRules([1], 0, 1, 'aiag' as 'nelson')).toThrow('unknown rule set');
  });
});

describe('evaluateRules: agreement with a direct reading of each rule', () => {
  // A slow reference written straight from the rule text: every window re-examined at every
  // point. Values on a 0.25 grid make ties, centre-line points and exact 1σ/2σ/3σ points common.
  const side = (x: number) => (x > 0 ? 1 : x < 0 ? -1 : 0);
  const reference: Record<string, (p: number[], i: number) => boolean> = {
    beyond3: (p, i) => Math.abs(p[i]) > 3,
    twoOfThree: (p, i) =>
      [1, -1].some((s) => s * p[i] > 2 && p.slice(Math.max(0, i - 2), i + 1).filter((x) => s * x > 2).length >= 2),
    fourOfFive: (p, i) =>
      [1, -1].some((s) => s * p[i] > 1 && p.slice(Math.max(0, i - 4), i + 1).filter((x) => s * x > 1).length >= 4),
    run8: (p, i) => i >= 7 && [1, -1].some((s) => p.slice(i - 7, i + 1).every((x) => side(x) === s)),
    run9: (p, i) => i >= 8 && [1, -1].some((s) => p.slice(i - 8, i + 1).every((x) => side(x) === s)),
    trend6: (p, i) =>
      i >= 5 && [1, -1].some((s) => [1, 2, 3, 4, 5].every((k) => side(p[i - k + 1] - p[i - k]) === s)),
    alternate14: (p, i) => {
      if (i < 13) return false;
      const d = Array.from({ length: 13 }, (_, k) => side(p[i - 12 + k] - p[i - 13 + k]));
      return d.every((v, k) => v !== 0 && (k === 0 || v === -d[k - 1]));
    },
    within15: (p, i) => i >= 14 && p.slice(i - 14, i + 1).every((x) => Math.abs(x) <= 1),
    outside8: (p, i) => i >= 7 && p.slice(i - 7, i + 1).every((x) => Math.abs(x) > 1),
  };
  const kindOf: Record<RuleId, string> = {
    we1: 'beyond3', nelson1: 'beyond3', we2: 'twoOfThree', nelson5: 'twoOfThree', we3: 'fourOfFive',
    nelson6: 'fourOfFive', we4: 'run8', nelson2: 'run9', trend6: 'trend6', nelson3: 'trend6',
    nelson4: 'alternate14', nelson7: 'within15', nelson8: 'outside8',
  };

  function series(seed: number): number[] {
    const z = normals(3000, seed);
    const u = rng(seed + 1);
    const out: number[] = [];
    for (let i = 0; i < z.length; i++) {
      // Mix plain noise with ramps, zig-zags, calm and shifted stretches so long patterns occur.
      const mode = Math.floor(i / 100) % 5;
      let v = z[i] * 1.3;
      if (mode === 1) v = z[i] * 0.15 + ((i % 100) / 4 - 12.5);
      if (mode === 2) v = (i % 2 === 0 ? 1 : -1) * Math.abs(z[i]) * (u() < 0.9 ? 1 : 0);
      if (mode === 3) v = z[i] * 0.45;
      if (mode === 4) v = 1.8 + z[i] * 0.8;
      out.push(Math.round(v * 4) / 4);
    }
    return out;
  }

  it.each([11, 12, 13])('matches the reference on a 3000-point series (seed %i)', (seed) => {
    const points = series(seed);
    for (const rule of [...RULE_SETS['western-electric'], ...RULE_SETS.nelson]) {
      const expected = points.flatMap((_, i) => (reference[kindOf[rule]](points, i) ? [i] : []));
      expect(fired(points, rule), rule).toEqual(expected);
      // The series is built so every rule fires somewhere: the comparison is not vacuous.
      expect(expected.length, rule).toBeGreaterThan(0);
    }
  });

  it('matches the reference on a 12 000-point series, across the chunks the pass works in', () => {
    const points = [...series(21), ...series(22), ...series(23), ...series(24)];
    const all = [...RULE_SETS['western-electric'], ...RULE_SETS.nelson];
    const together = evaluateRules(points, 0, 1, all);
    for (const rule of all) {
      const expected = points.flatMap((_, i) => (reference[kindOf[rule]](points, i) ? [i] : []));
      expect(together.filter((s) => s.rule === rule).map((s) => s.index), rule).toEqual(expected); // direct reading of the rule (above)
      expect(expected.length, rule).toBeGreaterThan(0);
    }
  });

  it('gives the same signals for typed arrays as for plain arrays', () => {
    const points = series(31);
    const sigmas = points.map((_, i) => (i % 7 === 0 ? 0.5 : 1));
    for (const rules of ['western-electric', 'nelson'] as const) {
      expect(evaluateRules(Float64Array.from(points), 0, 1, rules)).toEqual(evaluateRules(points, 0, 1, rules));
      expect(evaluateRules(Float64Array.from(points), 0, Float64Array.from(sigmas), rules)).toEqual(
        evaluateRules(points, 0, sigmas, rules),
      );
    }
  });

  it('judges each point against its own σ (p charts), as the reference does on the scaled series', () => {
    // x = z·σᵢ with σᵢ a power of two keeps every zone boundary exact: x is beyond kσᵢ exactly
    // when z is beyond k. Trends and zig-zags depend on x itself, so they are left out here.
    const z = series(41);
    const u = rng(42);
    const sigmas = z.map(() => [0.25, 0.5, 1, 2, 4][Math.floor(u() * 5)]);
    const x = z.map((v, i) => v * sigmas[i]);
    for (const rule of ['we1', 'we2', 'we3', 'we4', 'nelson2', 'nelson7', 'nelson8'] as RuleId[]) {
      const expected = z.flatMap((_, i) => (reference[kindOf[rule]](z, i) ? [i] : []));
      expect(fired(x, rule, 0, sigmas), rule).toEqual(expected); // direct reading of the rule (above)
      expect(expected.length, rule).toBeGreaterThan(0);
    }
  });
});

describe('evaluateRules: long series', () => {
  it('counts a run that crosses many chunks point by point', () => {
    const sut = evaluateRules(rep(0.5, 5000), 0, 1, ['we4']);
    // WE rule 4 fires at every point that continues the run (see the header's firing convention).
    expect(sut).toHaveLength(5000 - 7);
    expect(sut[0]).toEqual({ rule: 'we4', index: 7, message: 'point 8 ends a run of 8 points above the centre (we4)' });
    expect(sut[4000].message).toBe('point 4008 ends a run of 4008 points above the centre (we4)');
    expect(sut.at(-1)?.message).toBe('point 5000 ends a run of 5000 points above the centre (we4)');
  });

  it('counts a steady fall and a zig-zag that cross many chunks', () => {
    const fall = evaluateRules(Array.from({ length: 3000 }, (_, i) => -i / 1000), 0, 1, ['nelson3']);
    expect(fall.map((s) => s.index)).toEqual(Array.from({ length: 3000 - 5 }, (_, k) => k + 5)); // Nelson test 3
    expect(fall.at(-1)?.message).toBe('point 3000 ends 3000 points in a row steadily decreasing (nelson3)');
    const zigzag = evaluateRules(Array.from({ length: 3000 }, (_, i) => (i % 2 ? 0.3 : -0.3)), 0, 1, ['nelson4', 'nelson7']);
    expect(zigzag.filter((s) => s.rule === 'nelson4')).toHaveLength(3000 - 13); // Nelson test 4
    expect(zigzag.filter((s) => s.rule === 'nelson7')).toHaveLength(3000 - 14); // Nelson test 7
    expect(zigzag.at(-1)?.message).toBe('point 3000 ends 3000 points in a row within 1σ of the centre (nelson7)');
    expect(zigzag.at(-2)?.message).toBe('point 3000 ends 3000 points in a row alternating up and down (nelson4)');
  });

  it('restarts the count when a run breaks and starts again', () => {
    const sut = evaluateRules([...rep(0.5, 9), -0.5, ...rep(0.5, 9)], 0, 1, ['we4']);
    expect(sut.map((s) => s.message)).toEqual([
      'point 8 ends a run of 8 points above the centre (we4)',
      'point 9 ends a run of 9 points above the centre (we4)',
      'point 18 ends a run of 8 points above the centre (we4)',
      'point 19 ends a run of 9 points above the centre (we4)',
    ]);
  });

  it('reports an invalid point or σ by its position, far into the series too', () => {
    const points = rep(0.5, 5000);
    points[3000] = Number.NaN;
    expect(() => evaluateRules(points, 0, 1, 'nelson')).toThrow('point 3001 is not a finite number');
    const sigmas = rep(1, 5000);
    sigmas[4000] = -1;
    expect(() => evaluateRules(rep(0.5, 5000), 0, sigmas, 'nelson')).toThrow('sigma for point 4001 must be a finite number of at least 0');
    // At the same point the value is checked before its σ.
    expect(() => evaluateRules([1, Number.NaN], 0, [1, -1])).toThrow('point 2 is not a finite number');
  });
});

describe('evaluateRules: rule lists', () => {
  it('keeps the order of a custom list at each point, repeats included', () => {
    const sut = evaluateRules(rep(0.5, 10), 0, 1, ['nelson2', 'we4', 'we4']);
    expect(sut.map((s) => `${s.rule}@${s.index}`)).toEqual([
      'we4@7',
      'we4@7',
      'nelson2@8',
      'we4@8',
      'we4@8',
      'nelson2@9',
      'we4@9',
      'we4@9',
    ]);
    expect(sut.at(-1)?.message).toBe('point 10 ends a run of 10 points above the centre (we4)');
  });

  it('does not count the empty start as points outside 1σ', () => {
    expect(fired([1.5, -1.5, 2, -2, 1.2, -1.2, 1.5], 'nelson8')).toEqual([]);
    expect(fired([1.5, -1.5, 2, -2, 1.2, -1.2, 1.5, -1.5], 'nelson8')).toEqual([7]); // Nelson test 8
  });

  it('evaluates no rules to no signals but still checks the points', () => {
    expect(evaluateRules([0, 5, -5], 0, 1, [])).toEqual([]);
    expect(() => evaluateRules([0, Number.POSITIVE_INFINITY], 0, 1, [])).toThrow('point 2 is not a finite number');
  });
});

describe('evaluateRules: scale', () => {
  it('runs every rule over 10^6 points in one pass', () => {
    const points = normals(1_000_000, 7);
    const we = evaluateRules(points, 0, 1, 'western-electric');
    const nelson = evaluateRules(points, 0, 1, 'nelson');
    // P(|Z| > 3) = 0.0027 (normal table), so about 2700 rule-1 signals; ±300 is about 6 s.d.
    const rule1 = we.filter((s) => s.rule === 'we1').length;
    expect(rule1).toBeGreaterThan(2400);
    expect(rule1).toBeLessThan(3000);
    expect(nelson.filter((s) => s.rule === 'nelson1').length).toBe(rule1);
  });
});

describe('limitSignals', () => {
  it('flags points strictly outside asymmetric limits', () => {
    const sut = limitSignals([0.01, 0.05, 0.049, 0], 0.049, 0, 'we1');
    expect(sut.map((s) => s.index)).toEqual([1]);
    expect(limitSignals([1, 2, 9], 8, 0, 'we1', 1).map((s) => s.index)).toEqual([3]);
  });
});
