import { ConflictException, NotFoundException } from '@nestjs/common';

export const notFound = (what: string) => new NotFoundException({ error: 'not_found', message: `No such ${what}` });

/** Optimistic concurrency: the row changed since the caller read it. */
export const stale = (what: string) =>
  new ConflictException({ error: 'stale', message: `This ${what} was changed by someone else since you opened it. Reload to see the latest, then try again.` });

export const conflict = (message: string, fields?: Record<string, string>) => new ConflictException({ error: 'conflict', message, fields });

/** Postgres unique violation → 409 with the field it concerns. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string; cause?: { code?: string; constraint?: string } };
  const code = e?.code ?? e?.cause?.code;
  const name = e?.constraint ?? e?.cause?.constraint;
  return code === '23505' && (!constraint || name === constraint);
}
