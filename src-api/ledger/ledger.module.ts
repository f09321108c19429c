import { Module } from '@nestjs/common';
import { PlansModule } from '../plans/plans.module';
import { LedgerController } from './ledger.controller';
import { LedgerRepository } from './ledger.repository';
import { LedgerService } from './ledger.service';

@Module({ imports: [PlansModule], controllers: [LedgerController], providers: [LedgerRepository, LedgerService], exports: [LedgerRepository, LedgerService] })
export class LedgerModule {}
