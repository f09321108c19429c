import { Controller, Get, HttpCode, Inject, Param, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { and, eq } from 'drizzle-orm';
import type { z } from 'zod';
import { DB, type Db } from '../db/client';
import { outboxMessage } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { conflict, notFound } from '../common/errors';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import { outboxListQuerySchema, outboxMessageSchema, type OutboxMessage } from '../../shared/schemas/corrective-action';
import type { SessionUser } from '../../shared/schemas/auth';
import { OutboxService, toOutboxMessage } from './outbox.service';

@ApiTags('mail')
@Controller('mail')
export class MailController {
  constructor(
    private readonly outbox: OutboxService,
    @Inject(DB) private readonly db: Db,
    private readonly audit: AuditRepository,
  ) {}

  @Get('outbox')
  @Roles('engineer', 'auditor', 'admin')
  @ApiOperation({ summary: 'Mails in the outbox with their delivery status (pending, sent, failed), attempts and last error' })
  @ApiQueryOf(outboxListQuerySchema)
  @ApiResult(pageOf(outboxMessageSchema))
  list(@Query(new ZodPipe(outboxListQuerySchema)) q: z.infer<typeof outboxListQuerySchema>) {
    return this.outbox.list(q);
  }

  @Post('outbox/:id/retry')
  @HttpCode(200)
  @Roles('engineer', 'admin')
  @ApiOperation({ summary: 'Queue a failed mail again (after fixing the address or the mail server)' })
  @ApiResult(outboxMessageSchema)
  async retry(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<OutboxMessage> {
    return this.db.transaction(async (tx) => {
      const [m] = await tx.select().from(outboxMessage).where(eq(outboxMessage.id, p.id)).for('update');
      if (!m) throw notFound('mail');
      if (m.status !== 'failed') throw conflict(`This mail is ${m.status}; only a failed mail is queued again.`);
      const [row] = await tx.update(outboxMessage).set({ status: 'pending', nextAttemptAt: new Date(), attempts: 0 }).where(and(eq(outboxMessage.id, p.id), eq(outboxMessage.status, 'failed'))).returning();
      await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: 'mail.requeued', entity: 'outbox_message', entityId: m.id, before: { status: m.status, attempts: m.attempts, lastError: m.lastError } });
      return toOutboxMessage(row);
    });
  }
}
