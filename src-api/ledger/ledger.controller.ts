import { Controller, Get, Param } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles } from '../common/roles.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiResult } from '../common/openapi';
import { LedgerService } from './ledger.service';
import { idParamSchema } from '../../shared/schemas/common';
import { ledgerLotSchema, type LedgerLot } from '../../shared/schemas/ledger';

/** Auditors read the history; engineers and admins may read it too. Nobody changes it here. */
export const LEDGER_READERS = ['auditor', 'engineer', 'admin'] as const;

@ApiTags('ledger')
@Controller('ledger')
export class LedgerController {
  constructor(private readonly ledger: LedgerService) {}

  @Get('lots/:id')
  @Roles(...LEDGER_READERS)
  @ApiOperation({ summary: 'A lot’s whole story on one timeline: received (sampling and switching then), readings with the gauge’s due date then, photos, decision, audit records, NCRs and corrective actions; the part’s plan revisions with their changes' })
  @ApiResult(ledgerLotSchema)
  lot(@Param(new ZodPipe(idParamSchema)) p: { id: string }): Promise<LedgerLot> {
    return this.ledger.lotStory(p.id);
  }
}
