import { Inject, Injectable } from '@nestjs/common';
import type { Pool } from 'pg';
import { PG_POOL } from '../db/client';
import { notFound } from '../common/errors';
import type { SessionUser } from '../../shared/schemas/auth';

/**
 * Which parts a supplier user may read: those its company has shipped (has lots of).
 */
@Injectable()
export class PartsScope {
  constructor(@Inject(PG_POOL) private readonly pool: Pool) {}

  async partIdsShippedBy(supplierId: string | null): Promise<string[]> {
    if (!supplierId) return [];
    const r = await this.pool.query<{ part_id: string }>('select distinct part_id from lot where supplier_id = $1', [supplierId]);
    return r.rows.map((x: { part_id: string }) => x.part_id);
  }

  async assertVisible(user: SessionUser, partId: string): Promise<void> {
    if (user.role !== 'supplier') return;
    const ids = await this.partIdsShippedBy(user.supplierId);
    if (!ids.includes(partId)) throw notFound('part');
  }
}
