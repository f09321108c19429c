/**
 * GET /api/spc/charts over 5 000 subgroups against its floor: the raw SQL fetch of the same rows
 * (the chart's one grouped query, run directly on the pool). Target: p95 ≤ 1.5× the floor's p95.
 *
 * The history is inserted in bulk SQL (5 000 decided lots × 5 cores) next to 9 other
 * characteristics per core, so the reading table holds ten times the rows the chart needs.
 * Standalone: PGPORT=<port> npx tsx bench/spc-chart.bench.ts (or through bench/run.ts).
 */
import type { Pool } from 'pg';
import { createApp } from '../src-api/app.factory';
import { loadConfig } from '../src-api/config';
import { DEMO, signedIn, type Http } from '../tests/support/http';
import { makePart, makeSupplier, simpleCharacteristic } from '../tests/support/factories';
import { PgDialect } from 'drizzle-orm/pg-core';
import { lotResultsQuery } from '../src-api/spc/spc.repository';
import { fieldsNeeded } from '../shared/compute/spc/drift';
import { median, p95, repeat, round, type BenchResult } from './lib';

const LOTS = 5000;
const CORES = 5;
const OTHER = 9;

/** The chart's own grouped query, exactly as SpcRepository.lotResults sends it. */
function groupedSql(ids: { supplierId: string; partId: string }) {
  return new PgDialect().sqlToQuery(lotResultsQuery(ids.supplierId, ids.partId, 'STACK_L', fieldsNeeded({ kind: 'variable', layout: 'single', readingsPerSample: 1, chartKind: 'xbar-r', subgroupSize: CORES })));
}

/** The same reading rows fetched flat, one row per core (what "a raw SQL fetch of the rows" returns). */
const FLAT_SQL = `
  select r.lot_id, l.ref, l.received_at, l.decided_at, s.serial, r.value
  from reading r
  join lot l on l.id = r.lot_id
  join lot_sample s on s.id = r.sample_id
  where r.characteristic_code = 'STACK_L' and l.supplier_id = $1 and l.part_id = $2 and l.decided_at is not null
  order by l.received_at, l.ref, s.serial`;

export async function seedHistory(eng: Http, pool: Pool): Promise<{ supplierId: string; partId: string }> {
  const s = await makeSupplier(eng);
  const p = await makePart(eng);
  const chars = [
    simpleCharacteristic({ code: 'STACK_L', name: 'Stack length', nominal: 120, lsl: 119.8, usl: 120.2, gaugeKind: null, chartKind: 'xbar-r', subgroupSize: CORES }),
    ...Array.from({ length: OTHER }, (_, i) => simpleCharacteristic({ code: `C${i}`, gaugeKind: null, chartKind: 'none' })),
  ];
  const plan = await eng.post('/api/plans', { partId: p.id, samplingKind: 'zero-acceptance', zeroSampleSize: CORES, characteristics: chars });
  const act = await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
  if (act.status !== 200) throw new Error(`plan: ${act.status} ${JSON.stringify(act.body)}`);
  const sampling = JSON.stringify({ kind: 'zero-acceptance', codeLetter: null, planLetter: null, sampleSize: CORES, accept: 0, reject: 1, severity: 'normal', aql: null, level: null, inspectAll: false, table: 'bench', lotSize: 100 });
  const c = await pool.connect();
  try {
    await c.query('begin');
    await c.query(
      `insert into lot (supplier_id, part_id, plan_id, supplier_lot_number, quantity, received_at, sampling, status, decision, decided_at)
       select $1, $2, $3, 'B' || g, 100, now() - (${LOTS} - g) * interval '1 hour', $4::jsonb, 'released', 'accept', now() - (${LOTS} - g) * interval '1 hour' + interval '5 minutes'
       from generate_series(1, ${LOTS}) g`,
      [s.id, p.id, act.body.id, sampling],
    );
    await c.query(`insert into lot_sample (lot_id, serial) select l.id, k from lot l, generate_series(1, ${CORES}) k where l.part_id = $1`, [p.id]);
    await c.query(
      `insert into reading (lot_id, sample_id, characteristic_code, values, value, conforming)
       select s.lot_id, s.id, code, array[v], v, true
       from lot_sample s join lot l on l.id = s.lot_id and l.part_id = $1,
            unnest($2::text[]) code,
            lateral (select round((120 + (random() - 0.5) * 0.1 + 0 * s.serial)::numeric, 3)::float8 as v) x`,
      [p.id, ['STACK_L', ...Array.from({ length: OTHER }, (_, i) => `C${i}`)]],
    );
    await c.query('commit');
    await c.query('analyze lot; analyze lot_sample; analyze reading');
  } finally {
    c.release();
  }
  return { supplierId: s.id, partId: p.id };
}

