import { applyDecorators, type ExecutionContext, Injectable, UseGuards } from '@nestjs/common';
import { SkipThrottle, ThrottlerGuard, type ThrottlerLimitDetail, ThrottlerModule } from '@nestjs/throttler';
import type { Request, Response } from 'express';
import { CONFIG, type AppConfig } from '../config';
import { DB, type Db } from '../db/client';
import { PgThrottlerStorage } from './rate-limit-storage';

/**
 * Rate limits on the two routes that invite abuse: sign-in (per client address, on top of the
 * per-account lockout) and uploads (per signed-in user). The counters live in PostgreSQL, so
 * every API process behind a load balancer counts the same hits.
 */
export const RateLimitModule = ThrottlerModule.forRootAsync({
  inject: [CONFIG, DB],
  useFactory: (cfg: AppConfig, db: Db) => ({
    storage: new PgThrottlerStorage(db),
    throttlers: [
      { name: 'login', ttl: 60_000, limit: cfg.LOGIN_RATE_PER_MINUTE },
      { name: 'upload', ttl: 60_000, limit: cfg.UPLOAD_RATE_PER_MINUTE },
    ],
    errorMessage: 'Too many requests. Wait a minute and try again.',
  }),
});

@Injectable()
export class KeyedThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const r = req as unknown as Request & { user?: { id: string } };
    return r.user?.id ?? r.ip ?? 'unknown';
  }

  /** The library names its header after the throttler; clients also get the standard one (RFC 9110 §10.2.3). */
  protected override async throwThrottlingException(context: ExecutionContext, detail: ThrottlerLimitDetail): Promise<void> {
    context.switchToHttp().getResponse<Response>().setHeader('Retry-After', String(Math.max(1, detail.timeToBlockExpire)));
    return super.throwThrottlingException(context, detail);
  }
}

export const LoginRateLimit = () => applyDecorators(SkipThrottle({ upload: true }), UseGuards(KeyedThrottlerGuard));
export const UploadRateLimit = () => applyDecorators(SkipThrottle({ login: true }), UseGuards(KeyedThrottlerGuard));
