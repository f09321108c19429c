import { Module } from '@nestjs/common';
import { ScorecardsController } from './scorecards.controller';
import { ScorecardsRepository } from './scorecards.repository';
import { ScorecardsService } from './scorecards.service';

@Module({ controllers: [ScorecardsController], providers: [ScorecardsRepository, ScorecardsService], exports: [ScorecardsService] })
export class ScorecardsModule {}
