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
import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import fs from 'node:fs';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
    s.on('error', reject);
  });
}

/**
 * A second API as its own OS process (the built server in dist/), over the same database.
 * Passport keeps its strategies in one module-level instance, so two apps in one process would
 * share them: a separate process is also the honest model of two servers behind a balancer.
 */
/** The checkout's root: the nearest folder above this file with the package.json (from source or from dist/). */
function repoRoot(): string {
  for (let dir = __dirname; ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, 'package.json')) && fs.existsSync(path.join(dir, 'src-api'))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`no checkout above ${__dirname}`);
  }
}

export async function spawnApi(databaseUrl: string, env: Record<string, string> = {}): Promise<{ url: string; close: () => Promise<void> }> {
  const port = await freePort();
  const main = path.join(repoRoot(), 'dist/server/src-api/main.js');
  const child = spawn(process.execPath, [main], {
    env: { ...process.env, DATABASE_URL: databaseUrl, PORT: String(port), LOG_LEVEL: 'error', NODE_ENV: 'test', WORKERS: 'false', WEB_DIST: '/nonexistent', ...env },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 100; i++) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  return {
    url,
    close: () =>
      new Promise<void>((resolve) => {
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 3000).unref();
      }),
  };
}

export interface TestApp {
  url: string;
  app: NestExpressApplication;
  openapi: OpenAPIObject;
  db: Db;
  pool: Pool;
  dbUrl: string;
  config: AppConfig;
  /** Another API process on another port, sharing this database. */
  another: (env?: Record<string, string>) => Promise<{ url: string; close: () => Promise<void> }>;
  close: () => Promise<void>;
}

export function testConfig(databaseUrl: string, overrides: Partial<AppConfig> = {}): AppConfig {
  return loadConfig(
    {
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      LOG_LEVEL: process.env.TEST_LOG_LEVEL ?? 'silent',
      PORT: '0',
      MAIL_CAPTURE_URL,
      SMTP_PORT: String(SMTP_PORT),
      S3_ENDPOINT,
      WORKERS: 'false',
      // Tests sign in far more often than people do; the rate-limit test sets its own limits.
      LOGIN_RATE_PER_MINUTE: '10000',
      UPLOAD_RATE_PER_MINUTE: '10000',
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
  return {
    url: `http://127.0.0.1:${port}`,
    app,
    openapi,
    db,
    pool,
    dbUrl: database.url,
    config,
    another: (env) => spawnApi(database.url, env),
    close: async () => {
      await app.close();
      await pool.end();
      await database.drop();
    },
  };
}
