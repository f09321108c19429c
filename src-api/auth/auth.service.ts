import { HttpException, HttpStatus, Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { eq } from 'drizzle-orm';
import { CONFIG, type AppConfig } from '../config';
import { UsersRepository, type UserRow } from '../users/users.repository';
import { dummyHash, hashPassword, verifyPassword } from './passwords';
import type { SessionUser } from '../../shared/schemas/auth';
import { appUser } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';

export const BAD_CREDENTIALS = 'That e-mail and password do not match an account.';

export function toSessionUser(u: UserRow): SessionUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role, supplierId: u.supplierId ?? null };
}

@Injectable()
export class AuthService {
  constructor(
    private readonly users: UsersRepository,
    private readonly audit: AuditRepository,
    @Inject(CONFIG) private readonly cfg: AppConfig,
  ) {}

  /** Checks a sign-in. Unknown e-mail and wrong password give the same answer and take as long. */
  async validate(email: string, password: string): Promise<SessionUser> {
    const user = await this.users.byEmail(email);
    if (!user) {
      await verifyPassword(await dummyHash(), password);
      throw new UnauthorizedException(BAD_CREDENTIALS);
    }
    if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) throw this.locked(user.lockedUntil);
    const ok = await verifyPassword(user.passwordHash, password);
    if (!ok || !user.active) {
      if (!ok) {
        const after = await this.users.recordFailure(user.id, this.cfg.LOGIN_MAX_FAILURES, this.cfg.LOGIN_WINDOW_MINUTES, this.cfg.LOGIN_LOCK_MINUTES);
        if (after.lockedUntil && after.lockedUntil.getTime() > Date.now()) {
          await this.audit.record(this.users.db, {
            actorId: null,
            actorEmail: email,
            action: 'user.locked',
            entity: 'app_user',
            entityId: user.id,
            after: { lockedUntil: after.lockedUntil.toISOString() },
            reason: `${this.cfg.LOGIN_MAX_FAILURES} failed sign-ins within ${this.cfg.LOGIN_WINDOW_MINUTES} minutes`,
          });
          throw this.locked(after.lockedUntil);
        }
      }
      throw new UnauthorizedException(BAD_CREDENTIALS);
    }
    if (user.failedLoginCount > 0 || user.lockedUntil) await this.users.clearFailures(user.id);
    return toSessionUser(user);
  }

  private locked(until: Date): HttpException {
    const minutes = Math.max(1, Math.ceil((until.getTime() - Date.now()) / 60000));
    return new HttpException(
      {
        error: 'locked',
        message: `Too many failed sign-ins. This account is locked for ${minutes} more minute${minutes === 1 ? '' : 's'}; ask an administrator if you need in sooner.`,
      },
      HttpStatus.TOO_MANY_REQUESTS,
    );
  }

  async changePassword(user: SessionUser, current: string, next: string): Promise<void> {
    const row = await this.users.byId(user.id);
    if (!row || !(await verifyPassword(row.passwordHash, current))) {
      throw new HttpException({ error: 'validation', message: 'Your current password is not right', fields: { currentPassword: 'This is not your current password' } }, 400);
    }
    const passwordHash = await hashPassword(next);
    await this.users.db.transaction(async (tx) => {
      await tx.update(appUser).set({ passwordHash, passwordChangedAt: new Date(), updatedAt: new Date() }).where(eq(appUser.id, user.id));
      await this.audit.record(tx, { actorId: user.id, actorEmail: user.email, action: 'user.password_changed', entity: 'app_user', entityId: user.id });
    });
  }

  async sessionUser(id: string): Promise<SessionUser | null> {
    const row = await this.users.byId(id);
    if (!row || !row.active) return null;
    return toSessionUser(row);
  }
}
