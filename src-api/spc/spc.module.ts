import { Global, Module } from '@nestjs/common';
import { SpcController } from './spc.controller';
import { SpcService } from './spc.service';
import { SpcRepository } from './spc.repository';

/**
 * Global so LotsService can raise drift signals inside its decision transaction without the lots
 * module importing this one (SpcService depends on nothing from lots).
 */
@Global()
@Module({ controllers: [SpcController], providers: [SpcService, SpcRepository], exports: [SpcService] })
export class SpcModule {}
