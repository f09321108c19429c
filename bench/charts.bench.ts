/**
 * The chart endpoint over 5 000 subgroups of 5 against a raw SQL fetch of the same rows; the same
 * endpoint with 10⁷ unrelated readings in the table against 10⁵; and the Dock list and chart
 * under autocannon load against /api/health.
 */
import type { Pool } from 'pg';
import autocannon from 'autocannon';
import { median, p95, repeat, round, type BenchResult } from './lib';
import type { Http } from '../tests/support/http';
import { makePart, makeSupplier, simpleCharacteristic } from '../tests/support/factories';

export interface ChartFixture {
  supplierId: string;
  partId: string;
  url: string;
}

/** 5 000 decided lots of 5 cores, one reading each, written in bulk with SQL. */
export async function chartFixture(h: Http, pool: Pool, lots = 5000): Promise<ChartFixture> {
  const s = await makeSupplier(h);
  const p = await makePart(h);
  const plan = await h.post('/api/plans', { partId: p.id, samplingKind: 'zero-acceptance', zeroSampleSize: 5, characteristics: [simpleCharacteristic({ code: 'X', gaugeKind: null, chartKind: 'xbar-r' })] });
  await h.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
  await pool.query(
    `with l as (
       insert into lot (supplier_id, part_id, plan_id, supplier_lot_number, quantity, received_at, sampling, status, decision, decided_at)
       select $1, $2, $3, 'B-' || g, 100, now() - (($4 - g) || ' hours')::interval,
              '{"kind":"zero-acceptance","codeLetter":null,"planLetter":null,"sampleSize":5,"accept":0,"reject":1,"severity":"normal","aql":null,"level":null,"inspectAll":false,"table":"bench","lotSize":100}'::jsonb,
              'released', 'accept', now() - (($4 - g) || ' hours')::interval + interval '1 hour'
       from generate_series(1, $4) g returning id),
     s as (insert into lot_sample (lot_id, serial) select l.id, k from l, generate_series(1, 5) k returning id, lot_id)
     insert into reading (lot_id, sample_id, characteristic_code, values, value, conforming)
     select s.lot_id, s.id, 'X', array[v], v, true from (select s.*, 150 + (random() - 0.5) * 0.04 as v from s) s`,
    [s.id, p.id, plan.body.id, lots],
  );
  return { supplierId: s.id, partId: p.id, url: `/api/spc/charts?partId=${p.id}&characteristicCode=X&supplierId=${s.id}` };
}

const RAW = `select r.lot_id, l.ref, l.received_at, s.serial, r.value, r.values, r.conforming
  from reading r join lot l on l.id = r.lot_id join lot_sample s on s.id = r.sample_id
  where r.characteristic_code = 'X' and l.supplier_id = $1 and l.part_id = $2 and l.decided_at is not null
  order by l.received_at, s.serial`;

async function timeBoth(h: Http, pool: Pool, f: ChartFixture, runs: number) {
  const api = await repeat(runs, async () => {
    const r = await h.get(f.url);
    if (r.status !== 200) throw new Error(`chart: ${r.status} ${JSON.stringify(r.body).slice(0, 200)}`);
  }, 2);
  const raw = await repeat(runs, () => pool.query(RAW, [f.supplierId, f.partId]), 2);
  return { api, raw };
}

export async function benchChart(h: Http, pool: Pool, f: ChartFixture): Promise<BenchResult> {
  const { api, raw } = await timeBoth(h, pool, f, 20);
  const ratio = p95(api) / p95(raw);
  return {
    name: 'chart endpoint, 5 000 subgroups of 5',
    floor: 'raw SQL fetch of the same 25 000 rows over pg',
    target: 'p95 ≤ 1.5×',
    median: { apiMs: round(median(api)), rawMs: round(median(raw)) },
    p95: { apiMs: round(p95(api)), rawMs: round(p95(raw)) },
    ratio,
    met: ratio <= 1.5,
    notes: 'the endpoint also judges every point against its limits, runs the rules, capability and the histogram',
  };
}

