import { Body, Controller, Get, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { idParamSchema } from '../../shared/schemas/common';
import { createDefectCodeSchema, defectCodeSchema, updateDefectCodeSchema, type DefectCode } from '../../shared/schemas/ncr';
import type { SessionUser } from '../../shared/schemas/auth';
import { DefectCodesService } from './defect-codes.service';

const listQuery = z.object({ includeInactive: z.enum(['true', 'false']).default('false') }).strict();

@ApiTags('nonconformances')
@Controller('defect-codes')
export class DefectCodesController {
  constructor(private readonly codes: DefectCodesService) {}

  @Get()
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'The defect code list (active only unless includeInactive=true)' })
  @ApiQueryOf(listQuery)
  @ApiResult(z.object({ items: z.array(defectCodeSchema) }))
  async list(@Query(new ZodPipe(listQuery)) q: z.infer<typeof listQuery>): Promise<{ items: DefectCode[] }> {
    return { items: await this.codes.list(q.includeInactive === 'true') };
  }

  @Post()
  @Roles('engineer')
  @ApiOperation({ summary: 'Add a defect code' })
  @ApiBody(createDefectCodeSchema)
  @ApiResult(defectCodeSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createDefectCodeSchema)) body: z.output<typeof createDefectCodeSchema>): Promise<DefectCode> {
    return this.codes.create(user, body);
  }

  @Patch(':id')
  @Roles('engineer')
  @ApiOperation({ summary: 'Rename, describe or retire a defect code (with the version you saw)' })
  @ApiBody(updateDefectCodeSchema)
  @ApiResult(defectCodeSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updateDefectCodeSchema)) body: z.output<typeof updateDefectCodeSchema>): Promise<DefectCode> {
    return this.codes.update(user, p.id, body);
  }
}
