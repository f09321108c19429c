/** Applies the committed Drizzle migrations (never `push`). Usage: node dist/server/src-api/db/migrate.js */
import fs from 'node:fs';
import path from 'node:path';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { Client } from 'pg';
import { createDb, createPool } from './client';
import { loadConfig } from '../config';

export async function ensureDatabase(url: string): Promise<void> {
  const u = new URL(url);
  const name = decodeURIComponent(u.pathname.slice(1));
  u.pathname = '/postgres';
  const admin = new Client({ connectionString: u.toString() });
  await admin.connect();
  try {
    const found = await admin.query('select 1 from pg_database where datname = $1', [name]);
    if (found.rowCount === 0) await admin.query(`create database "${name.replace(/"/g, '""')}"`);
  } finally {
    await admin.end();
  }
}

export function migrationsFolder(): string {
  // Works from src (vitest) and from dist/server/src-api/db (built).
  const candidates = [path.resolve(__dirname, '../../drizzle'), path.resolve(__dirname, '../../../../drizzle')];
  return candidates.find((p) => fs.existsSync(path.join(p, 'meta/_journal.json'))) ?? candidates[0];
}

export async function runMigrations(url: string): Promise<void> {
  await ensureDatabase(url);
  const pool = createPool(url, 2);
  try {
    await migrate(createDb(pool), { migrationsFolder: migrationsFolder() });
  } finally {
    await pool.end();
  }
}

if (require.main === module) {
  const cfg = loadConfig();
  runMigrations(cfg.DATABASE_URL)
    .then(() => console.log('Migrations applied'))
    .catch((err: unknown) => {
      console.error('Migration failed:', err);
      process.exit(1);
    });
}
