import { Global, Inject, Module, OnApplicationShutdown } from '@nestjs/common';
import type { Pool } from 'pg';
import { CONFIG, type AppConfig } from '../config';
import { createDb, createPool, DB, PG_POOL } from './client';
import { AuditRepository } from '../audit/audit.repository';

@Global()
@Module({
  providers: [
    { provide: PG_POOL, inject: [CONFIG], useFactory: (cfg: AppConfig) => createPool(cfg.DATABASE_URL, 20) },
    { provide: DB, inject: [PG_POOL], useFactory: (pool: Pool) => createDb(pool) },
    AuditRepository,
  ],
  exports: [PG_POOL, DB, AuditRepository],
})
export class DbModule implements OnApplicationShutdown {
  constructor(@Inject(PG_POOL) private readonly pool: Pool) {}
  async onApplicationShutdown(): Promise<void> {
    await this.pool.end().catch(() => undefined);
  }
}
