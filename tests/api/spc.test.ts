import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, asc, eq } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { makeGauge, makePart, makeSupplier, simpleCharacteristic } from '../support/factories';
import { auditEvent, driftSignal, lot, lotSample, reading, supplierNotice } from '../../src-api/db/schema';
import { pistonRings } from '../support/datasets';

let t: TestApp;
let eng: Http;
let insp: Http;
let aud: Http;
let burrGauge: { id: string };

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  insp = await signedIn(t.url, DEMO.inspector);
  aud = await signedIn(t.url, DEMO.auditor);
  burrGauge = await makeGauge(eng, { kind: 'burr-gauge', unit: 'µm', resolution: 0.1, description: 'Burr gauge' });
});
afterAll(async () => {
  await t?.close();
});

// ───────────────────────────────────────────── data through the real API

const USL = 50;
const CORES = 3;
const CHARS = [
  simpleCharacteristic({ code: 'BURR', name: 'Burr height', unit: 'µm', nominal: null, lsl: null, usl: USL, readingsPerSample: 4, gaugeKind: 'burr-gauge', chartKind: 'xbar-r', subgroupSize: 4, wearDriven: true }),
  { code: 'RUST', name: 'Free of rust', kind: 'attribute', layout: 'pass-fail', severity: 'minor', chartKind: 'p' },
];

/** A part with an active plan sampling a fixed 3 cores per lot (zero-acceptance), BURR and RUST charted. */
async function chartedPart() {
  const part = await makePart(eng);
  const plan = await eng.post('/api/plans', { partId: part.id, samplingKind: 'zero-acceptance', zeroSampleSize: CORES, characteristics: CHARS });
  expect(plan.status).toBe(201);
  const act = await eng.post(`/api/plans/${plan.body.id}/activate`, { version: plan.body.version });
  expect(act.status).toBe(200);
  return part as { id: string };
}

/** Deterministic noise in [-1, 1] (a small LCG), so every run builds the same series. */
function noise(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s / 2 ** 32) * 2 - 1;
  };
}

let lotNo = 0;
/** Receives a lot, enters BURR readings (core mean + spread) and RUST, decides it; returns the lot. */
async function lotWithBurr(supplierId: string, partId: string, coreMeans: number[], opts: { rustFails?: number[]; rnd?: () => number; spread?: number } = {}) {
  lotNo++;
  const received = new Date(Date.now() - (400 - lotNo) * 3_600_000).toISOString();
  const r = await insp.post('/api/lots', { supplierId, partId, supplierLotNumber: `SL-${lotNo}`, quantity: 40, receivedAt: received });
  if (r.status !== 201) throw new Error(`receive: ${r.status} ${JSON.stringify(r.body)}`);
  const lot = r.body;
  expect(lot.samples).toHaveLength(CORES);
  const rnd = opts.rnd ?? noise(lotNo);
  const spread = opts.spread ?? 1.5;
  const readings = lot.samples.flatMap((s: { id: string; serial: number }, i: number) => [
    { sampleId: s.id, characteristicCode: 'BURR', gaugeId: burrGauge.id, values: [0, 1, 2, 3].map(() => Math.round((coreMeans[i] + spread * rnd()) * 10) / 10) },
    opts.rustFails?.includes(s.serial)
      ? { sampleId: s.id, characteristicCode: 'RUST', pass: false, note: 'Rust spots on the end face' }
      : { sampleId: s.id, characteristicCode: 'RUST', pass: true },
  ]);
  const put = await insp.put(`/api/lots/${lot.id}/readings`, { readings });
  if (put.status !== 200) throw new Error(`readings: ${put.status} ${JSON.stringify(put.body)}`);
  const now = await insp.get(`/api/lots/${lot.id}`);
  const decision = opts.rustFails?.length ? 'reject' : 'accept';
  const d = await insp.post(`/api/lots/${lot.id}/decision`, { decision, comment: 'Inspected to plan', version: now.body.version });
  if (d.status !== 200) throw new Error(`decide: ${d.status} ${JSON.stringify(d.body)}`);
  return d.body as { id: string; ref: number };
}

