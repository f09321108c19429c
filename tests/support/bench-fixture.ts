import { expect } from 'vitest';
import type { Http } from './http';
import { makeGauge, makePart } from './factories';

export const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1000)}`.toUpperCase();

/** A plan the bench sheet can be driven through quickly: one bore, four burr readings, one paperwork check. */
export const BENCH_CHARACTERISTICS = [
  { code: 'BORE', name: 'Bore diameter', kind: 'variable', unit: 'mm', nominal: 150, lsl: 149.95, usl: 150.05, layout: 'single', readingsPerSample: 1, gaugeKind: 'bore-gauge', chartKind: 'none', severity: 'major' },
  { code: 'BURR', name: 'Burr height at the slot', kind: 'variable', unit: 'µm', nominal: null, lsl: null, usl: 25, layout: 'single', readingsPerSample: 4, gaugeKind: 'burr-gauge', chartKind: 'none', severity: 'major' },
  { code: 'PAPERS', name: 'Certificate matches heat numbers', kind: 'attribute', layout: 'pass-fail', readingsPerSample: 1, chartKind: 'none', severity: 'major' },
];

export interface BenchFixture {
  supplierId: string;
  partId: string;
  partLabel: string;
  boreTag: string;
  burrTag: string;
}

/**
 * Through the API as the engineer: a new part with the bench plan active (level S-2, AQL 4.0: a
 * lot of 10 samples 3 cores, Ac 0 / Re 1, ISO 2859-1 Tables 1 and 2-A, code letter A → plan B),
 * one calibrated bore and one burr gauge, and the demo supplier Northgate.
 */
export async function benchFixture(eng: Http, opts: { partPrefix: string; description: string; tagPrefix: [string, string] }): Promise<BenchFixture> {
  const part = await makePart(eng, { partNumber: `${opts.partPrefix}-${stamp()}`, description: opts.description });
  const plan = await eng.post('/api/plans', { partId: part.id, samplingKind: 'aql', inspectionLevel: 'S-2', aql: 4.0, characteristics: BENCH_CHARACTERISTICS });
  expect(plan.status).toBe(201);
  expect((await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version })).status).toBe(200);
  const boreTag = `${opts.tagPrefix[0]}-${stamp()}`;
  const burrTag = `${opts.tagPrefix[1]}-${stamp()}`;
  await makeGauge(eng, { assetTag: boreTag, kind: 'bore-gauge' });
  await makeGauge(eng, { assetTag: burrTag, kind: 'burr-gauge', unit: 'µm', resolution: 1, description: 'Burr height gauge' });
  const suppliers = await eng.get('/api/suppliers?pageSize=200');
  const supplierId = (suppliers.body.items as { id: string; code: string }[]).find((x) => x.code === 'NGL')!.id;
  return { supplierId, partId: part.id, partLabel: `${part.partNumber} rev ${part.revision}`, boreTag, burrTag };
}
