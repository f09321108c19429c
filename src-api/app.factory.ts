import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { SwaggerModule, DocumentBuilder, type OpenAPIObject } from '@nestjs/swagger';
import { Logger } from 'nestjs-pino';
import express, { type NextFunction, type Request, type Response } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import helmet from 'helmet';
import type { Pool } from 'pg';
import { AppModule } from './app.module';
import type { AppConfig } from './config';
import { PG_POOL } from './db/client';
import { csrf, sameOriginOnly } from './common/csrf';
import { ErrorFilter } from './common/error.filter';
import { contentTypeGuard, nulGuard } from './common/input-guards';

export interface BuiltApp {
  app: NestExpressApplication;
  openapi: OpenAPIObject;
}

export async function createApp(cfg: AppConfig): Promise<BuiltApp> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(cfg), { bufferLogs: true });
  app.useLogger(app.get(Logger));
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'extended');
  app.setGlobalPrefix('api');
  app.enableShutdownHooks();

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // Fluent UI (Griffel) injects style elements at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(contentTypeGuard);
  app.use(express.json({ limit: '2mb' }));
  app.use(nulGuard);

  const pool = app.get<Pool>(PG_POOL);
  const PgStore = connectPgSimple(session);
  const idleMs = cfg.SESSION_IDLE_HOURS * 3600_000;
  app.use(
    session({
      name: 'yokeline.sid',
      secret: cfg.SESSION_SECRET,
      store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60, errorLog: () => undefined }),
      resave: false,
      saveUninitialized: false,
      rolling: true, // idle timeout: every request pushes expiry out by the idle period
      cookie: { httpOnly: true, sameSite: 'lax', secure: cfg.COOKIE_SECURE, maxAge: idleMs, path: '/' },
    }),
  );
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(sameOriginOnly);
  app.use(csrf.csrfSynchronisedProtection);

  const openapi = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Yokeline API')
      .setDescription('Receiving inspection of laminated stator cores. Every write needs the X-CSRF-Token header from GET /api/auth/csrf.')
      .setVersion('0.1.0')
      .addCookieAuth('yokeline.sid')
      .build(),
  );
  SwaggerModule.setup('api/docs', app, openapi, { jsonDocumentUrl: 'api/docs-json', useGlobalPrefix: false });

  serveWeb(app, cfg);
  // Errors thrown by Express middleware (CSRF, body parser) get the same envelope.
  await app.init();
  const filter = new ErrorFilter();
  app.use((err: unknown, req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) return next(err);
    const { status, body } = filter.toEnvelope(err, req);
    res.status(status).json(body);
  });
  return { app, openapi };
}

/** Serves the built web app with a fallback to index.html for client-side routes. */
function serveWeb(app: NestExpressApplication, cfg: AppConfig): void {
  const dist = cfg.WEB_DIST ?? path.resolve(process.cwd(), 'dist/web');
  const index = path.join(dist, 'index.html');
  if (!fs.existsSync(index)) return;
  app.use(express.static(dist, { index: false, maxAge: '1h', setHeaders: (res, file) => {
    if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  } }));
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' || req.path.startsWith('/api')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
