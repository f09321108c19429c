import { Controller, Get, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { supplierNoticeSchema, type SupplierNotice } from '../../shared/schemas/corrective-action';
import type { SessionUser } from '../../shared/schemas/auth';
import { SupplierNoticesService } from './supplier-notices.service';

const noticeQuery = z.object({ supplierId: z.uuid().optional() }).strict();

@ApiTags('supplier desk')
@Controller('supplier-notices')
export class SupplierDeskController {
  constructor(private readonly notices: SupplierNoticesService) {}

  @Get()
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'Notices to suppliers, newest first (a supplier sees its own): die service due from Drift watch' })
  @ApiQueryOf(noticeQuery)
  @ApiResult(z.object({ items: z.array(supplierNoticeSchema) }))
  async list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(noticeQuery)) q: z.infer<typeof noticeQuery>): Promise<{ items: SupplierNotice[] }> {
    return { items: await this.notices.list(user, q.supplierId) };
  }
}
