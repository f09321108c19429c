/** Small helpers shared by the benchmarks: timing, percentiles, results on file. */
import fs from 'node:fs';
import path from 'node:path';

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function p95(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(0.95 * s.length) - 1)];
}

export async function timed<T>(fn: () => Promise<T> | T): Promise<{ ms: number; value: T }> {
  const t0 = process.hrtime.bigint();
  const value = await fn();
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, value };
}

/** Runs `fn` `runs` times after `warmup` unmeasured runs; returns the times in ms. */
export async function repeat(runs: number, fn: (i: number) => Promise<unknown> | unknown, warmup = 1): Promise<number[]> {
  for (let i = 0; i < warmup; i++) await fn(-1 - i);
  const out: number[] = [];
  for (let i = 0; i < runs; i++) out.push((await timed(() => fn(i))).ms);
  return out;
}

/**
 * Times two pieces of work in alternation (A B, then B A, …) after a warm-up of each, so that a
 * shared machine's drifting load falls on both alike; returns the times of each in ms.
 */
export async function alternate(runs: number, a: () => Promise<unknown> | unknown, b: () => Promise<unknown> | unknown): Promise<{ a: number[]; b: number[] }> {
  await a();
  await b();
  const out = { a: [] as number[], b: [] as number[] };
  for (let i = 0; i < runs; i++) {
    if (i % 2 === 0) {
      out.a.push((await timed(a)).ms);
      out.b.push((await timed(b)).ms);
    } else {
      out.b.push((await timed(b)).ms);
      out.a.push((await timed(a)).ms);
    }
  }
  return out;
}

export interface BenchResult {
  name: string;
  floor: string;
  target: string;
  median: Record<string, number>;
  p95: Record<string, number>;
  ratio: number;
  met: boolean;
  notes?: string;
  extra?: Record<string, unknown>;
}

export const round = (x: number, d = 3) => Math.round(x * 10 ** d) / 10 ** d;

export function writeResults(results: BenchResult[], meta: Record<string, unknown>): string {
  const dir = path.resolve(__dirname, '../../../bench/results');
  fs.mkdirSync(dir, { recursive: true });
  const stamp = new Date().toISOString().replace(/[:.]/g, '-');
  const file = path.join(dir, `${stamp.slice(0, 19)}.json`);
  fs.writeFileSync(file, JSON.stringify({ ...meta, at: new Date().toISOString(), results }, null, 2));
  const lines = results.map((r) => `${r.met ? 'MET ' : 'MISS'}  ${r.name.padEnd(44)} ratio ${String(round(r.ratio, 3)).padEnd(8)} target ${r.target}${r.notes ? `  (${r.notes})` : ''}`);
  fs.writeFileSync(path.join(dir, `${stamp.slice(0, 19)}.txt`), `${lines.join('\n')}\n`);
  return file;
}