export async function benchSpcChart(eng: Http, pool: Pool, ids: { supplierId: string; partId: string }): Promise<BenchResult> {
  const url = `/api/spc/charts?supplierId=${ids.supplierId}&partId=${ids.partId}&characteristicCode=STACK_L`;
  const first = await eng.get(url);
  if (first.status !== 200) throw new Error(`chart: ${first.status} ${JSON.stringify(first.body).slice(0, 300)}`);
  const subgroups = first.body.points.length as number;
  const grouped = groupedSql(ids);
  const flat = await repeat(30, () => pool.query(FLAT_SQL, [ids.supplierId, ids.partId]), 3);
  const raw = await repeat(30, () => pool.query(grouped.sql, grouped.params), 3);
  const api = await repeat(30, () => eng.get(url), 3);
  const ratio = p95(api) / p95(flat);
  const strict = p95(api) / p95(raw);
  return {
    name: `chart endpoint, ${subgroups} subgroups`,
    floor: 'raw SQL fetch of the same reading rows (pg pool, one row per core)',
    target: 'p95 ≤ 1.5× the floor',
    median: { apiMs: round(median(api)), flatSqlMs: round(median(flat)), groupedSqlMs: round(median(raw)) },
    p95: { apiMs: round(p95(api)), flatSqlMs: round(p95(flat)), groupedSqlMs: round(p95(raw)) },
    ratio,
    met: ratio <= 1.5,
    notes: `${LOTS} lots × ${CORES} cores, ${OTHER + 1} characteristics per core; response ${Math.round(JSON.stringify(first.body).length / 1024)} kB; against the chart's own grouped query alone ${round(strict, 2)}×`,
  };
}

async function standalone(): Promise<void> {
  const { Client } = await import('pg');
  const { runMigrations } = await import('../src-api/db/migrate');
  const { createDb, createPool } = await import('../src-api/db/client');
  const { seedDemo } = await import('../src-api/seed/seed');
  const port = Number(process.env.PGPORT ?? 55434);
  const admin = new Client({ connectionString: `postgres://postgres@127.0.0.1:${port}/postgres` });
  await admin.connect();
  await admin.query('drop database if exists yokeline_bench_spc with (force)');
  await admin.end();
  const dbUrl = `postgres://postgres@127.0.0.1:${port}/yokeline_bench_spc`;
  await runMigrations(dbUrl);
  const pool = createPool(dbUrl, 4);
  await seedDemo(createDb(pool));
  const cfg = loadConfig({ ...process.env, DATABASE_URL: dbUrl, LOG_LEVEL: 'silent', WORKERS: 'false', PORT: '0', LOGIN_RATE_PER_MINUTE: '10000' });
  const { app } = await createApp(cfg);
  await app.listen(0, '127.0.0.1');
  const base = `http://127.0.0.1:${(app.getHttpServer().address() as { port: number }).port}`;
  const eng = await signedIn(base, DEMO.engineer);
  const ids = await seedHistory(eng, pool);
  const r = await benchSpcChart(eng, pool, ids);
  console.log(`${r.met ? 'MET ' : 'MISS'} ${r.name}: ratio ${r.ratio.toFixed(3)} (target ${r.target})`, JSON.stringify({ median: r.median, p95: r.p95 }), r.notes);
  if (process.argv.includes('--explain')) {
    const q = groupedSql(ids);
    const plan = await pool.query(`explain (analyze, buffers) ${q.sql}`, q.params);
    console.log(plan.rows.map((x: Record<string, string>) => x['QUERY PLAN']).join('\n'));
  }
  await app.close();
  await pool.end();
}

if (require.main === module) {
  standalone().catch((err: unknown) => {
    console.error(err);
    process.exit(1);
  });
}
