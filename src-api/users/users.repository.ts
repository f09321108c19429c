import { Inject, Injectable } from '@nestjs/common';
import { asc, count, eq, sql } from 'drizzle-orm';
import { DB, type Db, type DbOrTx } from '../db/client';
import { appUser } from '../db/schema';

export type UserRow = typeof appUser.$inferSelect;

@Injectable()
export class UsersRepository {
  constructor(@Inject(DB) readonly db: Db) {}

  async byEmail(email: string): Promise<UserRow | undefined> {
    const [row] = await this.db.select().from(appUser).where(eq(appUser.email, email)).limit(1);
    return row;
  }

  async byId(id: string, tx: DbOrTx = this.db): Promise<UserRow | undefined> {
    const [row] = await tx.select().from(appUser).where(eq(appUser.id, id)).limit(1);
    return row;
  }

  async list(page: number, pageSize: number): Promise<{ items: UserRow[]; total: number }> {
    const items = await this.db
      .select()
      .from(appUser)
      .orderBy(asc(appUser.role), asc(appUser.email))
      .limit(pageSize)
      .offset((page - 1) * pageSize);
    const [{ n }] = await this.db.select({ n: count() }).from(appUser);
    return { items, total: n };
  }

  /**
   * Counts a failed sign-in inside a sliding window and locks the account when the window
   * fills, in one statement so concurrent failures cannot undercount.
   */
  async recordFailure(id: string, maxFailures: number, windowMinutes: number, lockMinutes: number): Promise<UserRow> {
    const [row] = await this.db
      .update(appUser)
      .set({
        failedLoginCount: sql`case when ${appUser.failedLoginWindowStart} is null
          or ${appUser.failedLoginWindowStart} < now() - make_interval(mins => ${windowMinutes}) then 1
          else ${appUser.failedLoginCount} + 1 end`,
        failedLoginWindowStart: sql`case when ${appUser.failedLoginWindowStart} is null
          or ${appUser.failedLoginWindowStart} < now() - make_interval(mins => ${windowMinutes}) then now()
          else ${appUser.failedLoginWindowStart} end`,
      })
      .where(eq(appUser.id, id))
      .returning();
    if (row.failedLoginCount >= maxFailures) {
      const [locked] = await this.db
        .update(appUser)
        .set({ lockedUntil: sql`now() + make_interval(mins => ${lockMinutes})`, failedLoginCount: 0, failedLoginWindowStart: null })
        .where(eq(appUser.id, id))
        .returning();
      return locked;
    }
    return row;
  }

  async clearFailures(id: string): Promise<void> {
    await this.db
      .update(appUser)
      .set({ failedLoginCount: 0, failedLoginWindowStart: null, lockedUntil: null })
      .where(eq(appUser.id, id));
  }
}
