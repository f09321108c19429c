import { Inject, Injectable } from '@nestjs/common';
import { and, desc, eq, gte, sql } from 'drizzle-orm';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db, type Tx } from '../db/client';
import { appUser, part, supplier, supplierNotice } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { OutboxService } from '../mail/outbox.service';
import { publicLink, renderMail } from '../mail/mail-templates';
import { notFound } from '../common/errors';
import { now } from '../common/clock';
import type { SessionUser } from '../../shared/schemas/auth';
import type { SupplierNotice } from '../../shared/schemas/corrective-action';

const NO_SUPPLIER = '00000000-0000-0000-0000-000000000000';
/** The same die is not announced again within this many days. */
export const DIE_NOTICE_QUIET_DAYS = 14;

export interface DieServiceDueInput {
  supplierId: string;
  partId: string;
  characteristicCode: string;
  /** The forecast's lots left before the upper limit (may be fractional), when known. */
  lotsRemaining?: number | null;
  /** A sentence from Drift watch on why (trend, limit), shown and mailed as is (escaped). */
  detail?: string | null;
  signalId?: string | null;
  actor?: { id: string; email: string } | null;
}

export const deskNoticePath = (id: string) => `/supplier-desk?notice=${id}`;

/**
 * Notices to suppliers on their desk. Drift watch calls dieServiceDue when a wear-driven
 * characteristic is forecast to reach its limit soon; the notice and its mail are written in
 * the caller's transaction (or one of their own).
 */
@Injectable()
export class SupplierNoticesService {
  constructor(
    @Inject(DB) private readonly db: Db,
    @Inject(CONFIG) private readonly cfg: AppConfig,
    private readonly audit: AuditRepository,
    private readonly outbox: OutboxService,
  ) {}

  async dieServiceDue(input: DieServiceDueInput, txIn?: Tx): Promise<{ noticeId: string; mailId: string | null; created: boolean }> {
    const work = async (tx: Tx) => {
      // Serialise per supplier × part × characteristic so two lots decided at once announce once.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`die:${input.supplierId}:${input.partId}:${input.characteristicCode}`}))`);
      const since = new Date(now().getTime() - DIE_NOTICE_QUIET_DAYS * 86_400_000);
      const [recent] = await tx
        .select({ id: supplierNotice.id })
        .from(supplierNotice)
        .where(and(eq(supplierNotice.supplierId, input.supplierId), eq(supplierNotice.partId, input.partId), eq(supplierNotice.characteristicCode, input.characteristicCode), eq(supplierNotice.kind, 'die-service-due'), gte(supplierNotice.createdAt, since)));
      if (recent) return { noticeId: recent.id, mailId: null, created: false };
      const [s] = await tx.select().from(supplier).where(eq(supplier.id, input.supplierId));
      const [p] = await tx.select().from(part).where(eq(part.id, input.partId));
      if (!s || !p) throw notFound(!s ? 'supplier' : 'part');
      const lots = input.lotsRemaining == null ? null : Math.max(0, input.lotsRemaining);
      const title = `Die service due: ${p.partNumber} rev ${p.revision}, ${input.characteristicCode}`;
      const body = [
        lots == null ? `The trend of ${input.characteristicCode} on ${p.partNumber} rev ${p.revision} is approaching its upper limit.` : `At the present trend, ${input.characteristicCode} on ${p.partNumber} rev ${p.revision} reaches its upper limit in about ${lots < 1 ? 'less than one lot' : `${Math.floor(lots)} lot${Math.floor(lots) === 1 ? '' : 's'}`}.`,
        'Please plan the die service (resharpening) before the next shipments.',
        input.detail ?? '',
      ]
        .filter(Boolean)
        .join(' ');
      const [notice] = await tx
        .insert(supplierNotice)
        .values({ supplierId: s.id, kind: 'die-service-due', title, body, partId: p.id, characteristicCode: input.characteristicCode, lotsRemaining: lots, signalId: input.signalId ?? null, createdBy: input.actor?.id ?? null, createdAt: now() })
        .returning();
      const users = await tx.select({ email: appUser.email }).from(appUser).where(and(eq(appUser.supplierId, s.id), eq(appUser.role, 'supplier'), eq(appUser.active, true)));
      const to = [...s.contactEmails, ...users.map((u) => u.email)];
      const mail = renderMail({
        heading: title,
        paragraphs: [body],
        facts: [
          ['Part', `${p.partNumber} rev ${p.revision}`],
          ['Characteristic', input.characteristicCode],
          ['Lots to the limit', lots == null ? '—' : lots.toFixed(1)],
        ],
        link: { href: publicLink(this.cfg.PUBLIC_URL, deskNoticePath(notice.id)), label: 'See the notice on the Supplier desk' },
      });
      const mailId = await this.outbox.enqueue(tx, { kind: 'die-service-due', to, subject: title, ...mail, entity: 'supplier_notice', entityId: notice.id });
      await this.audit.record(tx, { actorId: input.actor?.id ?? null, actorEmail: input.actor?.email ?? null, action: 'supplier_notice.die_service_due', entity: 'supplier_notice', entityId: notice.id, after: { supplier: s.code, part: p.partNumber, characteristic: input.characteristicCode, lotsRemaining: lots, recipients: to } });
      return { noticeId: notice.id, mailId, created: true };
    };
    return txIn ? work(txIn) : this.db.transaction(work);
  }

  async list(user: SessionUser, supplierId?: string): Promise<SupplierNotice[]> {
    const scope = user.role === 'supplier' ? eq(supplierNotice.supplierId, user.supplierId ?? NO_SUPPLIER) : supplierId ? eq(supplierNotice.supplierId, supplierId) : undefined;
    const rows = await this.db
      .select({ n: supplierNotice, p: { partNumber: part.partNumber, revision: part.revision } })
      .from(supplierNotice)
      .leftJoin(part, eq(part.id, supplierNotice.partId))
      .where(scope)
      .orderBy(desc(supplierNotice.createdAt))
      .limit(100);
    return rows.map(({ n, p }) => ({
      id: n.id,
      kind: n.kind,
      title: n.title,
      body: n.body,
      partId: n.partId,
      partNumber: p?.partNumber ?? null,
      partRevision: p?.revision ?? null,
      characteristicCode: n.characteristicCode,
      lotsRemaining: n.lotsRemaining,
      createdAt: n.createdAt.toISOString(),
    }));
  }
}
