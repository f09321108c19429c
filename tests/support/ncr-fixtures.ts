/** Fixtures for the nonconformance and corrective-action tests: lots decided through the real API. */
import { makeActivePlan, makeGauge, makePart, makeSupplier } from './factories';
import type { Http } from './http';

export const SIGN = { password: 'yokeline-demo', meaning: 'I approve this disposition' } as const;
export const COSIGN_MEANING = 'I concur with this concession as second engineer';

let n = 0;
const uniq = () => `${Date.now().toString(36)}-${(n++).toString(36)}`.toUpperCase();

function must<T>(r: { status: number; body: T }, status: number, what: string): T {
  if (r.status !== status) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

export async function supplierIdOf(h: Http, code: string): Promise<string> {
  const r = await h.get(`/api/suppliers?q=${code}`);
  const s = (r.body.items as { id: string; code: string }[]).find((x) => x.code === code);
  if (!s) throw new Error(`no supplier ${code}`);
  return s.id;
}

/** A part with an active plan that measures the bore (149.95–150.05 mm), and a bore gauge. */
export async function partWithBorePlan(eng: Http): Promise<{ partId: string; gaugeId: string }> {
  const part = await makePart(eng);
  await makeActivePlan(eng, part.id);
  const gauge = await makeGauge(eng, { kind: 'bore-gauge' });
  return { partId: part.id, gaugeId: gauge.id };
}

export async function receiveLot(h: Http, o: { supplierId: string; partId: string; quantity?: number }) {
  return must(await h.post('/api/lots', { supplierId: o.supplierId, partId: o.partId, supplierLotNumber: `SL-${uniq()}`, quantity: o.quantity ?? 100 }), 201, 'receive');
}

/** Core 1 measured out of tolerance, the rest not yet: the results require rejection. */
export async function rejectLot(h: Http, lot: { id: string; samples: { id: string }[] }, gaugeId: string, bore = 150.21) {
  must(await h.put(`/api/lots/${lot.id}/readings`, { readings: [{ sampleId: lot.samples[0].id, characteristicCode: 'BORE', values: [bore], gaugeId }] }), 200, 'readings');
  const cur = must(await h.get(`/api/lots/${lot.id}`), 200, 'lot');
  return must(await h.post(`/api/lots/${lot.id}/decision`, { decision: 'reject', comment: `Bore ${bore} mm on core 1, above 150.05`, version: cur.version }), 200, 'reject');
}

/** Every sampled core within tolerance, then accepted. */
export async function acceptLot(h: Http, lot: { id: string; samples: { id: string }[] }, gaugeId: string) {
  must(await h.put(`/api/lots/${lot.id}/readings`, { readings: lot.samples.map((s) => ({ sampleId: s.id, characteristicCode: 'BORE', values: [150.01], gaugeId })) }), 200, 'readings');
  const cur = must(await h.get(`/api/lots/${lot.id}`), 200, 'lot');
  return must(await h.post(`/api/lots/${lot.id}/decision`, { decision: 'accept', comment: 'All cores within tolerance', version: cur.version }), 200, 'accept');
}

export async function rejectedLot(eng: Http, o: { supplierId?: string; partId?: string; gaugeId?: string; quantity?: number } = {}) {
  const supplierId = o.supplierId ?? (await makeSupplier(eng)).id;
  const pg = o.partId && o.gaugeId ? { partId: o.partId, gaugeId: o.gaugeId } : await partWithBorePlan(eng);
  const lot = await receiveLot(eng, { supplierId, partId: pg.partId, quantity: o.quantity });
  const decided = await rejectLot(eng, lot, pg.gaugeId);
  return { supplierId, ...pg, lot: decided };
}

export const ncrBody = (over: Record<string, unknown> = {}) => ({
  title: 'Bore oversize',
  requirement: 'Bore 150.00 ± 0.05 mm (drawing)',
  found: 'Core 1 bore 150.21 mm',
  defectCodes: ['BORE'],
  suspectQuantity: 100,
  ...over,
});

export async function raise(h: Http, over: Record<string, unknown> = {}) {
  return must(await h.post('/api/ncrs', ncrBody(over)), 201, 'raise NCR');
}

export async function startReview(h: Http, ncr: { id: string; version: number }) {
  return must(await h.post(`/api/ncrs/${ncr.id}/transition`, { to: 'in-review', version: ncr.version }), 200, 'start review');
}

export async function disposition(h: Http, ncr: { id: string; version: number }, lines: Record<string, unknown>[], extra: Record<string, unknown> = {}) {
  return h.post(`/api/ncrs/${ncr.id}/dispositions`, { version: ncr.version, lines, signature: SIGN, ...extra });
}

export const scrap = (quantity: number) => ({ kind: 'scrap', quantity, rationale: 'Bore cannot be recovered', scrapValue: 12.5 * quantity });
export const sort = (quantity: number) => ({ kind: 'sort', quantity, rationale: '100 % bore check at receiving', hours: 6, rate: 42 });
