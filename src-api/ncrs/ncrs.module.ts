import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module';
import { NcrsController } from './ncrs.controller';
import { NcrsService } from './ncrs.service';
import { NcrPhotosService } from './ncr-photos.service';
import { DefectCodesController } from './defect-codes.controller';
import { DefectCodesService } from './defect-codes.service';

@Module({
  imports: [AuthModule],
  controllers: [NcrsController, DefectCodesController],
  providers: [NcrsService, NcrPhotosService, DefectCodesService],
  exports: [NcrsService, DefectCodesService],
})
export class NcrsModule {}
