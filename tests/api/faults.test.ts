import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import sharp from 'sharp';
import { Client } from 'pg';
import { runMigrations } from '../../src-api/db/migrate';
import { seedDemo } from '../../src-api/seed/seed';
import { createDb, createPool } from '../../src-api/db/client';
import { spawnApi, startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { makeActivePlan, makePart, makeSupplier } from '../support/factories';

const root = path.resolve(__dirname, '../..');
// A cluster of its own, so stopping it does not disturb the other test files.
const FAULT_PG_PORT = Number(process.env.FAULT_PGPORT ?? 55499);
const pg = (cmd: 'start' | 'stop' | 'destroy') =>
  execFileSync(path.join(root, 'scripts/pg.sh'), [cmd, 'fault'], { env: { ...process.env, PGPORT: String(FAULT_PG_PORT) }, stdio: 'pipe' });

describe('PostgreSQL restarted under load', () => {
  const url = `postgres://postgres@127.0.0.1:${FAULT_PG_PORT}/yokeline`;
  let api: { url: string; close: () => Promise<void> };

  beforeAll(async () => {
    pg('start');
    await runMigrations(url);
    const pool = createPool(url, 2);
    await seedDemo(createDb(pool));
    await pool.end();
    api = await spawnApi(url);
  }, 60_000);
  afterAll(async () => {
    await api?.close();
    pg('destroy');
  });

  it('reports 503 during the outage, recovers by itself, and leaves no partial write', async () => {
    const eng = await signedIn(api.url, DEMO.engineer);
    const s = await makeSupplier(eng);
    const p = await makePart(eng);
    await makeActivePlan(eng, p.id);
    let stop = false;
    const outcomes: number[] = [];
    const load = (async () => {
      let i = 0;
      while (!stop && i < 400) {
        i++;
        const r = await eng.post('/api/lots', { supplierId: s.id, partId: p.id, supplierLotNumber: `LOAD-${i}`, quantity: 500 }).catch(() => ({ status: 0 }));
        outcomes.push(r.status);
      }
    })();
    await new Promise((r) => setTimeout(r, 400));
    pg('stop');
    const during = await new Http(api.url).get('/api/health');
    expect(during.status).toBe(503);
    expect(during.body).toEqual({ status: 'degraded', db: 'down' });
    await new Promise((r) => setTimeout(r, 500));
    pg('start');
    let after = 0;
    for (let i = 0; i < 50 && after !== 200; i++) {
      after = (await new Http(api.url).get('/api/health')).status;
      if (after !== 200) await new Promise((r) => setTimeout(r, 200));
    }
    expect(after).toBe(200);
    stop = true;
    await load;
    expect(outcomes.filter((x) => x === 201).length).toBeGreaterThan(0);
    expect(outcomes.filter((x) => x >= 500 && x !== 503)).toEqual([]);
    // Sessions live in PostgreSQL too: the same sign-in works after the restart.
    expect((await eng.get('/api/auth/me')).status).toBe(200);
    const c = new Client({ connectionString: url });
    await c.connect();
    try {
      // Every lot that exists has all its sampled cores and its audit event: none is half written.
      const broken = await c.query(`select l.id from lot l left join lot_sample s on s.lot_id = l.id group by l.id, l.sampling having count(s.id) <> (l.sampling->>'sampleSize')::int`);
      expect(broken.rows).toEqual([]);
      const unaudited = await c.query(`select l.id from lot l where not exists (select 1 from audit_event a where a.entity = 'lot' and a.entity_id = l.id::text and a.action = 'lot.received')`);
      expect(unaudited.rows).toEqual([]);
    } finally {
      await c.end();
    }
  }, 60_000);
});

describe('object storage down', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t?.close();
  });

  it('answers 503 to an upload and leaves no orphan row', async () => {
    const down = await t.another({ S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const eng = await signedIn(down.url, DEMO.engineer);
      const s = await makeSupplier(eng);
      const p = await makePart(eng);
      await makeActivePlan(eng, p.id);
      const l = await eng.post('/api/lots', { supplierId: s.id, partId: p.id, supplierLotNumber: 'S3-DOWN', quantity: 10 });
      const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#777' } }).jpeg().toBuffer();
      const form = new FormData();
      form.append('file', new Blob([jpeg], { type: 'image/jpeg' }), 'core.jpg');
      const r = await eng.post(`/api/lots/${l.body.id}/photos`, form);
      expect(r.status).toBe(503);
      expect(r.body.error).toBe('unavailable');
      const rows = await t.pool.query('select count(*) as n from photo where lot_id = $1', [l.body.id]);
      expect(Number(rows.rows[0].n)).toBe(0);
    } finally {
      await down.close();
    }
  }, 60_000);
});
