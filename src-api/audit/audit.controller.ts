import { Controller, Get, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { z } from 'zod';
import { Roles } from '../common/roles.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { AuditService } from './audit.service';
import { pageOf } from '../../shared/schemas/common';
import { auditEventSchema, auditQuerySchema, auditVerifySchema, type AuditEvent, type AuditVerify } from '../../shared/schemas/audit';

const READERS = ['auditor', 'engineer', 'admin'] as const;

@ApiTags('audit')
@Controller('audit-events')
export class AuditController {
  constructor(private readonly audit: AuditService) {}

  @Get()
  @Roles(...READERS)
  @ApiOperation({ summary: 'The append-only history, newest first; filter by entity, entity id, actor, action, time range' })
  @ApiQueryOf(auditQuerySchema as never)
  @ApiResult(pageOf(auditEventSchema))
  list(@Query(new ZodPipe(auditQuerySchema)) q: z.infer<typeof auditQuerySchema>): Promise<{ items: AuditEvent[]; total: number }> {
    return this.audit.list(q);
  }

  @Get('verify')
  @Roles(...READERS)
  @ApiOperation({ summary: 'Recompute the hash chain: ok, how many rows, and the first broken row if any' })
  @ApiResult(auditVerifySchema)
  verify(): Promise<AuditVerify> {
    return this.audit.verify();
  }
}
