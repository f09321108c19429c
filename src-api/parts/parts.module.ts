import { Module } from '@nestjs/common';
import { PartsController } from './parts.controller';
import { PartsService } from './parts.service';
import { PartsScope } from './parts.scope';

@Module({ controllers: [PartsController], providers: [PartsService, PartsScope], exports: [PartsService, PartsScope] })
export class PartsModule {}
