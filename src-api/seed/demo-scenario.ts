/**
 * The invented demo plant, "Harrowgate Drive Systems": three core families from three suppliers,
 * six months of lots with realistic spread, Northgate's burr height drifting upward over the last
 * two months (a wearing die), one rejected lot carried into review, and gauges near their due
 * dates. Deterministic: the same random seed gives the same plant every time. Runs through the
 * real services (the same validation, sampling and audit as the app), each step "as of" its date.
 */
import type { INestApplicationContext } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { runAsOf } from '../common/clock';
import { SuppliersService } from '../suppliers/suppliers.service';
import { PartsService } from '../parts/parts.service';
import { GaugesService } from '../gauges/gauges.service';
import { PlansService } from '../plans/plans.service';
import { LotsService } from '../lots/lots.service';
import { expectedReadings } from '../../shared/compute/evaluate';
import type { Characteristic, Plan } from '../../shared/schemas/master-data';
import type { SessionUser } from '../../shared/schemas/auth';
import type { ReadingInput } from '../../shared/schemas/receiving';
import type { EightDStep, Scar } from '../../shared/schemas/corrective-action';
import { Random } from './random';
import { NcrsService } from '../ncrs/ncrs.service';
import { CorrectiveActionsService } from '../corrective-actions/corrective-actions.service';
import { UsersRepository } from '../users/users.repository';
import { toSessionUser } from '../auth/auth.service';
import { DEMO_PASSWORD } from './demo-users';
import { SpcService } from '../spc/spc.service';

const DAY = 86_400_000;

interface Family {
  supplier: string;
  part: Parameters<PartsService['create']>[1];
  template: 'welded' | 'interlocked' | 'segmented';
  quantity: [number, number];
  everyDays: number;
}

const FAMILIES: Family[] = [
  {
    supplier: 'NGL',
    template: 'welded',
    quantity: [280, 460],
    everyDays: 7,
    part: { partNumber: 'HG-S48W', revision: 'B', description: '48-slot welded stator core, OD 240, traction auxiliary motor', construction: 'welded', steelGrade: 'M400-50A', laminationThicknessMm: 0.5, laminationAreaCm2: 191.5, nominalBoreMm: 150, nominalOdMm: 240, nominalStackLengthMm: 120, slotCount: 48, nominalMassKg: 17.31, designStackingFactor: 0.97, designToothT: 1.68, designYokeT: 1.42 },
  },
  {
    supplier: 'SPW',
    template: 'interlocked',
    quantity: [300, 500],
    everyDays: 7,
    part: { partNumber: 'HG-S27I', revision: 'A', description: '27-slot interlocked stator core, OD 165, fan drive', construction: 'interlocked', steelGrade: 'M270-35A', laminationThicknessMm: 0.35, laminationAreaCm2: 94.7, nominalBoreMm: 100, nominalOdMm: 165, nominalStackLengthMm: 80, slotCount: 27, nominalMassKg: 5.575, designStackingFactor: 0.95, designToothT: 1.62, designYokeT: 1.35 },
  },
  {
    supplier: 'OKS',
    template: 'segmented',
    quantity: [300, 450],
    everyDays: 10,
    part: { partNumber: 'HG-PS12', revision: 'A', description: '12-segment stator core for the compact pump motor, OD 130', construction: 'segmented', steelGrade: 'M400-50A', laminationThicknessMm: 0.5, laminationAreaCm2: 59.5, nominalBoreMm: 78, nominalOdMm: 130, nominalStackLengthMm: 60, slotCount: 12, nominalMassKg: 2.688, designStackingFactor: 0.97, designToothT: 1.7, designYokeT: 1.4 },
  },
];

