import { Client } from 'pg';
import { runMigrations } from '../../src-api/db/migrate';
import { ADMIN_URL, TEMPLATE_DB, dbUrl } from './env';

/** Migrates once into a template database; each test file clones a fresh database from it. */
export default async function setup(): Promise<void> {
  const admin = new Client({ connectionString: ADMIN_URL });
  await admin.connect();
  try {
    await admin.query(`update pg_database set datistemplate = false where datname = $1`, [TEMPLATE_DB]);
    await admin.query(`drop database if exists ${TEMPLATE_DB} with (force)`);
    // Leftover per-file databases from an interrupted run.
    const { rows } = await admin.query<{ datname: string }>(`select datname from pg_database where datname like 't\\_%'`);
    for (const r of rows) await admin.query(`drop database if exists "${r.datname}" with (force)`);
  } finally {
    await admin.end();
  }
  await runMigrations(dbUrl(TEMPLATE_DB));
  const again = new Client({ connectionString: ADMIN_URL });
  await again.connect();
  await again.query(`update pg_database set datistemplate = true where datname = $1`, [TEMPLATE_DB]);
  await again.end();
}
