import { Inject, Injectable, Logger, OnApplicationBootstrap, OnApplicationShutdown } from '@nestjs/common';
import { and, eq, inArray, isNotNull, ne, notInArray, or, sql } from 'drizzle-orm';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db } from '../db/client';
import { correctiveAction, correctiveActionStep, supplier } from '../db/schema';
import { OutboxService } from '../mail/outbox.service';
import { now } from '../common/clock';
import { isoDateOf, previousWorkingDay } from '../../shared/compute/working-days';
import type { EightDStep } from '../../shared/compute/workflow';
import { dueMail } from './scar-mail';

export interface ScanResult {
  reminders: number;
  overdue: number;
}

/**
 * Reminders one working day before a step is due, and a notice once it is overdue. Steps that
 * share a due date go in one mail. Each step remembers the due date it was reminded for (and the
 * mail has a dedupe key), so running the scan often, or in two processes, never repeats a mail.
 */
@Injectable()
export class DueDatesService implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly log = new Logger('DueDates');
  private timer: NodeJS.Timeout | null = null;

  constructor(
    @Inject(DB) private readonly db: Db,
    @Inject(CONFIG) private readonly cfg: AppConfig,
    private readonly outbox: OutboxService,
  ) {}

  onApplicationBootstrap(): void {
    if (!this.cfg.WORKERS) return;
    const run = () => void this.scan().catch((err: unknown) => this.log.warn(`due-date scan failed: ${(err as Error).message}`));
    setTimeout(run, 5_000).unref();
    this.timer = setInterval(run, 15 * 60_000);
    this.timer.unref();
  }

  onApplicationShutdown(): void {
    if (this.timer) clearInterval(this.timer);
  }

  /** One pass for the given day (default: today, UTC). */
  async scan(today: string = isoDateOf(now())): Promise<ScanResult> {
    const rows = await this.db
      .select({ s: correctiveActionStep, ca: { id: correctiveAction.id, number: correctiveAction.number, title: correctiveAction.title, status: correctiveAction.status, recipients: correctiveAction.recipients }, supplierName: supplier.name })
      .from(correctiveActionStep)
      .innerJoin(correctiveAction, eq(correctiveAction.id, correctiveActionStep.correctiveActionId))
      .innerJoin(supplier, eq(supplier.id, correctiveAction.supplierId))
      .where(
        and(
          ne(correctiveAction.status, 'closed'),
          notInArray(correctiveActionStep.status, ['submitted', 'accepted']),
          isNotNull(correctiveActionStep.dueOn),
          // D8 is only owed once the actions are accepted.
          or(ne(correctiveActionStep.step, 'D8'), inArray(correctiveAction.status, ['accepted', 'verifying'])),
          sql`${correctiveActionStep.dueOn} <= (${today}::date + 7)`,
        ),
      );
    const groups = new Map<string, { kind: 'due-reminder' | 'overdue'; dueOn: string; ca: (typeof rows)[number]['ca']; supplierName: string; stepIds: string[]; steps: EightDStep[] }>();
    for (const r of rows) {
      const dueOn = r.s.dueOn!;
      let kind: 'due-reminder' | 'overdue' | null = null;
      if (today > dueOn) kind = r.s.overdueSentFor === dueOn ? null : 'overdue';
      else if (today >= previousWorkingDay(dueOn)) kind = r.s.reminderSentFor === dueOn ? null : 'due-reminder';
      if (!kind) continue;
      const key = `${r.ca.id}|${kind}|${dueOn}`;
      const g = groups.get(key) ?? { kind, dueOn, ca: r.ca, supplierName: r.supplierName, stepIds: [], steps: [] };
      g.stepIds.push(r.s.id);
      g.steps.push(r.s.step);
      groups.set(key, g);
    }
    const result: ScanResult = { reminders: 0, overdue: 0 };
    for (const g of groups.values()) {
      const sent = await this.db.transaction(async (tx) => {
        // Whoever locks the steps first sends; a concurrent scan skips them.
        const locked = await tx.select().from(correctiveActionStep).where(inArray(correctiveActionStep.id, g.stepIds)).for('update', { skipLocked: true });
        const still = locked.filter((s) => s.dueOn === g.dueOn && !['submitted', 'accepted'].includes(s.status) && (g.kind === 'overdue' ? s.overdueSentFor !== g.dueOn : s.reminderSentFor !== g.dueOn));
        if (!still.length) return false;
        const steps = still.map((s) => s.step).sort();
        await this.outbox.enqueue(tx, dueMail(this.cfg.PUBLIC_URL, { id: g.ca.id, number: g.ca.number, title: g.ca.title, supplierName: g.supplierName, recipients: g.ca.recipients }, g.kind, steps, g.dueOn));
        await tx
          .update(correctiveActionStep)
          .set(g.kind === 'overdue' ? { overdueSentFor: g.dueOn } : { reminderSentFor: g.dueOn })
          .where(inArray(correctiveActionStep.id, still.map((s) => s.id)));
        return true;
      });
      if (sent) result[g.kind === 'overdue' ? 'overdue' : 'reminders'] += 1;
    }
    return result;
  }
}
