import type { AddressInfo } from 'node:net';
import type { NestExpressApplication } from '@nestjs/platform-express';
import type { OpenAPIObject } from '@nestjs/swagger';
import { createApp } from '../../src-api/app.factory';
import { loadConfig, type AppConfig } from '../../src-api/config';
import { createDb, createPool, type Db } from '../../src-api/db/client';
import { seedDemo } from '../../src-api/seed/seed';
import { cloneDatabase } from './test-db';
import { MAIL_CAPTURE_URL, S3_ENDPOINT, SMTP_PORT } from './env';
import type { Pool } from 'pg';

export interface TestApp {
  url: string;
  app: NestExpressApplication;
  openapi: OpenAPIObject;
  db: Db;
  pool: Pool;
  dbUrl: string;
  config: AppConfig;
  /** Another API process on another port, sharing this database. */
  another: () => Promise<{ url: string; close: () => Promise<void> }>;
  close: () => Promise<void>;
}

export function testConfig(databaseUrl: string, overrides: Partial<AppConfig> = {}): AppConfig {
  return loadConfig(
    {
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      LOG_LEVEL: 'silent',
      PORT: '0',
      MAIL_CAPTURE_URL,
      SMTP_PORT: String(SMTP_PORT),
      S3_ENDPOINT,
      WORKERS: 'false',
    },
    overrides,
  );
}

/** A real API on a random loopback port over a fresh database (seeded with the demo accounts unless told not to). */
export async function startTestApp(opts: { seed?: boolean; config?: Partial<AppConfig> } = {}): Promise<TestApp> {
  const database = await cloneDatabase();
  const pool = createPool(database.url, 5);
  const db = createDb(pool);
  if (opts.seed !== false) await seedDemo(db);
  const config = testConfig(database.url, opts.config);
  const { app, openapi } = await createApp(config);
  await app.listen(0, '127.0.0.1');
  const port = (app.getHttpServer().address() as AddressInfo).port;
  const extra: NestExpressApplication[] = [];
  return {
    url: `http://127.0.0.1:${port}`,
    app,
    openapi,
    db,
    pool,
    dbUrl: database.url,
    config,
    another: async () => {
      const second = await createApp(config);
      await second.app.listen(0, '127.0.0.1');
      extra.push(second.app);
      const p = (second.app.getHttpServer().address() as AddressInfo).port;
      return { url: `http://127.0.0.1:${p}`, close: () => second.app.close() };
    },
    close: async () => {
      for (const a of extra) await a.close().catch(() => undefined);
      await app.close();
      await pool.end();
      await database.drop();
    },
  };
}
