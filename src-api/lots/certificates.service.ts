import { Inject, Injectable, PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import { eq } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { lot } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { StorageService } from '../storage/storage.service';
import { notFound } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { MIME, safeFileName, sniff } from '../common/file-sniff';
import type { SessionUser } from '../../shared/schemas/auth';
import type { Lot } from '../../shared/schemas/receiving';
import { LotsService } from './lots.service';

export const MAX_CERT_BYTES = 20 * 1024 * 1024;

@Injectable()
export class CertificatesService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly storage: StorageService,
    private readonly lots: LotsService,
  ) {}

  async attach(actor: SessionUser, lotId: string, file: { buffer: Buffer; originalname: string; size: number } | undefined): Promise<Lot> {
    if (!file) throw new ValidationFailed({ file: 'Attach the certificate (PDF or image)' });
    if (file.size > MAX_CERT_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'A certificate may be at most 20 MB' });
    const kind = sniff(file.buffer);
    if (kind !== 'pdf' && kind !== 'jpeg' && kind !== 'png' && kind !== 'webp') throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'The certificate must be a PDF, JPEG, PNG or WebP file' });
    const [l] = await this.db.select().from(lot).where(eq(lot.id, lotId));
    if (!l) throw notFound('lot');
    const key = this.storage.newKey(`certificates/${lotId}`);
    await this.storage.put(key, file.buffer, MIME[kind]);
    try {
      await this.db.transaction(async (tx) => {
        await tx.update(lot).set({ certificateKey: key, certificateName: safeFileName(file.originalname, `certificate.${kind}`), certificateType: MIME[kind], updatedAt: new Date() }).where(eq(lot.id, lotId));
        await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'lot.certificate_attached', entity: 'lot', entityId: lotId, before: { certificate: l.certificateName }, after: { certificate: safeFileName(file.originalname, 'certificate'), bytes: file.size } });
      });
    } catch (err) {
      await this.storage.delete(key);
      throw err;
    }
    return this.lots.get(actor, lotId);
  }

  async file(lotId: string) {
    const [l] = await this.db.select().from(lot).where(eq(lot.id, lotId));
    if (!l || !l.certificateKey) throw notFound('certificate');
    const f = await this.storage.get(l.certificateKey);
    return { ...f, contentType: l.certificateType ?? f.contentType, name: safeFileName(l.certificateName ?? undefined, 'certificate') };
  }
}