const GAUGES = [
  { assetTag: 'CMM-01', kind: 'cmm', description: 'Bridge CMM, receiving lab', resolution: 0.0005, unit: 'mm', due: 140 },
  { assetTag: 'HGT-02', kind: 'height-gauge', description: 'Digital height gauge 300 mm', resolution: 0.001, unit: 'mm', due: 12 },
  { assetTag: 'SCL-03', kind: 'scale', description: 'Platform scale 60 kg', resolution: 0.005, unit: 'kg', due: 200 },
  { assetTag: 'BRR-04', kind: 'burr-gauge', description: 'Burr height gauge, 1 µm', resolution: 1, unit: 'µm', due: 21 },
  { assetTag: 'FRK-05', kind: 'franklin-tester', description: 'Franklin-type insulation tester', resolution: 0.001, unit: 'A', due: 95 },
  { assetTag: 'FLR-06', kind: 'feeler-gauge', description: 'Feeler gauge set 0.02–1 mm', resolution: 0.01, unit: 'mm', due: 160 },
  { assetTag: 'DIA-07', kind: 'dial-indicator', description: 'Dial indicator 0.001 mm on stand', resolution: 0.001, unit: 'mm', due: 27 },
  { assetTag: 'GNG-48', kind: 'go-no-go', description: 'Slot go gauge, 48-slot core', resolution: 0.01, unit: 'mm', due: 300 },
  { assetTag: 'MIC-09', kind: 'micrometer', description: 'Outside micrometer 225–250 mm', resolution: 0.001, unit: 'mm', due: -6 },
  { assetTag: 'BOR-10', kind: 'bore-gauge', description: 'Air bore gauge 150 mm', resolution: 0.0005, unit: 'mm', due: 8 },
] as const;

/** Values for one core, one characteristic: centred in tolerance with a realistic spread. */
function valuesFor(c: Characteristic, rnd: Random, ctx: { burrMean: number; part: Family['part']; core: { bx: number; by: number } }): number[] {
  const n = expectedReadings(c);
  const mid = c.nominal ?? (c.lsl != null && c.usl != null ? (c.lsl + c.usl) / 2 : c.usl != null ? c.usl * 0.35 : (c.lsl ?? 1) * 1.25);
  const span = c.lsl != null && c.usl != null ? c.usl - c.lsl : Math.abs(mid) * 0.2 || 1;
  const r6 = (x: number) => Math.round(x * 1e6) / 1e6;
  if (c.code === 'BURR') return Array.from({ length: n }, () => Math.max(3, Math.round(rnd.normal(ctx.burrMean, 2.2))));
  if (c.code === 'INS_I') return Array.from({ length: n }, () => Math.round(Math.min(0.09, Math.max(0.004, rnd.normal(0.028, 0.009))) * 1000) / 1000);
  if (c.layout === 'probed') {
    const angles = c.angles ?? n;
    const isBore = c.code.startsWith('BORE');
    const radius = mid / 2 + rnd.normal(0, span / 14);
    const [cx, cy] = isBore ? [ctx.core.bx, ctx.core.by] : [rnd.normal(0, 0.002), rnd.normal(0, 0.002)];
    return Array.from({ length: n }, (_, i) => {
      const th = (((i % angles) * 360) / angles) * (Math.PI / 180);
      // Radius seen from the CMM axis of a circle centred at (cx, cy), with a little form error.
      return r6(radius + cx * Math.cos(th) + cy * Math.sin(th) + rnd.normal(0, span / 60));
    });
  }
  if (c.layout === 'heights') {
    const base = mid + rnd.normal(0, span / 10);
    const tilt = rnd.normal(0, 0.012);
    return Array.from({ length: n }, (_, i) => r6(base + tilt * Math.cos((i * 2 * Math.PI) / n) + rnd.normal(0, 0.004)));
  }
  if (c.code === 'MASS') return [Math.round(ctx.part.nominalMassKg * (1 + rnd.normal(0, 0.0015)) * 1000) / 1000];
  return Array.from({ length: n }, () => r6(mid + rnd.normal(0, span / 10)));
}

export interface DemoResult {
  lots: number;
  rejectedLotId: string | null;
}

