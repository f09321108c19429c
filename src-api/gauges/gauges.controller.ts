import { Body, Controller, Get, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { GaugesService } from './gauges.service';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import { createGaugeSchema, gaugeListQuerySchema, gaugeSchema, updateGaugeSchema, type CreateGaugeInput, type Gauge, type UpdateGaugeInput } from '../../shared/schemas/master-data';
import type { z } from 'zod';

@ApiTags('gauges')
@Controller('gauges')
export class GaugesController {
  constructor(private readonly gauges: GaugesService) {}

  @Get()
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Gauges, paged; calibration=overdue|due-soon (30 days)|ok' })
  @ApiQueryOf(gaugeListQuerySchema)
  @ApiResult(pageOf(gaugeSchema))
  list(@Query(new ZodPipe(gaugeListQuerySchema)) q: z.infer<typeof gaugeListQuerySchema>): Promise<{ items: Gauge[]; total: number }> {
    return this.gauges.list(q);
  }

  @Get(':id')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'One gauge' })
  @ApiResult(gaugeSchema)
  get(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Gauge> {
    return this.gauges.get(p.id);
  }

  @Post()
  @Roles('engineer')
  @ApiOperation({ summary: 'Add a gauge' })
  @ApiBody(createGaugeSchema)
  @ApiResult(gaugeSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createGaugeSchema)) body: CreateGaugeInput): Promise<Gauge> {
    return this.gauges.create(user, body);
  }

  @Patch(':id')
  @Roles('engineer')
  @ApiOperation({ summary: 'Change a gauge, e.g. record a calibration (send the version you saw)' })
  @ApiBody(updateGaugeSchema)
  @ApiResult(gaugeSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updateGaugeSchema)) body: UpdateGaugeInput): Promise<Gauge> {
    return this.gauges.update(user, p.id, body);
  }
}
