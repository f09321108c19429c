import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';
import { Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { SpcService } from './spc.service';
import { idParamSchema } from '../../shared/schemas/common';
import { spcAnalyzeInputSchema } from '../../shared/schemas/spc';
import type { SessionUser } from '../../shared/schemas/auth';
import {
  RULE_ID_DOC,
  ackSignalSchema,
  analyzeResultSchema,
  chartQuerySchema,
  chartResponseSchema,
  controlLimitSchema,
  driftSignalSchema,
  freezeLimitsSchema,
  watchQuerySchema,
  watchRowSchema,
  type AckSignalInput,
  type AnalyzeResult,
  type ChartQuery,
  type ChartResponse,
  type ControlLimit,
  type DriftSignal,
  type FreezeLimitsInput,
  type WatchRow,
} from '../../shared/schemas/drift';

/** Charts are internal: suppliers see only the die-service notice, on their own desk. */
const READERS = ['inspector', 'engineer', 'auditor'] as const;

@ApiTags('drift watch')
@Controller('spc')
export class SpcController {
  constructor(private readonly spc: SpcService) {}

  @Get('watch')
  @Roles(...READERS)
  @ApiOperation({
    summary: 'Drift watch: one row per supplier × part × charted characteristic with its latest status',
    description: 'status: die-service-due (wear forecast, conservative count below the notice threshold) > signal (open drift signals) > insufficient-data (fewer than 2 lots) > in-control. lotsToLimit only for wear-driven characteristics.',
  })
  @ApiQueryOf(watchQuerySchema)
  @ApiResult(z.array(watchRowSchema))
  watch(@Query(new ZodPipe(watchQuerySchema)) q: z.infer<typeof watchQuerySchema>): Promise<WatchRow[]> {
    return this.spc.watch(q);
  }

  @Get('charts')
  @Roles(...READERS)
  @ApiOperation({
    summary: 'One control chart: points judged against the limits in force when each lot was decided, limit versions, signals, capability, histogram, wear forecast',
    description: `Subgroups: p chart one point per lot (nonconforming sampled cores / sampled cores); individuals one point per core; a characteristic whose subgroup size divides its readings per core (single layout, e.g. BURR 4 readings, subgroup 4) one subgroup per core from its raw readings; otherwise one subgroup per lot from its first n cores by serial. from/to filter by received date; every point is judged on the whole history. ${RULE_ID_DOC}`,
  })
  @ApiQueryOf(chartQuerySchema as unknown as z.ZodObject)
  @ApiResult(chartResponseSchema)
  chart(@Query(new ZodPipe(chartQuerySchema)) q: ChartQuery): Promise<ChartResponse> {
    return this.spc.chart(q);
  }

  @Post('limits')
  @Roles('engineer')
  @ApiOperation({
    summary: 'Freeze control limits: phase I on a baseline (first k subgroups or a date range), out-of-control subgroups excluded until stable; stored as the next version (audited with the reason)',
    description: 'Lots decided from now on are judged against the new version; points already judged keep theirs.',
  })
  @ApiBody(freezeLimitsSchema)
  @ApiResult(controlLimitSchema, 201)
  freeze(@CurrentUser() user: SessionUser, @Body(new ZodPipe(freezeLimitsSchema)) body: FreezeLimitsInput): Promise<ControlLimit> {
    return this.spc.freeze(user, body);
  }

  @Post('signals/:id/ack')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'Acknowledge a drift signal with a note (audited); 409 when it is no longer open', description: RULE_ID_DOC })
  @ApiBody(ackSignalSchema)
  @ApiResult(driftSignalSchema)
  ack(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(ackSignalSchema)) body: AckSignalInput): Promise<DriftSignal> {
    return this.spc.acknowledge(user, p.id, body);
  }

  @Post('analyze')
  @HttpCode(200)
  @Roles(...READERS)
  @ApiOperation({
    summary: 'SPC calculator: limits, run-rule signals and capability for data given in the request (nothing stored)',
    description: `With center and sigma (σ of individual measurements; for p only center = p₀) the points are judged against those known limits (phase II). ${RULE_ID_DOC}`,
  })
  @ApiBody(spcAnalyzeInputSchema)
  @ApiResult(analyzeResultSchema)
  analyze(@Body() body: unknown): AnalyzeResult {
    return this.spc.analyze(body);
  }
}
