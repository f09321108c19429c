/**
 * make bench: every benchmark on its own database (the bench profile), results to
 * bench/results/<date>.json and .txt. Not part of make test. Each figure is a ratio to its floor
 * measured in the same run, since this machine is shared and absolute times drift.
 */
import { Client } from 'pg';
import { createApp } from '../src-api/app.factory';
import { loadConfig } from '../src-api/config';
import { createDb, createPool } from '../src-api/db/client';
import { runMigrations } from '../src-api/db/migrate';
import { seedDemo } from '../src-api/seed/seed';
import { DEMO, signedIn } from '../tests/support/http';
import { makePart, makeSupplier, simpleCharacteristic } from '../tests/support/factories';
import { writeResults, type BenchResult } from './lib';
import { benchAnalyze } from './analyze.bench';
import { benchPhoto } from './photo.bench';
import { benchImport } from './import.bench';
import { benchBundle } from './bundle.bench';
import { benchChart, benchChartFlat, benchLoad, chartFixture } from './charts.bench';
import { benchDecision } from './decision.bench';

const PGPORT = Number(process.env.PGPORT ?? 55434);
const only = process.argv.slice(2);
const want = (name: string) => only.length === 0 || only.includes(name);

async function freshDb(name: string): Promise<string> {
  const admin = new Client({ connectionString: `postgres://postgres@127.0.0.1:${PGPORT}/postgres` });
  await admin.connect();
  await admin.query(`drop database if exists ${name} with (force)`);
  await admin.end();
  const url = `postgres://postgres@127.0.0.1:${PGPORT}/${name}`;
  await runMigrations(url);
  return url;
}

async function main(): Promise<void> {
  const results: BenchResult[] = [];
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
  const log = (r: BenchResult) => {
    results.push(r);
    console.log(`${r.met ? 'MET ' : 'MISS'} ${r.name}: ratio ${r.ratio.toFixed(3)} (target ${r.target})`, JSON.stringify(r.median));
  };
  if (want('analyze')) log(await benchAnalyze());
  if (want('photo')) log(await benchPhoto());
  const server = ['import', 'bundle', 'charts', 'load', 'decision', 'flat'].some(want);
  if (server) {
    console.log('· fresh bench database, demo scenario');
    const url = await freshDb('yokeline_bench');
    const pool = createPool(url, 4);
    await seedDemo(createDb(pool));
    const cfg = loadConfig({ ...process.env, DATABASE_URL: url, LOG_LEVEL: 'silent', WORKERS: 'false', PORT: '0', UPLOAD_RATE_PER_MINUTE: '10000', LOGIN_RATE_PER_MINUTE: '10000' });
    const { app } = await createApp(cfg);
    await app.listen(0, '127.0.0.1');
    const base = `http://127.0.0.1:${(app.getHttpServer().address() as { port: number }).port}`;
    const eng = await signedIn(base, DEMO.engineer);
    if (want('bundle')) log(await benchBundle(base));
    if (want('import')) {
      const s = await makeSupplier(eng);
      const p = await makePart(eng);
      const chars = Array.from({ length: 50 }, (_, i) => simpleCharacteristic({ code: `C${i}`, gaugeKind: null, chartKind: 'none' }));
      const plan = await eng.post('/api/plans', { partId: p.id, samplingKind: 'zero-acceptance', zeroSampleSize: 2000, characteristics: chars });
      await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
      log(await benchImport(eng, pool, { supplierId: s.id, partId: p.id }));
    }
    if (want('charts') || want('load') || want('decision') || want('flat')) {
      console.log('· 5 000 decided lots for the chart benchmarks');
      const f = await chartFixture(eng, pool);
      if (want('charts')) log(await benchChart(eng, pool, f));
      if (want('load')) log(await benchLoad(base, eng, f));
      if (want('decision')) log(await benchDecision(url, eng, f, pool));
      // 10⁷ readings take minutes and ~2 GB of disk: only when asked for by name.
      if (only.includes('flat')) log(await benchChartFlat(eng, pool, f, Number(process.env.BENCH_BIG_ROWS ?? 10_000_000)));
    }
    await app.close();
    await pool.end();
  }
  clearInterval(sampler);
  const file = writeResults(results, { peakRssMB: Math.round(peakRss / 1048576), node: process.version });
  console.log(`Peak memory (this process, which ran the API in-process): ${Math.round(peakRss / 1048576)} MB`);
  console.log(`Results: ${file}`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
