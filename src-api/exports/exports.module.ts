import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { ExportsController } from './exports.controller';
import { CsvExportsService } from './csv-exports.service';
import { LotReportService } from './lot-report.service';

@Module({ imports: [LedgerModule], controllers: [ExportsController], providers: [CsvExportsService, LotReportService] })
export class ExportsModule {}
