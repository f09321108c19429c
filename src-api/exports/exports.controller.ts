import { Controller, Get, Param, Query, Res } from '@nestjs/common';
import { ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { CsvExportsService } from './csv-exports.service';
import { LotReportService } from './lot-report.service';
import { NcrReportsService } from './ncr-reports.service';
import { exportFileName } from './csv-stream';
import { idParamSchema } from '../../shared/schemas/common';
import type { SessionUser } from '../../shared/schemas/auth';
import { exportAuditQuerySchema, exportLotsQuerySchema, exportReadingsQuerySchema, MAX_PDF_CORES, MAX_READINGS_RANGE_DAYS, type ExportAuditQuery, type ExportLotsQuery, type ExportReadingsQuery } from '../../shared/schemas/ledger';
import { z } from 'zod';

/** Internal exports: auditors, engineers, admins. Suppliers get none (yet). */
const EXPORTERS = ['auditor', 'engineer', 'admin'] as const;
const csvBody = z.string().describe('CSV (UTF-8 with BOM, CRLF); X-Total-Rows gives the row count');

@ApiTags('exports')
@Controller('exports')
export class ExportsController {
  constructor(
    private readonly csv: CsvExportsService,
    private readonly report: LotReportService,
    private readonly ncrReports: NcrReportsService,
  ) {}

  @Get('lots.csv')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'Lots as CSV, streamed; filters as GET /api/lots (status, supplierId, partId, q, receivedFrom, receivedTo)' })
  @ApiProduces('text/csv')
  @ApiQueryOf(exportLotsQuerySchema as never)
  @ApiResult(csvBody)
  lots(@Query(new ZodPipe(exportLotsQuerySchema)) q: ExportLotsQuery, @Res() res: Response): Promise<void> {
    return this.csv.lots(res, q);
  }

  @Get('readings.csv')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: `Readings as CSV, streamed: one lot (lotId) or those entered between from and to (at most ${MAX_READINGS_RANGE_DAYS} days)` })
  @ApiProduces('text/csv')
  @ApiQueryOf(exportReadingsQuerySchema as never)
  @ApiResult(csvBody)
  readings(@Query(new ZodPipe(exportReadingsQuerySchema)) q: ExportReadingsQuery, @Res() res: Response): Promise<void> {
    return this.csv.readings(res, q);
  }

  @Get('audit-events.csv')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'Audit records as CSV, streamed; the filters of GET /api/audit-events (entity, entityId, actor, action, from, to, sort)' })
  @ApiProduces('text/csv')
  @ApiQueryOf(exportAuditQuerySchema as never)
  @ApiResult(csvBody)
  auditEvents(@Query(new ZodPipe(exportAuditQuerySchema)) q: ExportAuditQuery, @Res() res: Response): Promise<void> {
    return this.csv.auditEvents(res, q);
  }

  @Get('lots/:id/report.pdf')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: `The lot inspection report as PDF (lots of up to ${MAX_PDF_CORES} sampled cores; larger ones: export the readings CSV)` })
  @ApiProduces('application/pdf')
  @ApiResult(z.string().describe('PDF'))
  async lotReport(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res() res: Response): Promise<void> {
    const { pdf, ref } = await this.report.render(p.id, user);
    res.status(200);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Length', String(pdf.length));
    res.setHeader('Content-Disposition', `attachment; filename="${exportFileName(`lot-${ref}-report`, 'pdf')}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.end(pdf);
  }
  @Get('ncrs.csv')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'NCRs as CSV, streamed, oldest first: one row per NCR with its disposition totals' })
  @ApiProduces('text/csv')
  @ApiResult(csvBody)
  ncrs(@Res() res: Response): Promise<void> {
    return this.csv.ncrs(res);
  }

  @Get('corrective-actions.csv')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'Corrective action requests (SCARs) as CSV, streamed, oldest first: one row per request with its step counts' })
  @ApiProduces('text/csv')
  @ApiResult(csvBody)
  correctiveActions(@Res() res: Response): Promise<void> {
    return this.csv.correctiveActions(res);
  }

  @Get('ncrs/:id/report.pdf')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'The NCR report as PDF: requirement and finding, dispositions with cost, e-signatures with their hashes, photos' })
  @ApiProduces('application/pdf')
  @ApiResult(z.string().describe('PDF'))
  async ncrReport(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res() res: Response): Promise<void> {
    const { pdf, number } = await this.ncrReports.renderNcr(p.id, user);
    sendPdf(res, pdf, exportFileName(`${number}-report`, 'pdf'));
  }

  @Get('corrective-actions/:id/report.pdf')
  @Roles(...EXPORTERS)
  @ApiOperation({ summary: 'The 8D report of a corrective action request as PDF: each step with status, due date, answer and review' })
  @ApiProduces('application/pdf')
  @ApiResult(z.string().describe('PDF'))
  async scarReport(@CurrentUser() user: SessionUser, @Param(new ZodPipe(idParamSchema)) p: { id: string }, @Res() res: Response): Promise<void> {
    const { pdf, number } = await this.ncrReports.renderScar(p.id, user);
    sendPdf(res, pdf, exportFileName(`${number}-8d-report`, 'pdf'));
  }
}

/** A rendered PDF as a download, with the same headers as the lot report. */
function sendPdf(res: Response, pdf: Buffer, fileName: string): void {
  res.status(200);
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Length', String(pdf.length));
  // Document numbers are [A-Z0-9-]; anything else is dropped so the header cannot be broken.
  res.setHeader('Content-Disposition', `attachment; filename="${fileName.replace(/[^\w.-]/g, '')}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.end(pdf);
}
