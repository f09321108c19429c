import { BadRequestException, Inject, Injectable, PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import sharp, { type Metadata } from 'sharp';
import { DB, type Db } from '../db/client';
import { lot, lotSample, photo, planCharacteristic } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { StorageService } from '../storage/storage.service';
import { notFound } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { sniff } from '../common/file-sniff';
import type { SessionUser } from '../../shared/schemas/auth';
import type { Photo } from '../../shared/schemas/receiving';
import { toPhoto } from './lot-views';

export const MAX_PHOTO_BYTES = 20 * 1024 * 1024;
/** 50 megapixels: above any phone or tablet camera, far below a decompression bomb. */
export const MAX_PHOTO_PIXELS = 50_000_000;
export const WEB_PX = 2048;
export const THUMB_PX = 320;

export interface IngestedImage {
  web: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
}

/**
 * Re-encodes an upload: auto-rotate from EXIF, then write fresh JPEGs. sharp writes no
 * metadata unless asked (no EXIF, no GPS, no XMP), so nothing of the original's survives.
 */
export async function ingestImage(buf: Buffer): Promise<IngestedImage> {
  const kind = sniff(buf);
  if (kind !== 'jpeg' && kind !== 'png' && kind !== 'webp') {
    throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'Photos must be JPEG, PNG or WebP images' });
  }
  let meta: Metadata;
  try {
    meta = await sharp(buf, { limitInputPixels: false }).metadata();
  } catch {
    throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'This image cannot be read; it may be damaged' });
  }
  if (!meta.width || !meta.height || meta.width * meta.height > MAX_PHOTO_PIXELS) {
    throw new PayloadTooLargeException({ error: 'too_large', message: `The image is ${meta.width}×${meta.height} pixels; at most ${MAX_PHOTO_PIXELS / 1e6} megapixels are accepted` });
  }
  try {
    const base = sharp(buf, { limitInputPixels: MAX_PHOTO_PIXELS, failOn: 'error' }).rotate();
    const web = await base.clone().resize(WEB_PX, WEB_PX, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 82, mozjpeg: false }).toBuffer({ resolveWithObject: true });
    const thumb = await base.clone().resize(THUMB_PX, THUMB_PX, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 72 }).toBuffer();
    return { web: web.data, thumb, width: web.info.width, height: web.info.height };
  } catch {
    throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'This image cannot be decoded; it may be damaged or truncated' });
  }
}

@Injectable()
export class PhotosService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly storage: StorageService,
  ) {}

  async upload(actor: SessionUser, lotId: string, file: { buffer: Buffer; size: number } | undefined, meta: { sampleId?: string; characteristicCode?: string; caption?: string }): Promise<Photo> {
    if (!file) throw new ValidationFailed({ file: 'Attach a photo (multipart field "file")' });
    if (file.size > MAX_PHOTO_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'A photo may be at most 20 MB' });
    const [l] = await this.db.select().from(lot).where(eq(lot.id, lotId));
    if (!l) throw notFound('lot');
    const caption = meta.caption?.trim().slice(0, 300) || null;
    if (meta.sampleId) {
      if (!/^[0-9a-f-]{36}$/i.test(meta.sampleId)) throw new ValidationFailed({ sampleId: 'sampleId must be a core of this lot' });
      const [s] = await this.db.select().from(lotSample).where(and(eq(lotSample.id, meta.sampleId), eq(lotSample.lotId, lotId)));
      if (!s) throw new ValidationFailed({ sampleId: 'This core is not one of the sampled cores of this lot' });
    }
    const code = meta.characteristicCode?.trim().toUpperCase() || null;
    if (code) {
      const [c] = await this.db.select().from(planCharacteristic).where(and(eq(planCharacteristic.planId, l.planId), eq(planCharacteristic.code, code)));
      if (!c) throw new BadRequestException({ error: 'validation', message: 'Unknown characteristic', fields: { characteristicCode: `${code} is not in this lot's plan` } });
    }
    const img = await ingestImage(file.buffer);
    const webKey = this.storage.newKey(`photos/${lotId}`);
    const thumbKey = `${webKey}-thumb`;
    await this.storage.put(webKey, img.web, 'image/jpeg');
    try {
      await this.storage.put(thumbKey, img.thumb, 'image/jpeg');
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(photo)
          .values({ lotId, sampleId: meta.sampleId ?? null, characteristicCode: code, caption, webKey, thumbKey, width: img.width, height: img.height, bytes: img.web.length, uploadedBy: actor.id })
          .returning();
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'lot.photo_added', entity: 'lot', entityId: lotId, after: { photo: row.id, sampleId: row.sampleId, characteristicCode: code, caption } });
        return toPhoto(row);
      });
    } catch (err) {
      // Leave no orphan objects behind a failed write.
      await this.storage.delete(webKey);
      await this.storage.delete(thumbKey);
      throw err;
    }
  }

  async file(user: SessionUser, id: string, which: 'web' | 'thumb') {
    const [row] = await this.db.select({ p: photo, supplierId: lot.supplierId }).from(photo).innerJoin(lot, eq(lot.id, photo.lotId)).where(eq(photo.id, id));
    if (!row || (user.role === 'supplier' && row.supplierId !== user.supplierId)) throw notFound('photo');
    return this.storage.get(which === 'web' ? row.p.webKey : row.p.thumbKey);
  }
}
