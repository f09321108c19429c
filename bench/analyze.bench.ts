/** Run rules over 10⁶ points against one plain pass summing the array; and growth from 10⁴ to 10⁶. */
import { evaluateRules, RULE_SETS, type RuleId } from '../shared/compute/spc/rules';
import { Random } from '../src-api/seed/random';
import { median, p95, repeat, round, type BenchResult } from './lib';

function series(n: number): Float64Array {
  const r = new Random(7);
  const a = new Float64Array(n);
  for (let i = 0; i < n; i++) a[i] = r.normal(10, 1);
  return a;
}

/** Every rule of both sets (the shared "beyond 3σ", "2 of 3", … once each): one pass. */
const ALL_RULES: readonly RuleId[] = [...new Set<RuleId>([...RULE_SETS['western-electric'], ...RULE_SETS.nelson])];

export async function benchAnalyze(): Promise<BenchResult> {
  const sizes = [10_000, 100_000, 1_000_000];
  const perSize: Record<string, number> = {};
  let ruleTimes: number[] = [];
  let sumTimes: number[] = [];
  let bySetTimes: number[] = [];
  let signals = 0;
  for (const n of sizes) {
    const xs = Array.from(series(n));
    const t = await repeat(n === 1_000_000 ? 9 : 15, () => {
      signals = evaluateRules(xs, 10, 1, ALL_RULES).length;
    });
    perSize[`n${n}`] = median(t);
    if (n === 1_000_000) {
      ruleTimes = t;
      // The same rules asked for as two rule sets, one call (one pass) each.
      bySetTimes = await repeat(9, () => {
        evaluateRules(xs, 10, 1, 'western-electric');
        evaluateRules(xs, 10, 1, 'nelson');
      });
      sumTimes = await repeat(15, () => {
        let s = 0;
        for (let i = 0; i < xs.length; i++) s += xs[i];
        return s;
      });
    }
  }
  const ratio = median(ruleTimes) / median(sumTimes);
  const growth = perSize.n1000000 / perSize.n10000;
  return {
    name: 'analyse 10⁶ points, all run rules',
    floor: 'one plain pass summing the array',
    target: '≤ 10× and linear in n',
    median: { rulesMs: round(median(ruleTimes)), twoSetsMs: round(median(bySetTimes)), sumMs: round(median(sumTimes)), signals, ...Object.fromEntries(Object.entries(perSize).map(([k, v]) => [`rules_${k}_ms`, round(v)])) },
    p95: { rulesMs: round(p95(ruleTimes)), sumMs: round(p95(sumTimes)) },
    ratio,
    met: ratio <= 10 && growth < 100 * 1.5,
    notes: `all ${ALL_RULES.length} rules in one call; as two rule-set calls ${round(median(bySetTimes) / median(sumTimes), 1)}×; 10⁴→10⁶ time grew ${round(growth, 1)}× for 100× the points`,
  };
}
