import { Controller, Get, Inject, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { asc, count, eq } from 'drizzle-orm';
import { z } from 'zod';
import { DB, type Db } from '../db/client';
import { supplier } from '../db/schema';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { pageOf, pageQuerySchema, type PageQuery } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';

const supplierSummarySchema = z.object({ id: z.string(), code: z.string(), name: z.string() });

/** Minimal supplier list (the master-data work extends suppliers). Supplier users see only their own. */
@ApiTags('suppliers')
@Controller('suppliers')
export class SuppliersController {
  constructor(@Inject(DB) private readonly db: Db) {}

  @Get()
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'Suppliers (a supplier user sees only its own)' })
  @ApiQueryOf(pageQuerySchema)
  @ApiResult(pageOf(supplierSummarySchema))
  async list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(pageQuerySchema)) q: PageQuery) {
    const where = user.role === 'supplier' ? eq(supplier.id, user.supplierId ?? '00000000-0000-0000-0000-000000000000') : undefined;
    const items = await this.db
      .select({ id: supplier.id, code: supplier.code, name: supplier.name })
      .from(supplier)
      .where(where)
      .orderBy(asc(supplier.code))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize);
    const [{ n }] = await this.db.select({ n: count() }).from(supplier).where(where);
    return { items, total: n };
  }
}
