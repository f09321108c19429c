import { Injectable, Logger } from '@nestjs/common';
import type { Readable } from 'node:stream';
import { LedgerRepository, person } from '../ledger/ledger.repository';
import { publicSampling } from '../ledger/ledger.service';
import { StorageService } from '../storage/storage.service';
import { ValidationFailed } from '../common/zod.pipe';
import { MAX_PDF_CORES } from '../../shared/schemas/ledger';
import type { SessionUser } from '../../shared/schemas/auth';
import { renderLotReport, type LotReportData } from './lot-report-pdf';

/** Photos drawn in the report; the rest are counted and left to the lot file. */
export const MAX_REPORT_PHOTOS = 12;

async function toBuffer(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body) chunks.push(typeof c === 'string' ? Buffer.from(c) : (c as Buffer));
  return Buffer.concat(chunks);
}

/** The lot inspection report as a PDF, rendered in the request (hence the core limit). */
@Injectable()
export class LotReportService {
  private readonly log = new Logger('LotReportService');

  constructor(
    private readonly repo: LedgerRepository,
    private readonly storage: StorageService,
  ) {}

  async data(lotId: string, user: SessionUser, now = new Date()): Promise<LotReportData> {
    const h = await this.repo.lotHeader(lotId);
    const samples = await this.repo.samples(lotId);
    if (samples.length > MAX_PDF_CORES) {
      throw new ValidationFailed(
        { id: `This lot has ${samples.length} sampled cores; the PDF report is limited to ${MAX_PDF_CORES}. Export its readings as CSV instead.` },
        `The PDF report is limited to ${MAX_PDF_CORES} sampled cores`,
      );
    }
    const [chars, readings, photos, linked, audit] = await Promise.all([
      this.repo.characteristics(h.l.planId),
      this.repo.readings(lotId),
      this.repo.photos(lotId),
      this.repo.linked(lotId),
      this.repo.audit([{ entity: 'lot', ids: [lotId] }]),
    ]);
    const thumbs: LotReportData['photos'] = [];
    for (const p of photos.slice(0, MAX_REPORT_PHOTOS)) {
      try {
        const f = await this.storage.get(p.p.thumbKey);
        thumbs.push({ image: await toBuffer(f.body), caption: [p.p.caption, p.serial != null ? `core ${p.serial}` : null, p.p.characteristicCode].filter(Boolean).join(' · ') || null });
      } catch (err) {
        // A missing thumbnail must not cost the auditor the whole report; it is said on the page.
        this.log.warn({ err, photoId: p.p.id }, 'report: photo thumbnail unavailable');
        thumbs.push({ image: null, caption: p.p.caption });
      }
    }
    return {
      generatedAt: now,
      generatedBy: user.email,
      lot: {
        ref: h.l.ref,
        supplierLotNumber: h.l.supplierLotNumber,
        poNumber: h.l.poNumber,
        quantity: h.l.quantity,
        heatNumbers: h.l.heatNumbers,
        packaging: h.l.packagingCondition + (h.l.packagingNote ? ` (${h.l.packagingNote})` : ''),
        certificate: h.l.certificateName,
        status: h.l.status,
        receivedAt: h.l.receivedAt,
        receivedBy: person(h.receivedBy),
        decision: h.l.decision,
        decisionComment: h.l.decisionComment,
        nonconformingCount: h.l.nonconformingCount,
        decidedAt: h.l.decidedAt,
        decidedBy: person(h.decidedBy),
      },
      supplier: { code: h.s.code, name: h.s.name },
      part: { number: h.p.partNumber, revision: h.p.revision, description: h.p.description, construction: h.p.construction, steelGrade: h.p.steelGrade },
      plan: { revision: h.plan.revision, status: h.plan.status, activatedAt: h.plan.activatedAt },
      sampling: publicSampling(h.l.sampling),
      characteristics: chars.map((c) => ({ code: c.code, name: c.name, kind: c.kind, unit: c.unit, lsl: c.lsl, nominal: c.nominal, usl: c.usl, severity: c.severity })),
      cores: samples.map((s) => s.serial),
      readings: readings.map((r) => ({ serial: r.serial, code: r.r.characteristicCode, value: r.r.value, pass: r.r.pass, conforming: r.r.conforming, gaugeId: r.r.gaugeId, gaugeAssetTag: r.gaugeAssetTag, gaugeDueOn: r.r.gaugeDueOn })),
      photos: thumbs,
      morePhotos: Math.max(0, photos.length - MAX_REPORT_PHOTOS),
      ncrs: linked.ncrs.map((n) => ({ number: n.number, status: n.status, title: n.title })),
      scars: linked.scars.map((s) => ({ number: s.number, status: s.status })),
      audit: audit.map((a) => ({ id: a.id, at: a.at, action: a.action, actor: a.actorEmail, hash: a.hash })),
    };
  }

  async render(lotId: string, user: SessionUser): Promise<{ pdf: Buffer; ref: number }> {
    const d = await this.data(lotId, user);
    return { pdf: await renderLotReport(d), ref: d.lot.ref };
  }
}
