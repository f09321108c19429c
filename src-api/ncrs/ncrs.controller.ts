import { Body, Controller, Get, Header, HttpCode, Inject, Param, Patch, Post, Query, Res, StreamableFile, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiConsumes, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { z } from 'zod';
import { CONFIG, type AppConfig } from '../config';
import { INTERNAL_READ, Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiBody, ApiQueryOf, ApiResult } from '../common/openapi';
import { idParamSchema, pageOf, uuidSchema } from '../../shared/schemas/common';
import {
  createDispositionsSchema, createNcrSchema, heldLotSchema, ncrListQuerySchema, ncrPhotoSchema, ncrSchema, ncrSummarySchema, ncrSupplierSchema, ncrTransitionSchema, updateNcrSchema,
  type HeldLot, type Ncr, type NcrForSupplier, type NcrPhoto, type NcrSummary,
} from '../../shared/schemas/ncr';
import type { SessionUser } from '../../shared/schemas/auth';
import { MAX_PHOTO_BYTES } from '../lots/photos.service';
import { NcrsService } from './ncrs.service';
import { NcrPhotosService } from './ncr-photos.service';
import { ncrUrl, qrSvg, renderHoldTag } from './hold-tag';

const RAISERS = ['inspector', 'engineer'] as const;
const photoParamSchema = z.object({ id: uuidSchema, photoId: uuidSchema });
const linkPhotosSchema = z.object({ photoIds: z.array(uuidSchema).min(1, 'Choose at least one photo').max(50) }).strict();

@ApiTags('nonconformances')
@Controller('ncrs')
export class NcrsController {
  constructor(
    private readonly ncrs: NcrsService,
    private readonly photos: NcrPhotosService,
    @Inject(CONFIG) private readonly cfg: AppConfig,
  ) {}

  @Get()
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'NCRs, paged and filtered (status=active: not closed). Suppliers see their own.' })
  @ApiQueryOf(ncrListQuerySchema)
  @ApiResult(pageOf(ncrSummarySchema))
  list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(ncrListQuerySchema)) q: z.infer<typeof ncrListQuerySchema>): Promise<{ items: NcrSummary[]; total: number }> {
    return this.ncrs.list(user, q);
  }

  @Get('held-lots')
  @Roles(...INTERNAL_READ)
  @ApiOperation({ summary: 'Rejected lots on hold with no NCR in progress, with their failed readings (the review board in-tray)' })
  @ApiResult(z.object({ items: z.array(heldLotSchema) }))
  async heldLots(): Promise<{ items: HeldLot[] }> {
    return { items: await this.ncrs.heldLots() };
  }

  @Post()
  @Roles(...RAISERS)
  @ApiOperation({ summary: 'Raise an NCR from a lot, a core, a drift signal (signalId) or by hand; numbered NCR-<year>-<seq> without gaps. A lot-based NCR holds the lot.' })
  @ApiBody(createNcrSchema)
  @ApiResult(ncrSchema, 201)
  create(@CurrentUser() user: SessionUser, @Body(new ZodPipe(createNcrSchema)) body: z.output<typeof createNcrSchema>): Promise<Ncr> {
    return this.ncrs.create(user, body);
  }

  @Get(':id')
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'One NCR. Suppliers get their own only, with reduced fields (404 for another’s).' })
  @ApiResult(z.union([ncrSchema, ncrSupplierSchema]))
  get(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<Ncr | NcrForSupplier> {
    return this.ncrs.get(user, p.id);
  }

  @Patch(':id')
  @Roles(...RAISERS)
  @ApiOperation({ summary: 'Correct the description, defect codes or suspect quantity while open or in review' })
  @ApiBody(updateNcrSchema)
  @ApiResult(ncrSchema)
  update(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(updateNcrSchema)) body: z.output<typeof updateNcrSchema>): Promise<Ncr> {
    return this.ncrs.update(user, p.id, body);
  }

  @Post(':id/transition')
  @HttpCode(200)
  @Roles('engineer')
  @ApiOperation({ summary: 'open → in-review, dispositioned → closed. Anything else is refused with 409.' })
  @ApiBody(ncrTransitionSchema)
  @ApiResult(ncrSchema)
  transition(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(ncrTransitionSchema)) body: z.output<typeof ncrTransitionSchema>): Promise<Ncr> {
    return this.ncrs.transition(user, p.id, body);
  }

  @Post(':id/dispositions')
  @Roles('engineer')
  @ApiOperation({
    summary:
      'The review board decision: lines whose quantities add up to the suspect quantity, e-signed (password + meaning). Wrong password → 401, stale version → 409. Engineers only: administrators may not disposition (separation of duties).',
  })
  @ApiBody(createDispositionsSchema)
  @ApiResult(ncrSchema, 201)
  dispositions(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(createDispositionsSchema)) body: z.output<typeof createDispositionsSchema>): Promise<Ncr> {
    return this.ncrs.disposition(user, p.id, body);
  }

  @Get(':id/hold-tag')
  @Roles(...INTERNAL_READ)
  @Header('Content-Type', 'text/html; charset=utf-8')
  @Header('Cache-Control', 'no-store')
  @ApiProduces('text/html')
  @ApiOperation({ summary: 'The printable red hold tag (A6 label, HTML) with NCR number, part, lot, quantity, date and a QR code that opens the NCR' })
  async holdTag(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<string> {
    const d = await this.ncrs.tagData(p.id);
    return renderHoldTag(
      { number: d.n.number, title: d.n.title, partNumber: d.p?.partNumber ?? null, partRevision: d.p?.revision ?? null, partDescription: d.p?.description ?? null, supplierCode: d.s?.code ?? null, lotRef: d.l?.ref ?? null, supplierLotNumber: d.l?.supplierLotNumber ?? null, quantity: d.n.suspectQuantity, raisedAt: d.n.raisedAt, defectCodes: d.n.defectCodes },
      ncrUrl(this.cfg.PUBLIC_URL, d.n.id),
    );
  }

  @Get(':id/qr.svg')
  @Roles(...INTERNAL_READ)
  @Header('Content-Type', 'image/svg+xml')
  @Header('X-Content-Type-Options', 'nosniff')
  @ApiProduces('image/svg+xml')
  @ApiOperation({ summary: 'The QR code of the NCR’s address, as SVG (for the web print view)' })
  async qr(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<string> {
    const d = await this.ncrs.tagData(p.id);
    return qrSvg(ncrUrl(this.cfg.PUBLIC_URL, d.n.id));
  }

  @Post(':id/photos')
  @Roles(...RAISERS)
  @ApiOperation({ summary: 'Upload a photo to the NCR (JPEG/PNG/WebP ≤ 20 MB, re-encoded, metadata stripped; 415 for other types). Fields: file, caption?' })
  @ApiConsumes('multipart/form-data')
  @ApiResult(ncrPhotoSchema, 201)
  @UseInterceptors(FileInterceptor('file', { limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 4, fieldSize: 4096 } }))
  upload(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @UploadedFile() file: Express.Multer.File | undefined, @Body() body: Record<string, string | undefined>): Promise<NcrPhoto> {
    return this.photos.upload(user, p.id, file, body.caption);
  }

  @Post(':id/photo-links')
  @Roles(...RAISERS)
  @ApiOperation({ summary: 'Link photos of the NCR’s lot to it' })
  @ApiBody(linkPhotosSchema)
  @ApiResult(z.object({ items: z.array(ncrPhotoSchema) }), 201)
  async link(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Body(new ZodPipe(linkPhotosSchema)) body: z.infer<typeof linkPhotosSchema>): Promise<{ items: NcrPhoto[] }> {
    return { items: await this.photos.link(user, p.id, body.photoIds) };
  }

  @Get(':id/photos/:photoId')
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'A photo of the NCR (2048 px JPEG)' })
  async photo(@CurrentUser() user: SessionUser, @Param(new ZodPipe(photoParamSchema)) p: z.infer<typeof photoParamSchema>, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return this.send(res, await this.photos.file(user, p.id, p.photoId, 'web'));
  }

  @Get(':id/photos/:photoId/thumbnail')
  @Roles(...INTERNAL_READ, 'supplier')
  @ApiOperation({ summary: 'A photo’s 320 px thumbnail' })
  async thumb(@CurrentUser() user: SessionUser, @Param(new ZodPipe(photoParamSchema)) p: z.infer<typeof photoParamSchema>, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return this.send(res, await this.photos.file(user, p.id, p.photoId, 'thumb'));
  }

  private send(res: Response, f: { body: NodeJS.ReadableStream }): StreamableFile {
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Cache-Control', 'private, max-age=86400');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    return new StreamableFile(f.body as never);
  }
}
