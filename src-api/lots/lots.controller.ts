import { Body, Controller, Get, HttpCode, Param, Post, Put, Query, Res, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import { UploadRateLimit } from '../common/rate-limit';
import type { Response } from 'express';
import { z } from 'zod';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { LotsService } from './lots.service';
import { PhotosService, MAX_PHOTO_BYTES } from './photos.service';
import { ImportsService, MAX_CSV_BYTES } from './imports.service';
import { CertificatesService, MAX_CERT_BYTES } from './certificates.service';
import { idParamSchema, pageOf } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import { createLotSchema, decisionSchema, lotListQuerySchema, lotSchema, lotSummarySchema, photoSchema, putReadingsSchema, type Lot, type LotSummary, type Photo } from '../../shared/schemas/receiving';

const WRITERS = ['inspector', 'engineer'] as const;
const proposalSchema = z.object({ proposal: z.enum(['accept', 'reject']).nullable(), nonconforming: z.number(), criticalFailures: z.number(), incomplete: z.number(), reason: z.string() });

@ApiTags('lots')
@Controller()
export class LotsController {
  constructor(
    private readonly lots: LotsService,
    private readonly photos: PhotosService,
    private readonly imports: ImportsService,
    private readonly certs: CertificatesService,
  ) {}

  @Post('lots')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Receive a lot: computes and stores its sampling plan and creates the sampled cores' })
  @ApiBody(createLotSchema)
  @ApiResult(lotSchema, 201)
  receive(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createLotSchema)) body: z.output<typeof createLotSchema>): Promise<Lot> {
    return this.lots.receive(user, body);
  }

  @Get('lots')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'Lots, paged; status=waiting lists the Dock queue oldest first (suppliers see their own)' })
  @ApiQueryOf(lotListQuerySchema)
  @ApiResult(pageOf(lotSummarySchema))
  list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(lotListQuerySchema)) q: z.infer<typeof lotListQuerySchema>): Promise<{ items: LotSummary[]; total: number }> {
    return this.lots.list(user, q);
  }

  @Get('lots/:id')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'The lot file: sampling, cores, readings, photos, decision (404 for another supplier’s lot)' })
  @ApiResult(lotSchema)
  get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Lot> {
    return this.lots.get(user, p.id);
  }

  @Get('lots/:id/proposal')
  @Roles('inspector', 'engineer', 'auditor')
  @ApiOperation({ summary: 'What the results say: accept, reject, or not yet (with the reason)' })
  @ApiResult(proposalSchema)
  async proposal(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<z.infer<typeof proposalSchema>> {
    const { ctx: _ctx, ...rest } = await this.lots.proposal(this.lots['db'], p.id);
    return rest;
  }

  @Put('lots/:id/readings')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Save readings; per core × characteristic the last write wins (and is audited)' })
  @ApiBody(putReadingsSchema)
  @ApiResult(z.object({ saved: z.number() }))
  readings(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(putReadingsSchema)) body: z.output<typeof putReadingsSchema>): Promise<{ saved: number }> {
    return this.lots.putReadings(user, p.id, body.readings);
  }

  @Post('lots/:id/decision')
  @HttpCode(200)
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Accept (→ released) or reject (→ on hold) the lot; updates the switching state' })
  @ApiBody(decisionSchema)
  @ApiResult(lotSchema)
  decide(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(decisionSchema)) body: z.output<typeof decisionSchema>): Promise<Lot> {
    return this.lots.decide(user, p.id, body);
  }

  @Post('lots/:id/photos')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Add a photo (JPEG/PNG/WebP ≤ 20 MB; re-encoded, metadata stripped). Fields: file, sampleId?, characteristicCode?, caption?' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(photoSchema, 201)
  @UploadRateLimit()
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 10, fieldSize: 4096 } }))
  photo(
    @CurrentUser() user: SessionUser,
    @Param(new ZodPipe(idParamSchema)) p: { id: string },
    @UploadedFile() file: Express.Multer.File | undefined,
    @Body() body: Record<string, string | undefined>,
  ): Promise<Photo> {
    return this.photos.upload(user, p.id, file, { sampleId: body.sampleId || undefined, characteristicCode: body.characteristicCode || undefined, caption: body.caption });
  }

  @Post('lots/:id/certificate')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Attach the certificate of conformance (PDF or image ≤ 20 MB)' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(lotSchema, 201)
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_CERT_BYTES, files: 1 } }))
  certificate(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @UploadedFile() file: Express.Multer.File | undefined): Promise<Lot> {
    return this.certs.attach(user, p.id, file);
  }

  @Get('lots/:id/certificate')
  @Roles('inspector', 'engineer', 'auditor', 'admin')
  @ApiOperation({ summary: 'The certificate file' })
  async certificateFile(@Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const f = await this.certs.file(p.id);
    res.setHeader('Content-Type', f.contentType);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Content-Disposition', `inline; filename="${f.name}"`);
    return new StreamableFile(f.body);
  }

  @Post('lots/:id/imports')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Import readings from a gauge/CMM CSV: fields file and mapping (JSON: serialColumn, columns {code: [cols]}, gaugeIds?). All or nothing.' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(z.object({ importId: z.string(), rows: z.number(), readings: z.number() }), 201)
  @UploadRateLimit()
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_CSV_BYTES, files: 1, fieldSize: 256 * 1024 } }))
  import(
    @CurrentUser() user: SessionUser,
    @Param(new ZodPipe(idParamSchema)) p: { id: string },
    @UploadedFile() file: Express.Multer.File | undefined,
    @Body() body: Record<string, string | undefined>,
  ) {
    return this.imports.import(user, p.id, file, body.mapping);
  }

  @Get('photos/:id')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'A photo’s web copy (2048 px JPEG)' })
  async photoFile(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return this.send(res, await this.photos.file(user, p.id, 'web'));
  }

  @Get('photos/:id/thumbnail')
  @Roles(...SIGNED_IN)
  @ApiOperation({ summary: 'A photo’s 320 px thumbnail' })
  async thumb(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return this.send(res, await this.photos.file(user, p.id, 'thumb'));
  }

  private send(res: Response, f: { body: NodeJS.ReadableStream; length?: number }): StreamableFile {
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Cache-Control', 'private, max-age=86400');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    return new StreamableFile(f.body as never);
  }
}
