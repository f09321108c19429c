import { Controller, Get, Inject, Res } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { Pool } from 'pg';
import { PG_POOL } from '../db/client';
import { PUBLIC, Roles } from '../common/roles.decorator';
import { ApiResult } from '../common/openapi';
import { healthResponseSchema } from '../../shared/schemas/auth';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(@Inject(PG_POOL) private readonly pool: Pool) {}

  @Get()
  @Roles(PUBLIC)
  @ApiOperation({ summary: 'Liveness and database reachability (503 when the database is down)' })
  @ApiResult(healthResponseSchema)
  async health(@Res({ passthrough: true }) res: Response): Promise<{ status: 'ok' | 'degraded'; db: 'up' | 'down' }> {
    try {
      await Promise.race([
        this.pool.query('select 1'),
        new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000).unref()),
      ]);
      return { status: 'ok', db: 'up' };
    } catch {
      res.status(503);
      return { status: 'degraded', db: 'down' };
    }
  }
}
