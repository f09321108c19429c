import { Body, Controller, Get, Param, Patch, Post, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { UsersService } from './users.service';
import {
  createUserSchema,
  updateUserSchema,
  userSchema,
  type CreateUserInput,
  type SessionUser,
  type UpdateUserInput,
  type User,
} from '../../shared/schemas/auth';
import { idParamSchema, pageOf, pageQuerySchema, type PageQuery } from '../../shared/schemas/common';

@ApiTags('users')
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @Roles('admin')
  @ApiOperation({ summary: 'All users (admin)' })
  @ApiQueryOf(pageQuerySchema)
  @ApiResult(pageOf(userSchema))
  list(@Query(new ZodPipe(pageQuerySchema)) q: PageQuery): Promise<{ items: User[]; total: number }> {
    return this.users.list(q.page, q.pageSize);
  }

  @Post()
  @Roles('admin')
  @ApiOperation({ summary: 'Create a user (admin)' })
  @ApiBody(createUserSchema)
  @ApiResult(userSchema, 201)
  create(@CurrentUser() actor: SessionUser, @Body(new ZodPipe(createUserSchema)) body: CreateUserInput): Promise<User> {
    return this.users.create(actor, body);
  }

  @Patch(':id')
  @Roles('admin')
  @ApiOperation({ summary: 'Change a user’s role, name, supplier or active flag (admin)' })
  @ApiBody(updateUserSchema)
  @ApiResult(userSchema)
  update(
    @CurrentUser() actor: SessionUser,
    @Param(new ZodPipe(idParamSchema)) p: { id: string },
    @Body(new ZodPipe(updateUserSchema)) body: UpdateUserInput,
  ): Promise<User> {
    return this.users.update(actor, p.id, body);
  }
}
