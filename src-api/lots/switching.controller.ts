import { Body, Controller, Get, HttpCode, Inject, Param, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { and, desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import { DB, type Db } from '../db/client';
import { supplier, switchingEvent, switchingState } from '../db/schema';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { conflict, notFound } from '../common/errors';
import { AuditRepository } from '../audit/audit.repository';
import { LotsService } from './lots.service';
import { idParamSchema } from '../../shared/schemas/common';
import { supplierActionSchema, switchingViewSchema } from '../../shared/schemas/receiving';
import { approveReducedInspection, initialSwitchingState, resumeAfterSupplierAction, type SwitchingState } from '../../shared/compute/sampling';
import { ComputeError } from '../../shared/compute/errors';
import type { SessionUser } from '../../shared/schemas/auth';

const partQuerySchema = z.object({ partId: z.uuid({ message: 'partId must be a part id' }) });

@ApiTags('sampling')
@Controller('suppliers/:id/switching')
export class SwitchingController {
  constructor(
    @Inject(DB) private readonly db: Db,
    private readonly lots: LotsService,
    private readonly audit: AuditRepository,
  ) {}

  @Get()
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'ISO 2859-1 switching state for supplier × part, with its history (newest first)' })
  @ApiQueryOf(partQuerySchema)
  @ApiResult(switchingViewSchema)
  async get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Query(new ZodPipe(partQuerySchema)) q: { partId: string }) {
    if (user.role === 'supplier' && user.supplierId !== p.id) throw notFound('supplier');
    const [s] = await this.db.select({ id: supplier.id }).from(supplier).where(eq(supplier.id, p.id));
    if (!s) throw notFound('supplier');
    const [row] = await this.db.select().from(switchingState).where(and(eq(switchingState.supplierId, p.id), eq(switchingState.partId, q.partId)));
    const history = await this.db
      .select()
      .from(switchingEvent)
      .where(and(eq(switchingEvent.supplierId, p.id), eq(switchingEvent.partId, q.partId)))
      .orderBy(desc(switchingEvent.at))
      .limit(100);
    return {
      state: (row?.state as SwitchingState) ?? initialSwitchingState(),
      history: history.map((h) => ({
        id: h.id,
        lotId: h.lotId,
        event: h.event,
        reason: h.reason,
        at: h.at.toISOString(),
        severityBefore: (h.before as SwitchingState).severity,
        severityAfter: (h.after as SwitchingState).severity,
      })),
    };
  }

  @Post('resume')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'Record the supplier’s action after acceptance was stopped; resumes on tightened inspection' })
  @ApiBody(supplierActionSchema)
  @ApiResult(switchingViewSchema)
  async resume(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(supplierActionSchema)) body: z.infer<typeof supplierActionSchema>) {
    await this.change(user, p.id, body.partId, body.note, 'resumed', (s) => ({ state: resumeAfterSupplierAction(s), reason: `Supplier action recorded: ${body.note}` }));
    return this.get(user, p, { partId: body.partId });
  }

  @Post('approve-reduced')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'Approve reduced inspection once the switching score allows it (ISO 2859-1 §9.3)' })
  @ApiBody(supplierActionSchema)
  @ApiResult(switchingViewSchema)
  async approveReduced(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(supplierActionSchema)) body: z.infer<typeof supplierActionSchema>) {
    await this.change(user, p.id, body.partId, body.note, 'to-reduced', (s) => approveReducedInspection(s));
    return this.get(user, p, { partId: body.partId });
  }

  private async change(user: SessionUser, supplierId: string, partId: string, note: string, event: string, fn: (s: SwitchingState) => { state: SwitchingState; reason: string }) {
    await this.db.transaction(async (tx) => {
      const before = await this.lots.lockSwitching(tx, supplierId, partId);
      let step: { state: SwitchingState; reason: string };
      try {
        step = fn(before);
      } catch (err) {
        if (err instanceof ComputeError) throw conflict(err.message);
        throw err;
      }
      await tx.update(switchingState).set({ state: step.state, updatedAt: new Date() }).where(and(eq(switchingState.supplierId, supplierId), eq(switchingState.partId, partId)));
      await tx.insert(switchingEvent).values({ supplierId, partId, event, reason: step.reason, before, after: step.state, actorId: user.id });
      await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: `switching.${event}`, entity: 'switching_state', entityId: `${supplierId}:${partId}`, before, after: step.state, reason: note });
    });
  }
}