export async function seedDemoScenario(app: INestApplicationContext, users: { inspector: SessionUser; engineer: SessionUser }): Promise<DemoResult | null> {
  const db = app.get<Db>(DB);
  const { rows } = await db.execute<{ n: number }>(sql`select count(*)::int as n from lot`);
  if (rows[0].n > 0) return null; // the scenario is loaded on an empty database only
  const suppliers = app.get(SuppliersService);
  const parts = app.get(PartsService);
  const gauges = app.get(GaugesService);
  const plans = app.get(PlansService);
  const lots = app.get(LotsService);
  const spc = app.get(SpcService);
  const { engineer, inspector } = users;
  const rnd = new Random(20261202);
  const today = new Date(new Date().toISOString().slice(0, 10) + 'T07:00:00Z');
  const start = new Date(today.getTime() - 182 * DAY);

  const supplierList = await suppliers.list(engineer, { page: 1, pageSize: 50 });
  const supplierId = (code: string) => supplierList.items.find((s) => s.code === code)!.id;
  const contacts: Record<string, string[]> = { NGL: ['quality@northgate-lamination.test'], SPW: ['quality@selby-pressworks.test'], OKS: ['quality@okaro-stamping.test'] };
  for (const s of supplierList.items) if (contacts[s.code]) await suppliers.update(engineer, s.id, { contactEmails: contacts[s.code], version: s.version });
  const okaro = supplierList.items.find((s) => s.code === 'OKS')!;
  await suppliers.update(engineer, okaro.id, { approvalStatus: 'conditional', approvalReason: 'New segmented-core source: first-article approval done, process audit due in Q1', version: okaro.version + 1 });

  const gaugeIds = new Map<string, string>();
  await runAsOf(new Date(start.getTime() - 10 * DAY), async () => {
    for (const g of GAUGES) {
      const made = await gauges.create(engineer, { assetTag: g.assetTag, kind: g.kind, description: g.description, resolution: g.resolution, unit: g.unit, calibrationDueOn: new Date(today.getTime() + g.due * DAY).toISOString().slice(0, 10) });
      if (g.due > 0 && !gaugeIds.has(g.kind)) gaugeIds.set(g.kind, made.id);
    }
  });

  let total = 0;
  let rejectedLotId: string | null = null;
  for (const fam of FAMILIES) {
    const built = await runAsOf(new Date(start.getTime() - 7 * DAY), async () => {
      const p = await parts.create(engineer, fam.part);
      const draft = await plans.fromTemplate(engineer, p.id, fam.template);
      // Small lots of costly cores: special level S-3 keeps the sample to 13 cores (ISO 2859-1 Table 1, 281–500 → E).
      const tuned = await plans.update(engineer, draft.id, { samplingKind: 'aql', inspectionLevel: 'S-3', aql: 1.0, version: draft.version });
      return { part: p, plan: await plans.activate(engineer, tuned.id, tuned.version) };
    });
    const plan: Plan = built.plan;
    const sid = supplierId(fam.supplier);
    const weeks = Math.floor(182 / fam.everyDays);
    // The engineer freezes each chart's limits once ten weeks of supply show a stable process, so
    // later lots (Northgate's wearing die among them) are judged against that baseline.
    const freezeAfter = Math.ceil(70 / fam.everyDays) - 1;
    for (let k = 0; k <= weeks; k++) {
      const at = new Date(start.getTime() + k * fam.everyDays * DAY + rnd.int(0, 8) * 3600_000);
      if (at > today) break;
      const ageDays = (today.getTime() - at.getTime()) / DAY;
      const last = k === weeks || at.getTime() + fam.everyDays * DAY > today.getTime();
      // Northgate's die wears over the last two months: burr creeps up from ~21 µm toward the 50 µm limit.
      const burrMean = fam.supplier === 'NGL' && ageDays < 62 ? 21 + (62 - ageDays) * 0.36 : fam.supplier === 'SPW' ? 14 : 19;
      const quantity = rnd.int(fam.quantity[0], fam.quantity[1]);
      await runAsOf(at, async () => {
        const l = await lots.receive(inspector, { supplierId: sid, partId: built.part.id, supplierLotNumber: `${fam.supplier}-${at.toISOString().slice(2, 10).replace(/-/g, '')}-${rnd.int(10, 99)}`, poNumber: `PO-${4500120 + k}`, quantity, heatNumbers: [`H${rnd.int(40000, 49999)}`, `H${rnd.int(40000, 49999)}`], packagingCondition: rnd.next() < 0.04 ? 'damaged' : 'good', receivedAt: at.toISOString() });
        total++;
        // The newest lot of each supplier waits on the Dock, uninspected.
        if (last && fam.supplier !== 'NGL') return;
        const readings: ReadingInput[] = [];
        const rejectThis = fam.supplier === 'NGL' && last;
        l.samples.forEach((s, i) => {
          const core = { bx: rnd.normal(0, 0.006), by: rnd.normal(0, 0.006) };
          for (const c of plan.characteristics) {
            if (c.kind === 'derived') continue;
            if (c.kind === 'attribute') {
              readings.push({ sampleId: s.id, characteristicCode: c.code, values: [], pass: true, gaugeId: c.gaugeKind ? (gaugeIds.get(c.gaugeKind) ?? null) : null });
              continue;
            }
            let values = valuesFor(c, rnd, { burrMean, part: fam.part, core });
            // The rejected lot: two cores with burrs over the limit on the slot edges.
            if (rejectThis && c.code === 'BURR' && (i === 3 || i === 8)) values = values.map((v, j) => (j >= 2 ? 54 + j : v));
            readings.push({ sampleId: s.id, characteristicCode: c.code, values, gaugeId: c.gaugeKind ? (gaugeIds.get(c.gaugeKind) ?? null) : null });
          }
        });
        await runAsOf(new Date(at.getTime() + 2 * 3600_000), () => lots.putReadings(inspector, l.id, readings));
        await runAsOf(new Date(at.getTime() + 3 * 3600_000), async () => {
          const prop = await lots.proposal(db, l.id);
          const decision = prop.proposal === 'reject' ? 'reject' : 'accept';
          const comment = decision === 'accept' ? 'All sampled cores within limits; paperwork complete.' : `Rejected: ${prop.reason}. Burr above 50 µm on cores 4 and 9, slot edges.`;
          await lots.decide(inspector, l.id, { decision, comment, version: 1 });
          if (decision === 'reject' && rejectThis) rejectedLotId = l.id;
        });
        if (k === freezeAfter) {
          await runAsOf(new Date(at.getTime() + 26 * 3600_000), async () => {
            for (const c of plan.characteristics) {
              if (c.chartKind === 'none') continue;
              await spc.freeze(engineer, {
                supplierId: sid,
                partId: built.part.id,
                characteristicCode: c.code,
                baseline: { kind: 'dates', from: start.toISOString().slice(0, 10), to: at.toISOString().slice(0, 10) },
                reason: 'Phase I over the first ten weeks of supply: the process is stable and capable; new lots are judged against these limits.',
              });
            }
          });
        }
      });
    }
  }
  if (rejectedLotId) await reviewRejectedLot(app, users, rejectedLotId);
  return { lots: total, rejectedLotId };
}