/** The stored BURR readings of a supplier's lots, in chart order (received, then core serial). */
async function burrReadings(supplierId: string) {
  return t.db
    .select({ lotId: lot.id, serial: lotSample.serial, values: reading.values })
    .from(reading)
    .innerJoin(lot, eq(lot.id, reading.lotId))
    .innerJoin(lotSample, eq(lotSample.id, reading.sampleId))
    .where(and(eq(lot.supplierId, supplierId), eq(reading.characteristicCode, 'BURR')))
    .orderBy(asc(lot.receivedAt), asc(lot.ref), asc(lotSample.serial));
}

const chartOf = (h: Http, supplierId: string, partId: string, code = 'BURR', extra = '') => h.get(`/api/spc/charts?supplierId=${supplierId}&partId=${partId}&characteristicCode=${code}${extra}`);

/** Ordinary least squares written out here, independent of shared/compute (Montgomery & Runger ch. 11). */
function ols(x: number[], y: number[]) {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  const slope = sxy / sxx;
  return { slope, intercept: my - slope * mx };
}

// ───────────────────────────────────────────── the calculator

// Montgomery, Introduction to Statistical Quality Control, Table 6.3: piston-ring inside diameter, 25 × 5 (mm).
const PISTON_RINGS = pistonRings();

describe('POST /api/spc/analyze', () => {
  it('draws the piston-ring X-bar/R chart and its capability', async () => {
    const r = await insp.post('/api/spc/analyze', { chart: 'xbar-r', subgroups: PISTON_RINGS, lsl: 73.95, usl: 74.05 });
    expect(r.status).toBe(200);
    expect(r.body.center).toBeCloseTo(74.001176, 5); // Montgomery Table 6.3: grand mean 74.001 (unrounded 74.001176)
    expect(r.body.rangeCenter).toBeCloseTo(0.02324, 5); // Montgomery Table 6.3: R̄ 0.023 (unrounded 0.023240)
    // Montgomery rounds x̿ and R̄ before applying A2, so the printed limits agree to 1e-3.
    expect(Math.abs(r.body.ucl - 74.014)).toBeLessThan(1e-3); // Montgomery: X-bar UCL 74.014
    expect(Math.abs(r.body.lcl - 73.988)).toBeLessThan(1e-3); // Montgomery: X-bar LCL 73.988
    expect(r.body.rangeUcl).toBeCloseTo(0.049, 3); // Montgomery: R chart UCL = D4·R̄ = 2.114 × 0.023 = 0.049
    expect(r.body.rangeLcl).toBe(0); // Montgomery: D3 = 0 for n = 5
    expect(r.body.capability.cp).toBeCloseTo(1.68, 1); // Montgomery: Cp 1.68 for 74.000 ± 0.05
    expect(r.body.signals).toEqual([]);
    expect(r.body.phase).toBe('I');
  });

  it('gives s̄ for the piston rings on an X-bar/s chart', async () => {
    const r = await insp.post('/api/spc/analyze', { chart: 'xbar-s', subgroups: PISTON_RINGS });
    expect(r.status).toBe(200);
    expect(r.body.rangeCenter).toBeCloseTo(0.0094, 4); // Montgomery Table 6.3: s̄ 0.0094
  });

  it('draws the NIST individuals chart', async () => {
    const r = await aud.post('/api/spc/analyze', { chart: 'i-mr', values: [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1] });
    expect(r.status).toBe(200);
    expect(r.body.center).toBeCloseTo(50.81, 10); // NIST e-Handbook §6.3.2.2: mean 50.81
    expect(r.body.rangeCenter).toBeCloseTo(1.8778, 4); // NIST §6.3.2.2: MR̄ 1.8778
    expect(r.body.ucl).toBeCloseTo(55.8041, 2); // NIST §6.3.2.2: UCL 55.8041 (NIST uses d2 = 1.128)
    expect(r.body.lcl).toBeCloseTo(45.8159, 2); // NIST §6.3.2.2: LCL 45.8159
  });

  it('judges against known centre and σ (phase II) and flags a point beyond 3σ with a stable rule id', async () => {
    const r = await insp.post('/api/spc/analyze', { chart: 'i-mr', values: [10, 10.1, 9.9, 10.4], center: 10, sigma: 0.1 });
    expect(r.status).toBe(200);
    expect(r.body.phase).toBe('II');
    expect(r.body.ucl).toBeCloseTo(10.3, 12); // NIST §6.3.2: UCL = centre + 3σ
    expect(r.body.signals).toContainEqual(expect.objectContaining({ rule: 'we1', index: 3, chart: 'location' }));
  });

  it.each([
    ['ragged subgroups', { chart: 'xbar-r', subgroups: [[1, 2, 3], [1, 2], [2, 3, 4]] }, 'subgroups', /subgroup 2 has 2 measurements but subgroup 1 has 3/],
    ['fewer than 2 subgroups', { chart: 'xbar-r', subgroups: [[1, 2, 3]] }, 'subgroups', /at least 2 subgroups \(got 1\)/],
    ['lsl ≥ usl', { chart: 'i-mr', values: [1, 2, 3], lsl: 5, usl: 5 }, 'lsl', /lsl must be below usl/],
    ['defectives > sizes', { chart: 'p', defectives: [1, 6], sizes: [5, 5] }, 'defectives', /sample 2: 6 defectives is more than the sample size of 5/],
    ['a null measurement', { chart: 'i-mr', values: [1, null, 3] }, 'values.1', /finite number/],
    ['no data for the chart', { chart: 'xbar-s' }, 'subgroups', /subgroups are required/],
    ['data of another chart', { chart: 'p', defectives: [1, 2], sizes: [5, 5], values: [1, 2] }, 'values', /does not apply to a p chart/],
  ])('refuses %s with 400 and a message saying what is wrong', async (_name, body, field, message) => {
    const r = await insp.post('/api/spc/analyze', body);
    expect(r.status).toBe(400);
    expect(r.body.error).toBe('validation');
    expect(r.body.fields[field]).toMatch(message);
    expect(r.body.message).toMatch(message);
  });

  it('refuses a non-finite number (1e999 parses to Infinity)', async () => {
    const r = await insp.request('POST', '/api/spc/analyze', undefined, { raw: '{"chart":"i-mr","values":[1,1e999,3]}', headers: { 'content-type': 'application/json' } });
    expect(r.status).toBe(400);
    expect(r.body.fields['values.1']).toMatch(/finite number/);
  });

  it('refuses zero spread with a readable message instead of dividing by zero', async () => {
    const r = await insp.post('/api/spc/analyze', { chart: 'xbar-r', subgroups: [[5, 5], [5, 5], [5, 5]] });
    expect(r.status).toBe(400);
    expect(r.body.message).toMatch(/zero/);
  });

  it('documents the rule ids in OpenAPI', () => {
    const op = (t.openapi.paths['/api/spc/analyze'] as Record<string, { description?: string }>).post;
    for (const id of ['we1', 'we2', 'we3', 'we4', 'trend6', 'nelson1', 'nelson8']) expect(op.description).toContain(id);
  });
});

