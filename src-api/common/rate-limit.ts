import { applyDecorators, Injectable, UseGuards } from '@nestjs/common';
import { SkipThrottle, ThrottlerGuard, ThrottlerModule } from '@nestjs/throttler';
import type { Request } from 'express';
import { CONFIG, type AppConfig } from '../config';

/**
 * Rate limits on the two routes that invite abuse: sign-in (per client address, on top of the
 * per-account lockout) and uploads (per signed-in user). Counters live in each API process.
 */
export const RateLimitModule = ThrottlerModule.forRootAsync({
  inject: [CONFIG],
  useFactory: (cfg: AppConfig) => ({
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
}

export const LoginRateLimit = () => applyDecorators(SkipThrottle({ upload: true }), UseGuards(KeyedThrottlerGuard));
export const UploadRateLimit = () => applyDecorators(SkipThrottle({ login: true }), UseGuards(KeyedThrottlerGuard));
