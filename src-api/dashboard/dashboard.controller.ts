import { Controller, Get } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Roles, SIGNED_IN } from '../common/roles.decorator';
import { CurrentUser } from '../common/current-user.decorator';
import { ApiResult } from '../common/openapi';
import { DashboardService } from './dashboard.service';
import type { SessionUser } from '../../shared/schemas/auth';
import { CHAIN_STATUS_CACHE_SECONDS, DASHBOARD_GAUGE_DAYS, DASHBOARD_STEP_DAYS, dashboardSchema, type Dashboard } from '../../shared/schemas/dashboard';

@ApiTags('dashboard')
@Controller('dashboard')
export class DashboardController {
  constructor(private readonly dashboard: DashboardService) {}

  @Get()
  @Roles(...SIGNED_IN)
  @ApiOperation({
    summary: 'The home page’s figures for the caller’s role (the answer’s `role` says which shape)',
    description: [
      'inspector: the Dock queue (lots received, not yet decided) with the oldest one’s age, and today’s lots received and decided (UTC day).',
      `engineer: NCRs not closed by state, held lots still without an NCR, open drift signals, corrective-action steps still owed that are overdue or due within ${DASHBOARD_STEP_DAYS} days, gauges overdue or due for calibration within ${DASHBOARD_GAUGE_DAYS} days.`,
      'supplier: its own open corrective-action steps (open or returned) with due dates, its latest notices (die service due), and its lots on hold.',
      `auditor: the last 20 audit events and the chain’s status; the verification is reused for ${CHAIN_STATUS_CACHE_SECONDS} s per API process (cached: true), GET /api/audit-events/verify always recomputes.`,
      'admin: users by role, active, inactive and locked accounts.',
    ].join(' '),
  })
  @ApiResult(dashboardSchema)
  get(@CurrentUser() user: SessionUser): Promise<Dashboard> {
    return this.dashboard.for(user);
  }
}