// ───────────────────────────────────────────── a drifting burr series

describe('a drifting burr series', () => {
  let supplierId: string;
  let partId: string;
  const means: number[] = [];

  beforeAll(async () => {
    supplierId = (await makeSupplier(eng, { name: 'Drifting Die Stamping' })).id;
    partId = (await chartedPart()).id;
    // 12 steady lots around 20 µm, then the die wears: +2.2 µm a lot up to about 46 µm.
    for (let i = 0; i < 24; i++) {
      const m = i < 12 ? 20 : 20 + 2.2 * (i - 11);
      means.push(m);
      await lotWithBurr(supplierId, partId, [m - 0.5, m, m + 0.5], { rustFails: i === 5 ? [2] : [] });
    }
  }, 120_000);

  it('raises drift signals when the lots are decided, on trial limits (no version yet)', async () => {
    const rows = await t.db.select().from(driftSignal).where(and(eq(driftSignal.supplierId, supplierId), eq(driftSignal.characteristicCode, 'BURR')));
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((s) => s.limitVersion === null)).toBe(true);
    const rules = new Set(rows.map((s) => s.rule));
    expect(rules.has('we1') || rules.has('trend6')).toBe(true);
    // Raised once: the key is chart × rule × lot.
    const keys = rows.map((s) => `${s.chart}|${s.rule}|${s.lotId}`);
    expect(new Set(keys).size).toBe(keys.length);
    const [ev] = await t.db.select().from(auditEvent).where(eq(auditEvent.action, 'spc.signals_raised'));
    expect(ev).toBeTruthy();
  });

  it('charts one subgroup per core from its 4 raw readings, with flags naming lot and core', async () => {
    const r = await chartOf(insp, supplierId, partId);
    expect(r.status).toBe(200);
    expect(r.body.chart).toBe('xbar-r');
    expect(r.body.subgrouping).toMatchObject({ mode: 'core-readings', n: 4 });
    expect(r.body.points).toHaveLength(24 * CORES);
    const stored = await burrReadings(supplierId);
    expect(r.body.points[4]).toMatchObject({ serial: stored[4].serial, lotSeq: 2 });
    expect(r.body.points[4].value).toBeCloseTo(stored[4].values.reduce((a, b) => a + b, 0) / 4, 12);
    expect(r.body.points[4].dispersion).toBeCloseTo(Math.max(...stored[4].values) - Math.min(...stored[4].values), 12);
    const flagged = r.body.points.filter((p: { flags?: unknown[] }) => p.flags?.length);
    expect(flagged.length).toBeGreaterThan(0);
    const f = flagged[flagged.length - 1];
    expect(f.flags[0].message).toMatch(new RegExp(`^lot ${f.lotRef} core ${f.serial}`));
    expect(f.flags[0].description).toBeTruthy();
    expect(r.body.limits).toBeNull();
    expect(r.body.trial.count).toBe(24 * CORES);
    // Drifting: capability says so.
    expect(r.body.capability.cpk).toBeGreaterThan(0);
    expect(r.body.capabilityWarnings.join(' ')).toMatch(/Not in control/);
    expect(r.body.histogram.reduce((a: number, b: { count: number }) => a + b.count, 0)).toBe(24 * CORES * 4);
  });

  it('forecasts the lots left before the burr limit from the wear line', async () => {
    const r = await chartOf(eng, supplierId, partId);
    const fc = r.body.forecast;
    expect(fc).toBeTruthy();
    // The fit uses every reading against lot sequence over the recent lots (here all 24).
    const x: number[] = [];
    const y: number[] = [];
    const seq = new Map<string, number>();
    for (const row of await burrReadings(supplierId)) {
      if (!seq.has(row.lotId)) seq.set(row.lotId, seq.size + 1);
      for (const v of row.values) {
        x.push(seq.get(row.lotId)!);
        y.push(v);
      }
    }
    const line = ols(x, y);
    expect(fc.slope).toBeCloseTo(line.slope, 9); // least squares, Montgomery & Runger ch. 11
    expect(fc.lotsToLimit).toBeCloseTo((USL - line.intercept) / line.slope - 24, 6); // where the line meets the USL, counted from the last lot
    expect(fc.lotsToLimitLower).toBeLessThan(fc.lotsToLimit); // the prediction bound reaches the limit sooner
    expect(fc.lotsToLimitLower).toBeGreaterThanOrEqual(0);
    // About 46 µm and +2.2 µm a lot against 50 µm: fewer than 5 lots left, so the die is due for service.
    expect(fc.serviceDue).toBe(true);
    expect(fc.serviceLots).toBe(5);
  });

  it('puts a die-service notice on the supplier’s desk once, when the forecast first falls below the threshold', async () => {
    const notices = await t.db.select().from(supplierNotice).where(eq(supplierNotice.supplierId, supplierId));
    expect(notices).toHaveLength(1);
    expect(notices[0]).toMatchObject({ kind: 'die-service-due', characteristicCode: 'BURR', partId });
    const [ev] = await t.db.select().from(auditEvent).where(and(eq(auditEvent.action, 'spc.die_service_due'), eq(auditEvent.entityId, `${supplierId}:${partId}:BURR`)));
    expect(ev).toBeTruthy();
  });

  it('shows the chart on Drift watch with its status, open signals and lots to limit', async () => {
    const r = await insp.get(`/api/spc/watch?supplierId=${supplierId}`);
    expect(r.status).toBe(200);
    const burr = r.body.find((w: { characteristicCode: string }) => w.characteristicCode === 'BURR');
    const rust = r.body.find((w: { characteristicCode: string }) => w.characteristicCode === 'RUST');
    expect(burr).toMatchObject({ supplierId, partId, chart: 'xbar-r', wearDriven: true, lots: 24 });
    expect(burr.openSignals).toBeGreaterThan(0);
    const chart = await chartOf(insp, supplierId, partId);
    expect(burr.lotsToLimit).toBeCloseTo(chart.body.forecast.lotsToLimit, 9);
    expect(burr.status).toBe('die-service-due');
    expect(rust).toMatchObject({ chart: 'p', wearDriven: false });
    expect(rust.lotsToLimit).toBeUndefined();
  });

  it('charts the rust check as fraction nonconforming per lot', async () => {
    const r = await chartOf(insp, supplierId, partId, 'RUST');
    expect(r.status).toBe(200);
    expect(r.body.chart).toBe('p');
    expect(r.body.points).toHaveLength(24);
    expect(r.body.points[5]).toMatchObject({ defectives: 1, size: CORES });
    expect(r.body.points[5].value).toBeCloseTo(1 / 3, 12);
    expect(r.body.trial.center).toBeCloseTo(1 / 72, 12); // p̄ = Σ defectives / Σ sizes (NIST §6.3.3.2)
    expect(r.body.capability).toBeNull();
  });

  it('filters by received date but judges on the whole history', async () => {
    const all = await chartOf(insp, supplierId, partId);
    const day = all.body.points[all.body.points.length - 1].receivedAt.slice(0, 10);
    const r = await chartOf(insp, supplierId, partId, 'BURR', `&from=${day}&to=${day}`);
    expect(r.status).toBe(200);
    expect(r.body.points.length).toBeLessThan(all.body.points.length);
    expect(r.body.totalPoints).toBe(all.body.points.length);
    const last = r.body.points[r.body.points.length - 1];
    expect(last.index).toBe(all.body.points.length - 1);
    expect(r.body.segments).toEqual(all.body.segments);
  });
});

