import { Body, Controller, Get, Param, Patch, Post, Query, Res, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { INTERNAL_READ, Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { PartsService, MAX_DRAWING_BYTES } from './parts.service';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import { createPartSchema, partListQuerySchema, partSchema, updatePartSchema, type CreatePartInput, type Part, type UpdatePartInput } from '../../shared/schemas/master-data';
import type { z } from 'zod';
import { safeFileName } from '../common/file-sniff';
import { PartsScope } from './parts.scope';

@ApiTags('parts')
@Controller('parts')
export class PartsController {
  constructor(
    private readonly parts: PartsService,
    private readonly scope: PartsScope,
  ) {}

  @Get()
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'Parts, paged (a supplier user sees only the parts it ships)' })
  @ApiQueryOf(partListQuerySchema)
  @ApiResult(pageOf(partSchema))
  async list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(partListQuerySchema)) q: z.infer<typeof partListQuerySchema>): Promise<{ items: Part[]; total: number }> {
    return this.parts.list(q, user.role === 'supplier' ? await this.scope.partIdsShippedBy(user.supplierId) : undefined);
  }

  @Get(':id')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'One part revision' })
  @ApiResult(partSchema)
  async get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Part> {
    await this.scope.assertVisible(user, p.id);
    return this.parts.get(p.id);
  }

  @Post()
  @Roles('engineer')
  @ApiOperation({ summary: 'Add a part revision (grade like M400-50A; density defaults from the grade)' })
  @ApiBody(createPartSchema)
  @ApiResult(partSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createPartSchema)) body: CreatePartInput): Promise<Part> {
    return this.parts.create(user, body);
  }

  @Patch(':id')
  @Roles('engineer')
  @ApiOperation({ summary: 'Change a part revision (send the version you saw)' })
  @ApiBody(updatePartSchema)
  @ApiResult(partSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updatePartSchema)) body: UpdatePartInput): Promise<Part> {
    return this.parts.update(user, p.id, body);
  }

  @Post(':id/drawing')
  @Roles('engineer')
  @ApiOperation({ summary: 'Attach the drawing (PDF, at most 20 MB; multipart field "file")' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(partSchema, 201)
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_DRAWING_BYTES, files: 1 } }))
  attach(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @UploadedFile() file: Express.Multer.File | undefined): Promise<Part> {
    return this.parts.attachDrawing(user, p.id, file);
  }

  @Get(':id/drawing')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'The drawing PDF' })
  async drawing(@Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const d = await this.parts.drawing(p.id);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${safeFileName(d.name, 'drawing.pdf')}"`);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    return new StreamableFile(d.body);
  }
}
