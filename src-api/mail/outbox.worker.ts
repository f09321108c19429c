import { Inject, Injectable, Logger, OnApplicationBootstrap, OnApplicationShutdown } from '@nestjs/common';
import { and, asc, eq, lte } from 'drizzle-orm';
import nodemailer, { type Transporter } from 'nodemailer';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db } from '../db/client';
import { outboxMessage } from '../db/schema';

export interface DeliveryResult {
  sent: number;
  retried: number;
  failed: number;
}

/** The SMTP transport of this app instance: its target comes from this instance's config. */
export function smtpTransport(cfg: Pick<AppConfig, 'SMTP_HOST' | 'SMTP_PORT'>): Transporter {
  return nodemailer.createTransport({
    host: cfg.SMTP_HOST,
    port: cfg.SMTP_PORT,
    secure: false,
    // The local capture server speaks plain SMTP on loopback.
    ignoreTLS: true,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 15_000,
  });
}

/** Retry delay after the n-th failed attempt: base × 2^(n−1), at most six hours. */
export function retryDelayMs(attempts: number, baseSeconds: number): number {
  return Math.min(baseSeconds * 2 ** Math.max(0, attempts - 1), 6 * 3600) * 1000;
}

/**
 * Delivers the outbox. Each mail is claimed with SELECT … FOR UPDATE SKIP LOCKED, sent, and
 * marked sent (or its failure counted) in that same transaction: two workers never take the same
 * mail, and a mail marked sent is never sent again. If the process dies between the SMTP reply
 * and the commit, the claim rolls back and the mail goes again with the same Message-ID, which
 * receiving systems use to drop the duplicate.
 */
@Injectable()
export class OutboxWorker implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly log = new Logger('OutboxWorker');
  private readonly transport: Transporter;
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<unknown> | null = null;

  constructor(
    @Inject(DB) private readonly db: Db,
    @Inject(CONFIG) private readonly cfg: AppConfig,
  ) {
    this.transport = smtpTransport(cfg);
  }

  onApplicationBootstrap(): void {
    if (this.cfg.WORKERS) this.start();
  }

  async onApplicationShutdown(): Promise<void> {
    this.stop();
    await this.running?.catch(() => undefined);
    this.transport.close();
  }

  /** Polls every few seconds (tests call deliverPending themselves instead). */
  start(everyMs = 3_000): void {
    if (this.timer) return;
    this.timer = setInterval(() => void this.tick(), everyMs);
    this.timer.unref();
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }

  private async tick(): Promise<void> {
    if (this.running) return;
    this.running = this.deliverPending().catch((err: unknown) => this.log.warn(`outbox delivery pass failed: ${(err as Error).message}`));
    try {
      await this.running;
    } finally {
      this.running = null;
    }
  }

  /** One pass over the mails due by `now`: each is tried once. */
  async deliverPending(opts: { now?: Date; limit?: number } = {}): Promise<DeliveryResult> {
    const at = opts.now ?? new Date();
    const limit = opts.limit ?? 200;
    const result: DeliveryResult = { sent: 0, retried: 0, failed: 0 };
    const seen = new Set<string>();
    for (let i = 0; i < limit; i++) {
      const outcome = await this.db.transaction(async (tx) => {
        const [m] = await tx
          .select()
          .from(outboxMessage)
          .where(and(eq(outboxMessage.status, 'pending'), lte(outboxMessage.nextAttemptAt, at)))
          .orderBy(asc(outboxMessage.nextAttemptAt), asc(outboxMessage.createdAt))
          .limit(1)
          .for('update', { skipLocked: true });
        if (!m || seen.has(m.id)) return null;
        seen.add(m.id);
        try {
          await this.transport.sendMail({
            from: this.cfg.MAIL_FROM,
            to: m.to,
            subject: m.subject,
            text: m.text,
            html: m.html ?? undefined,
            messageId: m.messageId,
            headers: { 'X-Yokeline-Outbox-Id': m.id },
          });
          await tx.update(outboxMessage).set({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1, lastError: null }).where(eq(outboxMessage.id, m.id));
          return 'sent' as const;
        } catch (err) {
          const attempts = m.attempts + 1;
          const failed = attempts >= this.cfg.MAIL_MAX_ATTEMPTS;
          const reason = (err as Error).message?.slice(0, 500) || 'SMTP delivery failed';
          await tx
            .update(outboxMessage)
            .set({ attempts, lastError: reason, status: failed ? 'failed' : 'pending', nextAttemptAt: new Date(at.getTime() + retryDelayMs(attempts, this.cfg.MAIL_RETRY_BASE_SECONDS)) })
            .where(eq(outboxMessage.id, m.id));
          return failed ? ('failed' as const) : ('retried' as const);
        }
      });
      if (!outcome) break;
      result[outcome] += 1;
    }
    return result;
  }
}
