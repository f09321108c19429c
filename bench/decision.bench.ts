/**
 * A lot decision on a supplier × part with 5 000 decided lots of history, and what it does to
 * other people's audited writes: an inspector saving readings on another lot (through a second
 * API process) while the decisions run, against the same saves with nothing else running.
 */
import type { Pool } from 'pg';
import { median, p95, round, timed, type BenchResult } from './lib';
import { DEMO, signedIn, type Http } from '../tests/support/http';
import { makePart, simpleCharacteristic } from '../tests/support/factories';
import { spawnApi } from '../tests/support/test-app';
import type { ChartFixture } from './charts.bench';

interface OpenLot {
  id: string;
  version: number;
  samples: { id: string }[];
}

async function receive(h: Http, supplierId: string, partId: string, n: number): Promise<OpenLot> {
  const r = await h.post('/api/lots', { supplierId, partId, supplierLotNumber: `DEC-${Date.now().toString(36)}-${n}`, quantity: 100 });
  if (r.status !== 201) throw new Error(`receive: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  return r.body as OpenLot;
}

async function fill(h: Http, l: OpenLot, code: string, value: () => number): Promise<OpenLot> {
  const r = await h.put(`/api/lots/${l.id}/readings`, { readings: l.samples.map((s) => ({ sampleId: s.id, characteristicCode: code, values: [value()] })) });
  if (r.status !== 200) throw new Error(`readings: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  return (await h.get(`/api/lots/${l.id}`)).body as OpenLot;
}

/** Saves one reading again and again until `stop()` says so; the latency of each save. */
async function saver(h: Http, l: OpenLot, stop: () => boolean): Promise<number[]> {
  const out: number[] = [];
  let k = 0;
  while (!stop()) {
    const { ms, value } = await timed(() => h.put(`/api/lots/${l.id}/readings`, { readings: [{ sampleId: l.samples[k++ % l.samples.length].id, characteristicCode: 'Y', values: [10 + (k % 7) * 0.001] }] }));
    if (value.status !== 200) throw new Error(`saver: ${value.status}`);
    out.push(ms);
  }
  return out;
}

export async function benchDecision(dbUrl: string, eng: Http, f: ChartFixture, pool: Pool): Promise<BenchResult> {
  // Two API processes of their own, so neither the benchmark nor the other's work shares an event
  // loop with what is measured: decisions go to one, the inspector's saves to the other.
  const env = { LOGIN_RATE_PER_MINUTE: '10000', UPLOAD_RATE_PER_MINUTE: '10000' };
  console.log('· two API processes for the decision benchmark');
  const [deciderApi, saverApi] = await Promise.all([spawnApi(dbUrl, env), spawnApi(dbUrl, env)]);
  try {
    const decider = await signedIn(deciderApi.url, DEMO.engineer);
    const insp = await signedIn(saverApi.url, DEMO.inspector);
    // The other lot: a part with one uncharted characteristic, 5 cores.
    const other = await makePart(eng);
    const plan = await eng.post('/api/plans', { partId: other.id, samplingKind: 'zero-acceptance', zeroSampleSize: 5, characteristics: [simpleCharacteristic({ code: 'Y', gaugeKind: null, chartKind: 'none' })] });
    await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
    const otherLot = await receive(eng, f.supplierId, other.id, 0);

    let running = true;
    const baseline = await (async () => {
      const until = Date.now() + 4000;
      return saver(insp, otherLot, () => Date.now() > until);
    })();

    const decisions: number[] = [];
    const during: number[] = [];
    const historyLots = Number((await pool.query<{ n: string }>('select count(*) as n from lot where supplier_id = $1 and part_id = $2 and decided_at is not null', [f.supplierId, f.partId])).rows[0].n);
    for (let i = 0; i < 8; i++) {
      const l = await fill(decider, await receive(decider, f.supplierId, f.partId, i + 1), 'X', () => 150 + (Math.random() - 0.5) * 0.04);
      running = true;
      const saves = saver(insp, otherLot, () => !running);
      const { ms, value } = await timed(() => decider.post(`/api/lots/${l.id}/decision`, { decision: 'accept', comment: 'bench', version: l.version }));
      running = false;
      if (value.status !== 200) throw new Error(`decision: ${value.status} ${JSON.stringify(value.body).slice(0, 300)}`);
      decisions.push(ms);
      during.push(...(await saves));
    }
    const ratio = p95(during) / p95(baseline);
    return {
      name: `lot decision with ${historyLots} decided lots of history, and readings saved meanwhile`,
      floor: 'the same reading saves with no decision running',
      target: 'saves p95 ≤ 2× alone (they must not wait for the decision)',
      median: { decisionMs: round(median(decisions)), saveMs: round(median(baseline)), saveDuringMs: round(median(during)) },
      p95: { decisionMs: round(p95(decisions)), saveMs: round(p95(baseline)), saveDuringMs: round(p95(during)) },
      ratio,
      met: ratio <= 2,
      notes: `${during.length} saves during ${decisions.length} decisions; ${baseline.length} alone. The decision reads the charted history before its first audit record, so the audit chain lock is held only for its writes.`,
    };
  } finally {
    await Promise.all([deciderApi.close(), saverApi.close()]);
  }
}