/** Grows the reading table with unrelated readings and times the same chart. */
export async function benchChartFlat(h: Http, pool: Pool, f: ChartFixture, bigRows: number): Promise<BenchResult> {
  const other = await chartFixture(h, pool, 1);
  const { rows } = await pool.query<{ id: string; lot_id: string }>(`select s.id, s.lot_id from lot_sample s join lot l on l.id = s.lot_id where l.part_id = $1 limit 1`, [other.partId]);
  const total = async (): Promise<number> => Number((await pool.query<{ n: string }>('select count(*) as n from reading')).rows[0].n);
  // Unrelated readings (other characteristic codes on another part's core), in 10⁶-row steps,
  // until the table holds `upTo` readings in all.
  let next = 0;
  const growTo = async (upTo: number): Promise<void> => {
    for (let have = await total(); have < upTo; have = await total()) {
      const add = Math.min(1_000_000, upTo - have);
      await pool.query(
        `insert into reading (lot_id, sample_id, characteristic_code, values, value) select $1, $2, 'Z' || g, '{1}', 1 from generate_series($3::int, $4::int) g`,
        [rows[0].lot_id, rows[0].id, next, next + add - 1],
      );
      next += add;
    }
    await pool.query('vacuum analyze reading');
  };
  await growTo(100_000);
  const smallRows = await total();
  const small = await timeBoth(h, pool, f, 20);
  await growTo(bigRows);
  const bigCount = await total();
  const big = await timeBoth(h, pool, f, 20);
  const ratio = p95(big.api) / p95(small.api);
  return {
    name: `chart endpoint with ${bigRows.toExponential(0)} readings in the table`,
    floor: 'the same query with 10⁵ readings',
    target: 'p95 ≤ 1.5× (flat)',
    median: { smallMs: round(median(small.api)), bigMs: round(median(big.api)), smallRawMs: round(median(small.raw)), bigRawMs: round(median(big.raw)), smallRows, bigRows: bigCount },
    p95: { smallMs: round(p95(small.api)), bigMs: round(p95(big.api)) },
    ratio,
    met: ratio <= 1.5,
  };
}

async function load(url: string, cookie: string, connections: number): Promise<{ p95: number; errors: number; non2xx: number; rps: number }> {
  const r = await autocannon({ url, connections, duration: 5, headers: { cookie } });
  return { p95: r.latency.p97_5 ?? r.latency.p99, errors: r.errors + r.timeouts, non2xx: r.non2xx, rps: r.requests.average };
}

export async function benchLoad(base: string, h: Http, f: ChartFixture): Promise<BenchResult> {
  const cookie = h.cookieHeader();
  const out: Record<string, number> = {};
  let errors = 0;
  let worst = 0;
  for (const c of [10, 50]) {
    const health = await load(`${base}/api/health`, cookie, c);
    const dock = await load(`${base}/api/lots?status=waiting`, cookie, c);
    const chart = await load(`${base}${f.url}`, cookie, c);
    out[`health_c${c}_p97_5ms`] = health.p95;
    out[`dock_c${c}_p97_5ms`] = dock.p95;
    out[`chart_c${c}_p97_5ms`] = chart.p95;
    out[`dock_c${c}_rps`] = Math.round(dock.rps);
    errors += health.errors + dock.errors + chart.errors + dock.non2xx + chart.non2xx;
    worst = Math.max(worst, dock.p95 / Math.max(1, health.p95));
  }
  return {
    name: 'Dock list and chart under load (10 and 50 connections)',
    floor: '/api/health under the same load',
    target: 'p95 ratio reported; no errors',
    median: out,
    p95: {},
    ratio: worst,
    met: errors === 0,
    notes: 'autocannon reports p97.5, used here as the p95 figure; the chart is 5 000 subgroups',
  };
}
