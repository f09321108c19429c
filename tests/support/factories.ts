import type { Http } from './http';

let n = 0;
const uniq = () => `${Date.now().toString(36)}${(n++).toString(36)}`.toUpperCase();

/** Factories with overrides: each call makes a distinct record through the real API. */
export async function makeSupplier(h: Http, over: Record<string, unknown> = {}) {
  const r = await h.post('/api/suppliers', { code: `S${uniq()}`.slice(0, 16), name: 'Test Stamping Ltd', contactEmails: ['qa@test-stamping.test'], ...over });
  if (r.status !== 201) throw new Error(`makeSupplier: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

export const weldedPart = (over: Record<string, unknown> = {}) => ({
  partNumber: `SC-${uniq()}`,
  revision: 'A',
  description: '48-slot welded stator core, OD 240',
  construction: 'welded',
  steelGrade: 'M400-50A',
  laminationThicknessMm: 0.5,
  laminationAreaCm2: 245.0,
  nominalBoreMm: 150,
  nominalOdMm: 240,
  nominalStackLengthMm: 120,
  slotCount: 48,
  nominalMassKg: 22.4,
  designStackingFactor: 0.97,
  designToothT: 1.7,
  designYokeT: 1.45,
  ...over,
});

export async function makePart(h: Http, over: Record<string, unknown> = {}) {
  const r = await h.post('/api/parts', weldedPart(over));
  if (r.status !== 201) throw new Error(`makePart: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

export async function makeGauge(h: Http, over: Record<string, unknown> = {}) {
  const due = new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10);
  const r = await h.post('/api/gauges', { assetTag: `G-${uniq()}`.slice(0, 24), kind: 'bore-gauge', description: 'Air bore gauge 150 mm', resolution: 0.001, unit: 'mm', calibrationDueOn: due, ...over });
  if (r.status !== 201) throw new Error(`makeGauge: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

export const simpleCharacteristic = (over: Record<string, unknown> = {}) => ({
  code: 'BORE',
  name: 'Bore diameter',
  kind: 'variable',
  unit: 'mm',
  nominal: 150,
  lsl: 149.95,
  usl: 150.05,
  layout: 'single',
  readingsPerSample: 1,
  gaugeKind: 'bore-gauge',
  chartKind: 'xbar-r',
  severity: 'major',
  ...over,
});

export async function makeActivePlan(h: Http, partId: string, over: Record<string, unknown> = {}) {
  const r = await h.post('/api/plans', { partId, samplingKind: 'aql', inspectionLevel: 'II', aql: 1.0, characteristics: [simpleCharacteristic()], ...over });
  if (r.status !== 201) throw new Error(`makePlan: ${r.status} ${JSON.stringify(r.body)}`);
  const a = await h.post(`/api/plans/${r.body.id}/activate`, { version: r.body.version });
  if (a.status !== 200) throw new Error(`activate: ${a.status} ${JSON.stringify(a.body)}`);
  return a.body;
}
