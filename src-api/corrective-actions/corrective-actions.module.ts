import { Module } from '@nestjs/common';
import { CorrectiveActionsController } from './corrective-actions.controller';
import { CorrectiveActionsService } from './corrective-actions.service';
import { EvidenceService } from './evidence.service';
import { DueDatesService } from './due-dates.service';

@Module({
  controllers: [CorrectiveActionsController],
  providers: [CorrectiveActionsService, EvidenceService, DueDatesService],
  exports: [CorrectiveActionsService, DueDatesService],
})
export class CorrectiveActionsModule {}