// ───────────────────────────────────────────── frozen limits

describe('POST /api/spc/limits', () => {
  let supplierId: string;
  let partId: string;
  const rnd = noise(7);

  beforeAll(async () => {
    supplierId = (await makeSupplier(eng, { name: 'Steady Press Ltd' })).id;
    partId = (await chartedPart()).id;
    for (let i = 0; i < 10; i++) await lotWithBurr(supplierId, partId, [20, 20, 20], { rnd });
  }, 60_000);

  it('refuses an inspector (403) and a freeze without a reason (400)', async () => {
    const body = { supplierId, partId, characteristicCode: 'BURR', baseline: { kind: 'first', count: 30 }, reason: 'Baseline after die service' };
    expect((await insp.post('/api/spc/limits', body)).status).toBe(403);
    expect((await aud.post('/api/spc/limits', body)).status).toBe(403);
    const noReason = await eng.post('/api/spc/limits', { ...body, reason: '  ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields.reason).toMatch(/reason/);
    const tooMany = await eng.post('/api/spc/limits', { ...body, baseline: { kind: 'first', count: 31 } });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.fields['baseline.count']).toMatch(/Only 30 subgroups/);
  });

  it('freezes version 1, judges later lots against it, then version 2; old signals keep version 1', async () => {
    const v1 = await eng.post('/api/spc/limits', { supplierId, partId, characteristicCode: 'BURR', baseline: { kind: 'first', count: 30 }, reason: 'Baseline after die service' });
    expect(v1.status).toBe(201);
    expect(v1.body).toMatchObject({ version: 1, active: true, chart: 'xbar-r', subgroupSize: 4, baselineSubgroups: 30, reason: 'Baseline after die service' });
    // Phase I from the same subgroups, computed here: x̿ ± A2·R̄ (NIST §6.3.2.1, A2(4) = 0.7286).
    const subs: number[][] = (await burrReadings(supplierId)).map((r) => r.values);
    expect(subs).toHaveLength(30);
    const xbar = subs.map((g) => g.reduce((a, b) => a + b, 0) / 4);
    const rbar = subs.map((g) => Math.max(...g) - Math.min(...g)).reduce((a, b) => a + b, 0) / subs.length;
    const center = xbar.reduce((a, b) => a + b, 0) / xbar.length;
    expect(v1.body.excluded).toEqual([]); // steady lots: nothing out of control in the baseline
    expect(v1.body.center).toBeCloseTo(center, 9); // NIST §6.3.2.1: centre line x̿
    expect(v1.body.ucl).toBeCloseTo(center + 0.7286 * rbar, 3); // NIST §6.3.2.1: UCL = x̿ + A2·R̄, A2(4) = 0.729
    expect(v1.body.sigma).toBeCloseTo(rbar / 2.059, 3); // NIST §6.3.2.1: σ = R̄/d2, d2(4) = 2.059
    expect(v1.body.rangeUcl).toBeCloseTo(2.282 * rbar, 2); // NIST §6.3.2.1: R chart UCL = D4·R̄, D4(4) = 2.282

    // A lot above the limits: judged against version 1 (phase II).
    const high1 = await lotWithBurr(supplierId, partId, [23, 23.5, 24], { rnd });
    const after1 = await t.db.select().from(driftSignal).where(and(eq(driftSignal.supplierId, supplierId), eq(driftSignal.characteristicCode, 'BURR')));
    const v1Signals = after1.filter((s) => s.lotId === high1.id);
    expect(v1Signals.length).toBeGreaterThan(0);
    expect(v1Signals.every((s) => s.limitVersion === 1)).toBe(true);
    expect(v1Signals.some((s) => s.rule === 'we1' && s.chart === 'location')).toBe(true);

    // Version 2 on the first 33 subgroups: the high lot's 3 are excluded as out of control.
    const v2 = await eng.post('/api/spc/limits', { supplierId, partId, characteristicCode: 'BURR', baseline: { kind: 'first', count: 33 }, reason: 'Recomputed after review of lot ' + high1.ref });
    expect(v2.status, JSON.stringify(v2.body)).toBe(201);
    expect(v2.body.version).toBe(2);
    expect(v2.body.excluded).toEqual(expect.arrayContaining([30, 31, 32]));
    expect(v2.body.excludedPoints.map((p: { lotRef: number }) => p.lotRef)).toContain(high1.ref);
    expect(v2.body.iterations).toBeGreaterThanOrEqual(2);
    const high2 = await lotWithBurr(supplierId, partId, [23, 23.5, 24], { rnd });

    const all = await t.db.select().from(driftSignal).where(and(eq(driftSignal.supplierId, supplierId), eq(driftSignal.characteristicCode, 'BURR')));
    for (const s of all.filter((x) => x.lotId === high1.id)) expect(s.limitVersion).toBe(1);
    const underV2 = all.filter((s) => s.lotId === high2.id);
    expect(underV2.length).toBeGreaterThan(0);
    expect(underV2.every((s) => s.limitVersion === 2)).toBe(true);

    const chart = await chartOf(eng, supplierId, partId);
    expect(chart.body.limits.version).toBe(2);
    expect(chart.body.versions.map((v: { version: number; active: boolean }) => [v.version, v.active])).toEqual([[1, false], [2, true]]);
    const versions = chart.body.points.map((p: { segment: number }) => chart.body.segments[p.segment].limitVersion);
    expect(versions.slice(0, 30).every((v: number | null) => v === null)).toBe(true);
    expect(versions.slice(30, 33)).toEqual([1, 1, 1]);
    expect(versions.slice(33)).toEqual([2, 2, 2]);
    const withSignal = chart.body.points.find((p: { lotId: string; flags?: { signalId: string | null }[] }) => p.lotId === high2.id && p.flags?.length);
    expect(withSignal.flags.some((f: { signalId: string | null }) => f.signalId)).toBe(true);
    expect(chart.body.segments.map((g: { limitVersion: number | null; from: number; to: number }) => [g.limitVersion, g.from, g.to])).toEqual([[null, 0, 29], [1, 30, 32], [2, 33, 35]]);

    const audits = await t.db.select().from(auditEvent).where(eq(auditEvent.action, 'spc.limits_frozen'));
    expect(audits.map((a) => a.reason)).toEqual(expect.arrayContaining(['Baseline after die service', 'Recomputed after review of lot ' + high1.ref]));
  });

  it('freezes a p chart from a date range', async () => {
    const chart = await chartOf(eng, supplierId, partId, 'RUST');
    const from = chart.body.points[0].receivedAt.slice(0, 10);
    const to = chart.body.points[chart.body.points.length - 1].receivedAt.slice(0, 10);
    const r = await eng.post('/api/spc/limits', { supplierId, partId, characteristicCode: 'RUST', baseline: { kind: 'dates', from, to }, reason: 'Rust baseline' });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ chart: 'p', version: 1, center: 0, ucl: null });
  });
});

