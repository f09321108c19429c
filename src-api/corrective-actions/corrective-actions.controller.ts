import { Body, Controller, Get, HttpCode, Param, Post, Put, Query, Res, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { z } from 'zod';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { idParamSchema, pageOf, uuidSchema } from '../../shared/schemas/common';
import {
  EIGHT_D_STEPS, createScarSchema, evidenceSchema, putStepSchema, reviewStepSchema, scarListQuerySchema, scarSchema, scarSummarySchema, scarTransitionSchema, stepParamSchema,
  type Evidence, type Scar, type ScarSummary,
} from '../../shared/schemas/corrective-action';
import type { SessionUser } from '../../shared/schemas/auth';
import { CorrectiveActionsService } from './corrective-actions.service';
import { EvidenceService, MAX_EVIDENCE_BYTES } from './evidence.service';

const evidenceParamSchema = z.object({ id: uuidSchema, evidenceId: uuidSchema });
const openStepSchema = z.object({ id: z.string(), number: z.string(), step: z.enum(EIGHT_D_STEPS), dueOn: z.string().nullable(), status: z.string() });

@ApiTags('corrective actions')
@Controller('corrective-actions')
export class CorrectiveActionsController {
  constructor(
    private readonly scars: CorrectiveActionsService,
    private readonly evidence: EvidenceService,
  ) {}

  @Get()
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'Corrective action requests (status=active: not closed), with the next due step. Suppliers see their own.' })
  @ApiQueryOf(scarListQuerySchema)
  @ApiResult(pageOf(scarSummarySchema))
  list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(scarListQuerySchema)) q: z.infer<typeof scarListQuerySchema>): Promise<{ items: ScarSummary[]; total: number }> {
    return this.scars.list(user, q);
  }

  @Get('open-steps')
  @Roles('supplier', 'engineer')
  @ApiOperation({ summary: 'Steps still to answer, soonest due first (the supplier’s own)' })
  @ApiResult(z.object({ items: z.array(openStepSchema) }))
  async openSteps(@CurrentUser() user: SessionUser) {
    return { items: await this.scars.openSteps(user) };
  }

  @Post()
  @Roles('engineer')
  @ApiOperation({ summary: 'Issue a SCAR from an NCR: 8D steps with due dates; the supplier is mailed (outbox, same transaction)' })
  @ApiBody(createScarSchema)
  @ApiResult(scarSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createScarSchema)) body: z.output<typeof createScarSchema>): Promise<Scar> {
    return this.scars.create(user, body);
  }

  @Get(':id')
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'One SCAR with its steps, due dates, evidence and effectiveness check (404 for another supplier’s)' })
  @ApiResult(scarSchema)
  get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Scar> {
    return this.scars.get(user, p.id);
  }

  @Post(':id/transition')
  @HttpCode(200)
  @Roles('engineer', 'supplier')
  @ApiOperation({ summary: 'Manual moves: issued → acknowledged (supplier); accepted → verifying, verifying → closed, verifying → returned (reopen; engineer). Others → 409.' })
  @ApiBody(scarTransitionSchema)
  @ApiResult(scarSchema)
  transition(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(scarTransitionSchema)) body: z.output<typeof scarTransitionSchema>): Promise<Scar> {
    return this.scars.transition(user, p.id, body);
  }

  @Put(':id/steps/:step')
  @Roles('supplier')
  @ApiOperation({ summary: 'The supplier saves a draft of a step (submit false) or submits it for review (submit true, checked in full). A step that is not open → 409.' })
  @ApiBody(putStepSchema)
  @ApiResult(scarSchema)
  putStep(@CurrentUser() user: SessionUser, @Param(new ZodPipe(stepParamSchema)) p: z.infer<typeof stepParamSchema>, @Body(new ZodPipe(putStepSchema)) body: z.output<typeof putStepSchema>): Promise<Scar> {
    return this.scars.putStep(user, p.id, p.step, body);
  }

  @Post(':id/steps/:step/review')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'The engineer accepts a submitted step, or returns it with a comment (the supplier is mailed)' })
  @ApiBody(reviewStepSchema)
  @ApiResult(scarSchema)
  review(@CurrentUser() user: SessionUser, @Param(new ZodPipe(stepParamSchema)) p: z.infer<typeof stepParamSchema>, @Body(new ZodPipe(reviewStepSchema)) body: z.output<typeof reviewStepSchema>): Promise<Scar> {
    return this.scars.reviewStep(user, p.id, p.step, body);
  }

  @Post(':id/steps/:step/evidence')
  @Roles('supplier', 'engineer')
  @ApiOperation({ summary: 'Attach evidence to an open step: PDF, JPEG, PNG or WebP ≤ 20 MB (read by content; others → 415). Fields: file, caption?' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(evidenceSchema, 201)
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_EVIDENCE_BYTES, files: 1, fields: 4, fieldSize: 4096 } }))
  addEvidence(
    @CurrentUser() user: SessionUser,
    @Param(new ZodPipe(stepParamSchema)) p: z.infer<typeof stepParamSchema>,
    @UploadedFile() file: Express.Multer.File | undefined,
    @Body() body: Record<string, string | undefined>,
  ): Promise<Evidence> {
    return this.evidence.add(user, p.id, p.step, file, body.caption);
  }

  @Get(':id/evidence/:evidenceId')
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'An evidence file' })
  async evidenceFile(@CurrentUser() user: SessionUser, @Param(new ZodPipe(evidenceParamSchema)) p: z.infer<typeof evidenceParamSchema>, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const f = await this.evidence.file(user, p.id, p.evidenceId);
    res.setHeader('Content-Type', f.contentType);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Content-Disposition', `inline; filename="${f.name}"`);
    res.setHeader('Cache-Control', 'private, max-age=3600');
    return new StreamableFile(f.body as never);
  }
}
