import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, type Http, signedIn } from '../support/http';
import { makeSupplier } from '../support/factories';

let t: TestApp;
let eng: Http;
let aud: Http;
beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  aud = await signedIn(t.url, DEMO.auditor);
});
afterAll(async () => {
  await t?.close();
});

describe('audit history', () => {
  it('refuses UPDATE, DELETE and TRUNCATE through the application connection', async () => {
    await makeSupplier(eng);
    await expect(t.pool.query(`update audit_event set reason = 'edited' where id = (select max(id) from audit_event)`)).rejects.toThrow(/append-only/);
    await expect(t.pool.query(`delete from audit_event`)).rejects.toThrow(/append-only/);
    await expect(t.pool.query(`truncate audit_event`)).rejects.toThrow(/append-only/);
  });

  it('verifies an intact chain and names the first row altered behind the trigger’s back', async () => {
    for (let i = 0; i < 3; i++) await makeSupplier(eng);
    const ok = await aud.get('/api/audit-events/verify');
    expect(ok.body.ok).toBe(true);
    expect(ok.body.count).toBeGreaterThan(3);
    const { rows } = await t.pool.query<{ id: string }>(`select id from audit_event where action = 'supplier.created' order by id limit 1 offset 1`);
    const id = Number(rows[0].id);
    const c = await t.pool.connect();
    try {
      // A superuser switching the trigger off, as a tamperer with database access would.
      await c.query('begin');
      await c.query('alter table audit_event disable trigger audit_event_no_update_delete');
      await c.query(`update audit_event set after = jsonb_set(after, '{name}', '"Quietly renamed"') where id = $1`, [id]);
      await c.query('alter table audit_event enable trigger audit_event_no_update_delete');
      await c.query('commit');
    } finally {
      c.release();
    }
    const broken = await aud.get('/api/audit-events/verify');
    expect(broken.body).toMatchObject({ ok: false, firstBrokenId: id });
  });

  it('keeps one chain under concurrent writers', async () => {
    const writers = await Promise.all(Array.from({ length: 4 }, () => signedIn(t.url, DEMO.engineer)));
    await Promise.all(Array.from({ length: 20 }, (_, i) => makeSupplier(writers[i % 4])));
    const { rows } = await t.pool.query<{ n: string; d: string }>(`select count(*) as n, count(distinct prev_hash) as d from audit_event where id > (select min(id) from audit_event where action = 'supplier.created')`);
    // Every row links to a different predecessor: no fork.
    expect(Number(rows[0].d)).toBe(Number(rows[0].n));
  });

  it('lists with filters for auditors and refuses inspectors', async () => {
    const s = await makeSupplier(eng, { name: 'Filterable Stampings' });
    const r = await aud.get(`/api/audit-events?entity=supplier&entityId=${s.id}`);
    expect(r.status).toBe(200);
    expect(r.body.items).toHaveLength(1);
    expect(r.body.items[0]).toMatchObject({ action: 'supplier.created', actorEmail: DEMO.engineer });
    const bad = await aud.get('/api/audit-events?from=2026-12-01T00:00:00Z&to=2026-01-01T00:00:00Z');
    expect(bad.status).toBe(400);
    const unknown = await aud.get('/api/audit-events?colour=red');
    expect(unknown.status).toBe(400);
    const insp = await signedIn(t.url, DEMO.inspector);
    expect((await insp.get('/api/audit-events')).status).toBe(403);
  });
});
