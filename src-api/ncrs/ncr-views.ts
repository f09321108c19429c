import type { disposition, eSignature, ncr, ncrPhoto } from '../db/schema';
import type { Disposition, ESignature, LinkedReading, NcrForSupplier, NcrPhoto, NcrSummary } from '../../shared/schemas/ncr';

type NcrRow = typeof ncr.$inferSelect;

export interface NcrJoins {
  s: { code: string; name: string } | null;
  p: { partNumber: string; revision: string } | null;
  l: { ref: number; supplierLotNumber: string } | null;
  raisedByName: string | null;
  scar: { id: string; number: string } | null;
}

export function toNcrSummary(r: NcrRow, j: NcrJoins): NcrSummary {
  return {
    id: r.id,
    number: r.number,
    status: r.status,
    source: r.source,
    title: r.title,
    supplierId: r.supplierId,
    supplierCode: j.s?.code ?? null,
    supplierName: j.s?.name ?? null,
    partId: r.partId,
    partNumber: j.p?.partNumber ?? null,
    partRevision: j.p?.revision ?? null,
    lotId: r.lotId,
    lotRef: j.l?.ref ?? null,
    supplierLotNumber: j.l?.supplierLotNumber ?? null,
    defectCodes: r.defectCodes,
    suspectQuantity: r.suspectQuantity,
    raisedAt: r.raisedAt.toISOString(),
    raisedByName: j.raisedByName,
    scarId: j.scar?.id ?? null,
    scarNumber: j.scar?.number ?? null,
    version: r.version,
  };
}

export function toNcrPhoto(r: typeof ncrPhoto.$inferSelect): NcrPhoto {
  return { id: r.id, caption: r.caption, width: r.width, height: r.height, fromLot: r.photoId !== null, createdAt: r.createdAt.toISOString() };
}

export function toDisposition(r: typeof disposition.$inferSelect): Disposition {
  return {
    id: r.id,
    kind: r.kind,
    quantity: r.quantity,
    rationale: r.rationale,
    concessionRef: r.concessionRef,
    hours: r.hours,
    rate: r.rate,
    scrapValue: r.scrapValue,
    freight: r.freight,
    cost: r.cost,
    createdAt: r.createdAt.toISOString(),
  };
}

export function toSignature(r: typeof eSignature.$inferSelect): ESignature {
  return { id: r.id, purpose: r.purpose, signerName: r.signerName, signerEmail: r.signerEmail, meaning: r.meaning, signedAt: r.signedAt.toISOString(), contentHash: r.contentHash };
}

/** The supplier's view of its own NCR: facts and outcome; no people, costs, signatures or notes. */
export function toSupplierNcr(s: NcrSummary, r: NcrRow, dispositions: Disposition[], photos: NcrPhoto[], readings: LinkedReading[]): NcrForSupplier {
  return {
    id: s.id,
    number: s.number,
    status: s.status,
    title: s.title,
    partNumber: s.partNumber,
    partRevision: s.partRevision,
    lotId: s.lotId,
    lotRef: s.lotRef,
    supplierLotNumber: s.supplierLotNumber,
    requirement: r.requirement,
    found: r.found,
    defectCodes: s.defectCodes,
    suspectQuantity: s.suspectQuantity,
    raisedAt: s.raisedAt,
    dispositions: dispositions.map((d) => ({ kind: d.kind, quantity: d.quantity })),
    measured: readings.map(({ id: _id, sampleId: _sampleId, note: _note, ...measured }) => measured),
    photos,
    scarId: s.scarId,
    scarNumber: s.scarNumber,
  };
}