// ───────────────────────────────────────────── acknowledging and roles

describe('POST /api/spc/signals/:id/ack', () => {
  it('acknowledges an open signal with a note (audited), once', async () => {
    const [open] = await t.db.select().from(driftSignal).where(eq(driftSignal.status, 'open')).limit(1);
    expect(open).toBeTruthy();
    expect((await insp.post(`/api/spc/signals/${open.id}/ack`, { note: 'x' })).status).toBe(403);
    const empty = await eng.post(`/api/spc/signals/${open.id}/ack`, { note: '' });
    expect(empty.status).toBe(400);
    const r = await eng.post(`/api/spc/signals/${open.id}/ack`, { note: 'Supplier resharpened the die; next lots watched' });
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ id: open.id, status: 'acknowledged', ackNote: 'Supplier resharpened the die; next lots watched' });
    const again = await eng.post(`/api/spc/signals/${open.id}/ack`, { note: 'twice' });
    expect(again.status).toBe(409);
    const [ev] = await t.db.select().from(auditEvent).where(and(eq(auditEvent.action, 'spc.signal_acknowledged'), eq(auditEvent.entityId, open.id)));
    expect(ev.reason).toBe('Supplier resharpened the die; next lots watched');
    expect((await eng.post('/api/spc/signals/7f1c9a52-0000-4000-8000-000000000000/ack', { note: 'n' })).status).toBe(404);
  });
});

