import { BadRequestException, Controller, Get, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { samplingQuerySchema, samplingResultSchema } from '../../shared/schemas/receiving';
import { samplingPlan } from '../../shared/compute/sampling';
import { ComputeError } from '../../shared/compute/errors';

@ApiTags('sampling')
@Controller('sampling')
export class SamplingController {
  @Get('plan')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'ISO 2859-1 single sampling plan for a lot size, level, AQL and severity' })
  @ApiQueryOf(samplingQuerySchema)
  @ApiResult(samplingResultSchema)
  plan(@Query(new ZodPipe(samplingQuerySchema)) q: z.infer<typeof samplingQuerySchema>): z.infer<typeof samplingResultSchema> {
    try {
      const p = samplingPlan({ lotSize: q.lotSize, level: q.level, aql: q.aql as never, severity: q.severity });
      return { codeLetter: p.codeLetter, planLetter: p.planLetter, sampleSize: p.sampleSize, accept: p.accept, reject: p.reject, inspectAll: p.inspectAll, table: p.table };
    } catch (err) {
      if (err instanceof ComputeError) throw new BadRequestException({ error: 'validation', message: err.message, fields: { [err.field ?? 'aql']: err.message } });
      throw err;
    }
  }
}
