import { randomBytes } from 'node:crypto';
import { Client } from 'pg';
import { ADMIN_URL, TEMPLATE_DB, dbUrl } from './env';

/** A fresh database cloned from the migrated template; drop it when the file is done. */
export async function cloneDatabase(): Promise<{ name: string; url: string; drop: () => Promise<void> }> {
  const name = `t_${randomBytes(6).toString('hex')}`;
  const admin = new Client({ connectionString: ADMIN_URL });
  await admin.connect();
  try {
    await admin.query(`create database ${name} template ${TEMPLATE_DB}`);
  } finally {
    await admin.end();
  }
  return {
    name,
    url: dbUrl(name),
    drop: async () => {
      const c = new Client({ connectionString: ADMIN_URL });
      await c.connect();
      await c.query(`drop database if exists ${name} with (force)`).catch(() => undefined);
      await c.end();
    },
  };
}
