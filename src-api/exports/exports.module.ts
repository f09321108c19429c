import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { ExportsController } from './exports.controller';
import { CsvExportsService } from './csv-exports.service';
import { LotReportService } from './lot-report.service';
import { NcrReportsService } from './ncr-reports.service';
import { NcrsModule } from '../ncrs/ncrs.module';
import { CorrectiveActionsModule } from '../corrective-actions/corrective-actions.module';

@Module({ imports: [LedgerModule, NcrsModule, CorrectiveActionsModule], controllers: [ExportsController], providers: [CsvExportsService, LotReportService, NcrReportsService] })
export class ExportsModule {}
