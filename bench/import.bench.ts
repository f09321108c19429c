/** CSV import of 100 000 readings through the API against COPY of the same rows into PostgreSQL. */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Pool } from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { median, p95, repeat, round, type BenchResult } from './lib';
import type { Http } from '../tests/support/http';

const CORES = 2_000;
const CHARS = 50;

export async function benchImport(h: Http, pool: Pool, ids: { supplierId: string; partId: string }): Promise<BenchResult> {
  const header = ['core', ...Array.from({ length: CHARS }, (_, i) => `c${i}`)].join(',');
  const lotFor = async () => {
    const l = await h.post('/api/lots', { supplierId: ids.supplierId, partId: ids.partId, supplierLotNumber: `BENCH-${Math.random()}`, quantity: CORES });
    if (l.status !== 201) throw new Error(`lot: ${l.status} ${JSON.stringify(l.body).slice(0, 300)}`);
    return l.body as { id: string; samples: { id: string; serial: number }[] };
  };
  const csvFor = (seed: number) => {
    const rows = [header];
    for (let s = 1; s <= CORES; s++) rows.push([s, ...Array.from({ length: CHARS }, (_, i) => (150 + ((s * 7 + i * 13 + seed) % 50) / 1000).toFixed(4))].join(','));
    return rows.join('\n');
  };
  const mapping = JSON.stringify({ serialColumn: 'core', columns: Object.fromEntries(Array.from({ length: CHARS }, (_, i) => [`C${i}`, [`c${i}`]])) });
  // Lots are received before the clock starts: only the import (or the COPY) is timed.
  const oursLots = [await lotFor(), await lotFor(), await lotFor(), await lotFor()];
  const copyLots = [await lotFor(), await lotFor(), await lotFor(), await lotFor()];
  const ours = await repeat(3, async (i) => {
    const lot = oursLots[i + 1];
    const form = new FormData();
    form.append('file', new Blob([csvFor(i + 10)], { type: 'text/csv' }), `bench-${i}.csv`);
    form.append('mapping', mapping);
    const r = await h.post(`/api/lots/${lot.id}/imports`, form);
    if (r.status !== 201) throw new Error(`import: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  });
  // Floor: COPY the same 100 000 rows into the same table (its indexes and foreign keys
  // included) for a fresh lot, ~500 rows per write.
  const copy = await repeat(3, async (i) => {
    const lot = copyLots[i + 1];
    const client = await pool.connect();
    try {
      const stream = client.query(copyFrom('COPY reading (lot_id, sample_id, characteristic_code, values, value, conforming, source) FROM STDIN'));
      async function* rows() {
        let buf = '';
        let n = 0;
        for (const s of lot.samples) {
          for (let i = 0; i < CHARS; i++) {
            const v = (150 + ((s.serial * 7 + i * 13) % 50) / 1000).toFixed(4);
            buf += `${lot.id}\t${s.id}\tC${i}\t{${v}}\t${v}\tt\timport\n`;
            if (++n % 500 === 0) {
              yield buf;
              buf = '';
            }
          }
        }
        if (buf) yield buf;
      }
      await pipeline(Readable.from(rows()), stream);
    } finally {
      client.release();
    }
  });
  const readings = CORES * CHARS;
  const oursRate = readings / (median(ours) / 1000);
  const copyRate = readings / (median(copy) / 1000);
  return {
    name: 'CSV import, 100 000 readings',
    floor: 'COPY of the same rows into the reading table (pg-copy-streams, 500 rows per write)',
    target: 'throughput ≥ 0.5×',
    median: { oursMs: round(median(ours)), copyMs: round(median(copy)), oursRowsPerS: Math.round(oursRate), copyRowsPerS: Math.round(copyRate) },
    p95: { oursMs: round(p95(ours)), copyMs: round(p95(copy)) },
    ratio: oursRate / copyRate,
    met: oursRate / copyRate >= 0.5,
    notes: 'ours includes HTTP upload, CSV parsing, validation, evaluation and the audit event',
  };
}