describe('POST /api/ncrs from a drift signal', () => {
  it('takes an open signal into a numbered NCR for its supplier, part and characteristic, once (audited)', async () => {
    const [sig] = await t.db.select().from(driftSignal).where(eq(driftSignal.status, 'open')).orderBy(asc(driftSignal.createdAt)).limit(1);
    expect(sig).toBeTruthy();
    const body = (over: Record<string, unknown> = {}) => ({
      signalId: sig.id,
      title: 'Burr height drifting up',
      requirement: 'Burr height stable within its control limits',
      found: sig.message,
      defectCodes: ['BURR'],
      suspectQuantity: 50,
      ...over,
    });
    // The signal decides the supplier and characteristic: another one is refused by field.
    const other = await makeSupplier(eng);
    const wrong = await eng.post('/api/ncrs', body({ supplierId: other.id, characteristicCode: 'OD' }));
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields).toMatchObject({ supplierId: 'This is not the supplier of the signal', characteristicCode: 'This is not the characteristic of the signal' });
    expect((await t.db.select().from(driftSignal).where(eq(driftSignal.id, sig.id)))[0].status).toBe('open');

    const r = await eng.post('/api/ncrs', body());
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ source: 'signal', signalId: sig.id, supplierId: sig.supplierId, partId: sig.partId, characteristicCode: sig.characteristicCode, lotId: null });
    expect(r.body.number).toMatch(/^NCR-\d{4}-\d+$/);
    const [after] = await t.db.select().from(driftSignal).where(eq(driftSignal.id, sig.id));
    expect(after).toMatchObject({ status: 'ncr-opened', ncrId: r.body.id });
    const [ev] = await t.db.select().from(auditEvent).where(and(eq(auditEvent.action, 'spc.signal_taken_into_ncr'), eq(auditEvent.entityId, sig.id)));
    expect(ev.after).toMatchObject({ status: 'ncr-opened', ncr: r.body.number });

    // Once: a second NCR from it names the first; acknowledging it now is refused too.
    const again = await eng.post('/api/ncrs', body());
    expect(again.status).toBe(409);
    expect(again.body.message).toContain(r.body.number);
    expect((await eng.post(`/api/spc/signals/${sig.id}/ack`, { note: 'late' })).status).toBe(409);
    // The chart's signal list shows it taken.
    const chart = await chartOf(eng, sig.supplierId, sig.partId, sig.characteristicCode);
    expect(chart.status).toBe(200);
    expect(chart.body.signals.find((x: { id: string }) => x.id === sig.id)).toMatchObject({ status: 'ncr-opened', ncrId: r.body.id, ncrNumber: r.body.number });
  });

  it('can take an acknowledged signal into an NCR as well', async () => {
    const [sig] = await t.db.select().from(driftSignal).where(eq(driftSignal.status, 'acknowledged')).limit(1);
    expect(sig).toBeTruthy();
    const r = await eng.post('/api/ncrs', { signalId: sig.id, title: 'Burr drift after resharpening', requirement: 'Stable burr height', found: sig.message, defectCodes: ['BURR'], suspectQuantity: 10 });
    expect(r.status).toBe(201);
    expect((await t.db.select().from(driftSignal).where(eq(driftSignal.id, sig.id)))[0].status).toBe('ncr-opened');
  });
});

