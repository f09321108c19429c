import { Inject, Injectable, PayloadTooLargeException } from '@nestjs/common';
import { and, eq, inArray } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { ncr, ncrPhoto, photo } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { StorageService } from '../storage/storage.service';
import { notFound } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { now } from '../common/clock';
import { ingestImage, MAX_PHOTO_BYTES } from '../lots/photos.service';
import type { SessionUser } from '../../shared/schemas/auth';
import type { NcrPhoto } from '../../shared/schemas/ncr';
import { illegalTransition } from './ncrs.service';
import { toNcrPhoto } from './ncr-views';

/** Photos on an NCR: the lot's own photos linked in, or new ones through the same image checks. */
@Injectable()
export class NcrPhotosService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly storage: StorageService,
  ) {}

  private async openNcr(id: string) {
    const [row] = await this.db.select().from(ncr).where(eq(ncr.id, id));
    if (!row) throw notFound('NCR');
    if (row.status === 'closed') throw illegalTransition(`${row.number} is closed; its record no longer changes.`);
    return row;
  }

  async upload(actor: SessionUser, ncrId: string, file: { buffer: Buffer; size: number } | undefined, caption?: string): Promise<NcrPhoto> {
    if (!file) throw new ValidationFailed({ file: 'Attach a photo (multipart field "file")' });
    if (file.size > MAX_PHOTO_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'A photo may be at most 20 MB' });
    const n = await this.openNcr(ncrId);
    const img = await ingestImage(file.buffer);
    const webKey = this.storage.newKey(`ncr-photos/${ncrId}`);
    const thumbKey = `${webKey}-thumb`;
    await this.storage.put(webKey, img.web, 'image/jpeg');
    try {
      await this.storage.put(thumbKey, img.thumb, 'image/jpeg');
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(ncrPhoto)
          .values({ ncrId, caption: caption?.trim().slice(0, 300) || null, webKey, thumbKey, width: img.width, height: img.height, bytes: img.web.length, uploadedBy: actor.id, createdAt: now() })
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'ncr.photo_added', entity: 'ncr', entityId: ncrId, after: { photo: row.id, caption: row.caption, ncr: n.number } });
        return toNcrPhoto(row);
      });
    } catch (err) {
      await this.storage.delete(webKey);
      await this.storage.delete(thumbKey);
      throw err;
    }
  }

  /** Links photos already taken of the NCR's lot (the bench's pictures). */
  async link(actor: SessionUser, ncrId: string, photoIds: string[]): Promise<NcrPhoto[]> {
    const n = await this.openNcr(ncrId);
    if (!n.lotId) throw new ValidationFailed({ photoIds: 'This NCR has no lot; upload photos to it instead' });
    const ids = [...new Set(photoIds)];
    const photos = await this.db.select().from(photo).where(and(eq(photo.lotId, n.lotId), inArray(photo.id, ids)));
    if (photos.length !== ids.length) throw new ValidationFailed({ photoIds: 'Some photos are not photos of this NCR’s lot' });
    return this.db.transaction(async (tx) => {
      const rows = await tx
        .insert(ncrPhoto)
        .values(photos.map((p) => ({ ncrId, photoId: p.id, caption: p.caption, webKey: p.webKey, thumbKey: p.thumbKey, width: p.width, height: p.height, bytes: p.bytes, uploadedBy: actor.id, createdAt: now() })))
        .onConflictDoNothing()
        .returning();
      if (rows.length) await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'ncr.photos_linked', entity: 'ncr', entityId: ncrId, after: { photos: rows.map((r) => r.photoId) } });
      return rows.map(toNcrPhoto);
    });
  }

  async file(user: SessionUser, ncrId: string, photoId: string, which: 'web' | 'thumb') {
    const [row] = await this.db
      .select({ p: ncrPhoto, supplierId: ncr.supplierId })
      .from(ncrPhoto)
      .innerJoin(ncr, eq(ncr.id, ncrPhoto.ncrId))
      .where(and(eq(ncrPhoto.id, photoId), eq(ncrPhoto.ncrId, ncrId)));
    if (!row || (user.role === 'supplier' && row.supplierId !== user.supplierId)) throw notFound('photo');
    return this.storage.get(which === 'web' ? row.p.webKey : row.p.thumbKey);
  }
}
