import { Inject, Injectable, PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import { DB, type Db } from '../db/client';
import { correctiveAction, correctiveActionEvidence, correctiveActionStep } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { StorageService } from '../storage/storage.service';
import { notFound } from '../common/errors';
import { ValidationFailed } from '../common/zod.pipe';
import { now } from '../common/clock';
import { MIME, safeFileName, sniff } from '../common/file-sniff';
import { ingestImage } from '../lots/photos.service';
import type { EightDStep } from '../../shared/compute/workflow';
import type { Evidence } from '../../shared/schemas/corrective-action';
import type { SessionUser } from '../../shared/schemas/auth';
import { illegalTransition } from '../ncrs/ncrs.service';

export const MAX_EVIDENCE_BYTES = 20 * 1024 * 1024;
const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';

/**
 * Evidence for a step (PDF reports, photos). The type is read from the bytes, never the name:
 * PDFs are kept as sent, images go through the same checks as lot photos and are re-encoded
 * without their metadata; anything else is refused with 415.
 */
@Injectable()
export class EvidenceService {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
    private readonly storage: StorageService,
  ) {}

  private scoped(user: SessionUser, id: string) {
    return and(eq(correctiveAction.id, id), user.role === 'supplier' ? eq(correctiveAction.supplierId, user.supplierId ?? NO_SUPPLIER) : undefined);
  }

  async add(user: SessionUser, id: string, step: EightDStep, file: { buffer: Buffer; size: number; originalname: string } | undefined, caption?: string): Promise<Evidence> {
    const [ca] = await this.db.select().from(correctiveAction).where(this.scoped(user, id));
    if (!ca) throw notFound('corrective action');
    if (!file) throw new ValidationFailed({ file: 'Attach a file (multipart field "file")' });
    if (file.size > MAX_EVIDENCE_BYTES) throw new PayloadTooLargeException({ error: 'too_large', message: 'Evidence files may be at most 20 MB each' });
    const [s] = await this.db.select().from(correctiveActionStep).where(and(eq(correctiveActionStep.correctiveActionId, id), eq(correctiveActionStep.step, step)));
    if (ca.status === 'closed' || !(s.status === 'open' || s.status === 'returned')) {
      throw illegalTransition(ca.status === 'closed' ? `${ca.number} is closed.` : `${step} is not open for answers, so evidence cannot be added to it now.`);
    }
    const kind = sniff(file.buffer);
    let body: Buffer;
    let type: string;
    let name: string;
    if (kind === 'pdf') {
      body = file.buffer;
      type = MIME.pdf;
      name = safeFileName(file.originalname, 'evidence.pdf');
    } else if (kind === 'jpeg' || kind === 'png' || kind === 'webp') {
      body = (await ingestImage(file.buffer)).web;
      type = 'image/jpeg';
      name = safeFileName(file.originalname, 'evidence.jpg').replace(/\.(png|webp|jpe?g)$/i, '') + '.jpg';
    } else {
      throw new UnsupportedMediaTypeException({ error: 'unsupported_media_type', message: 'Evidence must be a PDF or a JPEG, PNG or WebP image' });
    }
    const key = this.storage.newKey(`evidence/${id}`);
    await this.storage.put(key, body, type);
    try {
      return await this.db.transaction(async (tx) => {
        const [row] = await tx
          .insert(correctiveActionEvidence)
          .values({ correctiveActionId: id, step, key, name, contentType: type, bytes: body.length, caption: caption?.trim().slice(0, 300) || null, uploadedBy: user.id, createdAt: now() })
          .returning();
        await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: 'corrective_action.evidence_added', entity: 'corrective_action', entityId: id, after: { step, evidence: row.id, name, type, bytes: body.length } });
        return { id: row.id, step: row.step, name: row.name, contentType: row.contentType, bytes: row.bytes, caption: row.caption, createdAt: row.createdAt.toISOString() };
      });
    } catch (err) {
      await this.storage.delete(key);
      throw err;
    }
  }

  async file(user: SessionUser, id: string, evidenceId: string) {
    const [row] = await this.db
      .select({ e: correctiveActionEvidence })
      .from(correctiveActionEvidence)
      .innerJoin(correctiveAction, eq(correctiveAction.id, correctiveActionEvidence.correctiveActionId))
      .where(and(eq(correctiveActionEvidence.id, evidenceId), this.scoped(user, id)));
    if (!row) throw notFound('evidence');
    const f = await this.storage.get(row.e.key);
    return { body: f.body, contentType: row.e.contentType, name: row.e.name };
  }
}
