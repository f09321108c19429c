import { Body, Controller, Get, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { SuppliersService } from './suppliers.service';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import {
  createSupplierSchema,
  supplierListQuerySchema,
  supplierSchema,
  updateSupplierSchema,
  type CreateSupplierInput,
  type Supplier,
  type UpdateSupplierInput,
} from '../../shared/schemas/master-data';
import type { z } from 'zod';

@ApiTags('suppliers')
@Controller('suppliers')
export class SuppliersController {
  constructor(private readonly suppliers: SuppliersService) {}

  @Get()
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'Suppliers, paged (a supplier user sees only its own)' })
  @ApiQueryOf(supplierListQuerySchema)
  @ApiResult(pageOf(supplierSchema))
  list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(supplierListQuerySchema)) q: z.infer<typeof supplierListQuerySchema>): Promise<{ items: Supplier[]; total: number }> {
    return this.suppliers.list(user, q);
  }

  @Get(':id')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'One supplier (404 for another supplier’s user)' })
  @ApiResult(supplierSchema)
  get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Supplier> {
    return this.suppliers.get(user, p.id);
  }

  @Post()
  @Roles('engineer')
  @ApiOperation({ summary: 'Add a supplier' })
  @ApiBody(createSupplierSchema)
  @ApiResult(supplierSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createSupplierSchema)) body: CreateSupplierInput): Promise<Supplier> {
    return this.suppliers.create(user, body);
  }

  @Patch(':id')
  @Roles('engineer')
  @ApiOperation({ summary: 'Change a supplier (send the version you saw; a status change needs a reason)' })
  @ApiBody(updateSupplierSchema)
  @ApiResult(supplierSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updateSupplierSchema)) body: UpdateSupplierInput): Promise<Supplier> {
    return this.suppliers.update(user, p.id, body);
  }
}
