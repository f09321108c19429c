import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ZodPipe } from '../common/zod.pipe';
import { ApiQueryOf, ApiResult } from '../common/openapi';
import { ScorecardsService } from './scorecards.service';
import type { SessionUser } from '../../shared/schemas/auth';
import {
  MAX_SCORECARD_YEARS, SCORECARD_DEFINITIONS, scorecardListSchema, scorecardOneSchema, scorecardParamSchema, scorecardQuerySchema,
  type ScorecardList, type ScorecardOne, type ScorecardQuery,
} from '../../shared/schemas/scorecard';

/** Engineers, auditors and admins read every supplier's card; a supplier user reads its own. */
const READERS = ['engineer', 'auditor', 'admin', 'supplier'] as const;

const RANGE = `from and to are calendar dates (UTC), both inclusive; default: the last 6 months by month (4 quarters by quarter) up to today. An inverted range, or one longer than ${MAX_SCORECARD_YEARS} years, is refused (400); so are unknown query fields.`;
const DEFINITIONS = SCORECARD_DEFINITIONS.join(' ');

@ApiTags('scorecards')
@Controller('scorecards')
export class ScorecardsController {
  constructor(private readonly scorecards: ScorecardsService) {}

  @Get()
  @Roles(...READERS)
  @ApiOperation({
    summary: 'Supplier scorecards for a range: lots, PPM, corrective actions, cost of poor quality, switching state, trend per period and a ranking (a supplier user gets its own card only)',
    description: `${RANGE} ${DEFINITIONS}`,
  })
  @ApiQueryOf(scorecardQuerySchema)
  @ApiResult(scorecardListSchema)
  list(@CurrentUser() user: SessionUser, @Query(new ZodPipe(scorecardQuerySchema)) q: ScorecardQuery): Promise<ScorecardList> {
    return this.scorecards.list(user, q);
  }

  @Get(':supplierId')
  @Roles(...READERS)
  @ApiOperation({ summary: 'One supplier’s scorecard (404 for an unknown supplier, and for a supplier user asking for another company)', description: `${RANGE} ${DEFINITIONS}` })
  @ApiQueryOf(scorecardQuerySchema)
  @ApiResult(scorecardOneSchema)
  one(@CurrentUser() user: SessionUser, @Param(new ZodPipe(scorecardParamSchema)) p: { supplierId: string }, @Query(new ZodPipe(scorecardQuerySchema)) q: ScorecardQuery): Promise<ScorecardOne> {
    return this.scorecards.one(user, p.supplierId, q);
  }
}