describe('GET /api/spc/* access and bad queries', () => {
  it('lets inspectors and auditors read; refuses suppliers and admins', async () => {
    for (const h of [insp, aud, eng]) expect((await h.get('/api/spc/watch')).status).toBe(200);
    const sup = await signedIn(t.url, DEMO.supplierNorthgate);
    expect((await sup.get('/api/spc/watch')).status).toBe(403);
    const admin = await signedIn(t.url, DEMO.admin);
    expect((await admin.get('/api/spc/watch')).status).toBe(403);
    expect((await new Http(t.url).get('/api/spc/watch')).status).toBe(401);
  });

  it('answers 400 for a malformed query and 404 for a characteristic not on the plan', async () => {
    const bad = await insp.get('/api/spc/charts?supplierId=nope&partId=nope&characteristicCode=BURR');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.fields)).toEqual(expect.arrayContaining(['supplierId', 'partId']));
    const supplierId = (await makeSupplier(eng)).id;
    const partId = (await chartedPart()).id;
    expect((await chartOf(insp, supplierId, partId, 'NOPE')).status).toBe(404);
    const empty = await chartOf(insp, supplierId, partId);
    expect(empty.status).toBe(200);
    expect(empty.body.points).toEqual([]);
    expect(empty.body.forecast).toBeNull();
  });
});
