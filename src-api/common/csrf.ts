import { csrfSync } from 'csrf-sync';
import type { NextFunction, Request, Response } from 'express';

/**
 * Synchronizer-token CSRF protection: the token lives in the session, and every POST, PUT,
 * PATCH and DELETE (sign-in included) must echo it in X-CSRF-Token.
 */
export const csrf = csrfSync({
  getTokenFromRequest: (req) => {
    const v = req.headers['x-csrf-token'];
    return Array.isArray(v) ? v[0] : v;
  },
  ignoredMethods: ['GET', 'HEAD', 'OPTIONS'],
});

/** Refuses cross-origin writes outright: the app is same-origin only. */
export function sameOriginOnly(req: Request, res: Response, next: NextFunction): void {
  const origin = req.headers.origin;
  if (origin && req.method !== 'GET' && req.method !== 'HEAD') {
    let host: string | undefined;
    try {
      host = new URL(origin).host;
    } catch {
      host = undefined;
    }
    if (host !== req.headers.host) {
      res.status(403).json({ error: 'forbidden', message: 'Cross-origin requests are not accepted' });
      return;
    }
  }
  next();
}
