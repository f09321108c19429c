import { Module } from '@nestjs/common';
import { LotsController } from './lots.controller';
import { LotsService } from './lots.service';
import { PhotosService } from './photos.service';
import { ImportsService } from './imports.service';
import { CertificatesService } from './certificates.service';
import { SwitchingController } from './switching.controller';
import { SamplingController } from '../sampling/sampling.controller';
import { CalcController } from '../calc/calc.controller';

@Module({
  controllers: [LotsController, SwitchingController, SamplingController, CalcController],
  providers: [LotsService, PhotosService, ImportsService, CertificatesService],
  exports: [LotsService],
})
export class LotsModule {}
