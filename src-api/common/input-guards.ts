import type { NextFunction, Request, Response } from 'express';

const BODY_TYPES = ['application/json', 'multipart/form-data'];

/** Writes carry JSON or multipart; anything else is refused before any handler sees it. */
export function contentTypeGuard(req: Request, res: Response, next: NextFunction): void {
  if (req.method === 'GET' || req.method === 'HEAD' || req.method === 'OPTIONS') return next();
  const hasBody = Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;
  const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
  if (hasBody && !BODY_TYPES.includes(type)) {
    res.status(415).json({ error: 'unsupported_media_type', message: 'Send JSON (application/json) or a file upload (multipart/form-data)' });
    return;
  }
  next();
}

function hasNul(v: unknown, depth = 0): boolean {
  if (depth > 64) return true; // absurdly deep nesting is refused too
  if (typeof v === 'string') return v.includes('\u0000');
  if (Array.isArray(v)) return v.some((x) => hasNul(x, depth + 1));
  if (v && typeof v === 'object') return Object.entries(v).some(([k, x]) => k.includes('\u0000') || hasNul(x, depth + 1));
  return false;
}

/** PostgreSQL text cannot hold NUL characters: refuse them with a 400 rather than fail later. */
export function nulGuard(req: Request, res: Response, next: NextFunction): void {
  if (hasNul(req.body) || hasNul(req.query) || req.originalUrl.includes('%00')) {
    res.status(400).json({ error: 'validation', message: 'Text may not contain NUL characters (\\u0000), or nest that deep' });
    return;
  }
  next();
}