/**
 * The newest Northgate lot was rejected for burr: raise its NCR, review it, disposition it
 * (sort the lot, scrap the two cores measured over the limit, e-signed), and issue the SCAR.
 * Northgate has answered its team, the problem and containment (D1–D3, accepted); the root
 * cause (D4) is still owed.
 */
async function reviewRejectedLot(app: INestApplicationContext, users: { inspector: SessionUser; engineer: SessionUser }, lotId: string): Promise<void> {
  const ncrs = app.get(NcrsService);
  const scars = app.get(CorrectiveActionsService);
  const lots = app.get(LotsService);
  const { engineer } = users;
  const l = await lots.get(engineer, lotId);
  const at = new Date(l.receivedAt).getTime();
  const ncr = await runAsOf(new Date(at + 4 * 3600_000), () =>
    ncrs.create(engineer, {
      lotId,
      title: 'Burr height over the limit on slot edges',
      requirement: 'Burr height at most 50 µm at every measured position (plan characteristic BURR).',
      found: 'Cores 4 and 9 of the sample measured 55–57 µm on the slot edges; the other cores 38–49 µm, with the lot-to-lot trend rising for two months.',
      defectCodes: ['BURR'],
      suspectQuantity: l.quantity,
    }),
  );
  const reviewing = await runAsOf(new Date(at + 20 * 3600_000), () => ncrs.transition(engineer, ncr.id, { to: 'in-review', version: ncr.version, note: 'Review board: quality, winding and purchasing' }));
  await runAsOf(new Date(at + 22 * 3600_000), () =>
    ncrs.disposition(engineer, ncr.id, {
      version: reviewing.version,
      lines: [
        { kind: 'sort', quantity: l.quantity - 2, rationale: '100 % burr check of the lot at receiving; cores within 50 µm released to winding.', hours: 9, rate: 42 },
        { kind: 'scrap', quantity: 2, rationale: 'The two cores measured over the limit: burr on slot edges risks slot-liner damage.', scrapValue: 2 * 38.5 },
      ],
      signature: { password: DEMO_PASSWORD, meaning: 'I approve this disposition' },
    }),
  );
  const scar = await runAsOf(new Date(at + 23 * 3600_000), () => scars.create(engineer, { ncrId: ncr.id }));
  const supplierUser = await app.get(UsersRepository).byEmail('quality@northgate-lamination.test');
  if (!supplierUser) return;
  const sup = toSessionUser(supplierUser);
  const stepVersion = (s: Scar, step: EightDStep) => s.steps.find((x) => x.step === step)!.version;
  let cur = await runAsOf(new Date(at + 30 * 3600_000), () => scars.get(sup, scar.id));
  cur = await runAsOf(new Date(at + 30.5 * 3600_000), () =>
    scars.putStep(sup, scar.id, 'D1', {
      answer: { members: [{ name: 'Mara Lind', role: 'Quality lead, team owner' }, { name: 'Jonas Brandt', role: 'Press line 3 tool setter' }, { name: 'Elif Sarac', role: 'Tool room, die maintenance' }] },
      submit: true,
      version: stepVersion(cur, 'D1'),
    }),
  );
  cur = await runAsOf(new Date(at + 30.7 * 3600_000), () =>
    scars.putStep(sup, scar.id, 'D2', {
      answer: { description: 'Lot delivered to Harrowgate with burr above 50 µm on the slot edges of 2 of 13 sampled cores (55–57 µm); burr on our own patrol checks has risen over eight weeks of production on press line 3, die HG-S48W-B.' },
      submit: true,
      version: stepVersion(cur, 'D2'),
    }),
  );
  cur = await runAsOf(new Date(at + 31 * 3600_000), () =>
    scars.putStep(sup, scar.id, 'D3', {
      answer: { actions: 'Stock at Northgate and the two pallets in transit checked for burr with a gauge on every slot edge; cores over 45 µm held.', atSupplier: { checked: 640, nonconforming: 9 }, inTransit: { checked: 380, nonconforming: 2 }, cleanMark: 'Green dot on the pallet label', effectiveFrom: new Date(at + 31 * 3600_000).toISOString().slice(0, 10) },
      submit: true,
      version: stepVersion(cur, 'D3'),
    }),
  );
  cur = await runAsOf(new Date(at + 34 * 3600_000), () => scars.reviewStep(engineer, scar.id, 'D3', { decision: 'accept', version: stepVersion(cur, 'D3'), comment: 'Containment accepted. Root cause and the die service plan are next.' }));
  cur = await runAsOf(new Date(at + 34.2 * 3600_000), () => scars.reviewStep(engineer, scar.id, 'D1', { decision: 'accept', version: stepVersion(cur, 'D1') }));
  await runAsOf(new Date(at + 34.4 * 3600_000), () => scars.reviewStep(engineer, scar.id, 'D2', { decision: 'accept', version: stepVersion(cur, 'D2') }));
}
