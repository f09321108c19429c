import { createHash } from 'node:crypto';
import { HttpException, HttpStatus, UnauthorizedException } from '@nestjs/common';
import { canonicalJson } from '../audit/audit-hash';
import { verifyPassword } from '../auth/passwords';
import type { UsersRepository, UserRow } from '../users/users.repository';
import type { AppConfig } from '../config';

/** SHA-256 (hex) of the canonical JSON of what is signed: the same content always gives the same hash. */
export function signatureHash(content: unknown): string {
  return createHash('sha256').update(canonicalJson(content), 'utf8').digest('hex');
}

export const WRONG_SIGNING_PASSWORD = 'The password is not right. Nothing was signed and nothing was saved.';

/**
 * Re-authenticates a signer. A wrong password counts toward the sign-in lockout (a stolen
 * session must not become a way to guess passwords) and answers 401; a locked account 429.
 */
export async function verifySigner(users: UsersRepository, cfg: AppConfig, user: UserRow | undefined, password: string): Promise<UserRow> {
  if (!user || !user.active) throw new UnauthorizedException({ error: 'signature_refused', message: WRONG_SIGNING_PASSWORD });
  if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) {
    throw new HttpException({ error: 'locked', message: 'This account is locked after too many failed passwords; it cannot sign until the lock ends.' }, HttpStatus.TOO_MANY_REQUESTS);
  }
  if (!(await verifyPassword(user.passwordHash, password))) {
    await users.recordFailure(user.id, cfg.LOGIN_MAX_FAILURES, cfg.LOGIN_WINDOW_MINUTES, cfg.LOGIN_LOCK_MINUTES);
    throw new UnauthorizedException({ error: 'signature_refused', message: WRONG_SIGNING_PASSWORD });
  }
  return user;
}
