import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, signedIn } from '../support/http';
import { makePart, makeSupplier, simpleCharacteristic } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('concurrent readings', () => {
  it('20 clients × 1 000 readings at once → exactly 20 000 stored, one audit event each', async () => {
    const eng = await signedIn(t.url, DEMO.engineer);
    const s = await makeSupplier(eng);
    const p = await makePart(eng);
    const chars = Array.from({ length: 10 }, (_, i) => simpleCharacteristic({ code: `C${i}`, gaugeKind: null, chartKind: 'none' }));
    const plan = await eng.post('/api/plans', { partId: p.id, samplingKind: 'zero-acceptance', zeroSampleSize: 2000, characteristics: chars });
    expect((await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version })).status).toBe(200);
    const lot = await eng.post('/api/lots', { supplierId: s.id, partId: p.id, supplierLotNumber: 'CONC-1', quantity: 2000 });
    expect(lot.body.samples).toHaveLength(2000);
    const clients = await Promise.all(Array.from({ length: 20 }, (_, i) => signedIn(t.url, i % 2 ? DEMO.inspector : DEMO.engineer)));
    const results = await Promise.all(
      clients.map((c, k) => {
        const mine = lot.body.samples.slice(k * 100, (k + 1) * 100);
        const readings = mine.flatMap((smp: { id: string }) => chars.map((ch) => ({ sampleId: smp.id, characteristicCode: ch.code, values: [150 + (k % 5) * 0.001] })));
        return c.put(`/api/lots/${lot.body.id}/readings`, { readings });
      }),
    );
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(200));
    const n = await t.pool.query('select count(*) as n from reading where lot_id = $1', [lot.body.id]);
    expect(Number(n.rows[0].n)).toBe(20_000);
    const ev = await t.pool.query(`select count(*) as n from audit_event where entity_id = $1 and action = 'lot.readings_saved'`, [lot.body.id]);
    expect(Number(ev.rows[0].n)).toBe(20);
  }, 120_000);
});
