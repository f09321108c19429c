import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Readable } from 'node:stream';
import { asc, eq } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { ncrPhoto } from '../db/schema';
import { NcrsService } from '../ncrs/ncrs.service';
import { CorrectiveActionsService } from '../corrective-actions/corrective-actions.service';
import { StorageService } from '../storage/storage.service';
import type { SessionUser } from '../../shared/schemas/auth';
import { renderNcrReport, renderScarReport, type NcrReportData } from './ncr-reports-pdf';

/** Photos drawn in the NCR report; the rest are counted and left to the NCR page. */
export const MAX_NCR_REPORT_PHOTOS = 12;

async function toBuffer(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body) chunks.push(typeof c === 'string' ? Buffer.from(c) : (c as Buffer));
  return Buffer.concat(chunks);
}

/** The NCR report and the 8D report as PDFs, rendered in the request from the same records the pages show. */
@Injectable()
export class NcrReportsService {
  private readonly log = new Logger('NcrReportsService');

  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly ncrs: NcrsService,
    private readonly scars: CorrectiveActionsService,
    private readonly storage: StorageService,
  ) {}

  async ncrData(id: string, user: SessionUser, at = new Date()): Promise<NcrReportData> {
    const ncr = await this.ncrs.getFull(id);
    const rows = await this.db.select().from(ncrPhoto).where(eq(ncrPhoto.ncrId, id)).orderBy(asc(ncrPhoto.createdAt));
    const photos: NcrReportData['photos'] = [];
    for (const p of rows.slice(0, MAX_NCR_REPORT_PHOTOS)) {
      try {
        const f = await this.storage.get(p.thumbKey);
        photos.push({ image: await toBuffer(f.body), caption: p.caption });
      } catch (err) {
        // A missing thumbnail must not cost the reader the whole report; it is said on the page.
        this.log.warn({ err, photoId: p.id }, 'NCR report: photo thumbnail unavailable');
        photos.push({ image: null, caption: p.caption });
      }
    }
    return { generatedAt: at, generatedBy: user.email, ncr, photos, morePhotos: Math.max(0, rows.length - MAX_NCR_REPORT_PHOTOS) };
  }

  async renderNcr(id: string, user: SessionUser): Promise<{ pdf: Buffer; number: string }> {
    const d = await this.ncrData(id, user);
    return { pdf: await renderNcrReport(d), number: d.ncr.number };
  }

  async renderScar(id: string, user: SessionUser): Promise<{ pdf: Buffer; number: string }> {
    const scar = await this.scars.get(user, id);
    return { pdf: await renderScarReport({ generatedAt: new Date(), generatedBy: user.email, scar }), number: scar.number };
  }
}
