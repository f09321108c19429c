import type { lot, lotSample, photo, reading } from '../db/schema';
import type { Lot, LotSummary, Photo, Reading } from '../../shared/schemas/receiving';

type LotRow = typeof lot.$inferSelect;

export function toSummary(r: LotRow, s: { code: string; name: string }, p: { partNumber: string; revision: string }): LotSummary {
  const { plan: _plan, lotSize: _ls, ...sampling } = r.sampling;
  return {
    id: r.id,
    ref: r.ref,
    supplierId: r.supplierId,
    supplierCode: s.code,
    supplierName: s.name,
    partId: r.partId,
    partNumber: p.partNumber,
    partRevision: p.revision,
    supplierLotNumber: r.supplierLotNumber,
    poNumber: r.poNumber,
    quantity: r.quantity,
    receivedAt: r.receivedAt.toISOString(),
    status: r.status,
    sampling,
    decision: r.decision,
    version: r.version,
  };
}

export function toReading(r: typeof reading.$inferSelect): Reading {
  return {
    sampleId: r.sampleId,
    characteristicCode: r.characteristicCode,
    values: r.values,
    value: r.value,
    pass: r.pass,
    conforming: r.conforming,
    note: r.note,
    gaugeId: r.gaugeId,
    gaugeDueOn: r.gaugeDueOn,
    enteredBy: r.enteredBy,
    enteredAt: r.enteredAt.toISOString(),
    source: r.source,
  };
}

export function toPhoto(r: typeof photo.$inferSelect): Photo {
  return {
    id: r.id,
    sampleId: r.sampleId,
    characteristicCode: r.characteristicCode,
    caption: r.caption,
    width: r.width,
    height: r.height,
    bytes: r.bytes,
    createdAt: r.createdAt.toISOString(),
  };
}

export function toLot(
  r: LotRow,
  s: { code: string; name: string },
  p: { partNumber: string; revision: string },
  planRevision: number,
  samples: (typeof lotSample.$inferSelect)[],
  readings: (typeof reading.$inferSelect)[],
  photos: (typeof photo.$inferSelect)[],
): Lot {
  return {
    ...toSummary(r, s, p),
    planId: r.planId,
    planRevision,
    heatNumbers: r.heatNumbers,
    packagingCondition: r.packagingCondition,
    packagingNote: r.packagingNote,
    certificate: r.certificateKey && r.certificateName ? { name: r.certificateName, type: r.certificateType ?? '' } : null,
    decisionComment: r.decisionComment,
    nonconformingCount: r.nonconformingCount,
    decidedBy: r.decidedBy,
    decidedAt: r.decidedAt?.toISOString() ?? null,
    samples: samples.map((x) => ({ id: x.id, serial: x.serial })),
    readings: readings.map(toReading),
    photos: photos.map(toPhoto),
  };
}

/** The reduced view a supplier user gets of its own lot: no internal notes or people. */
export function forSupplier(l: Lot): Lot {
  return { ...l, decidedBy: null, readings: l.readings.map((r) => ({ ...r, enteredBy: null, gaugeId: null, gaugeDueOn: null })) };
}
