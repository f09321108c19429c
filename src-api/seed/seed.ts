/**
 * Seeds the demo scenario. Idempotent: rows are matched by their natural keys (supplier code,
 * user e-mail) and left alone when present, so running it twice changes nothing.
 * Usage: node dist/server/src-api/seed/seed.js
 */
import { eq } from 'drizzle-orm';
import { createDb, createPool, type Db } from '../db/client';
import { appUser, supplier } from '../db/schema';
import { hashPassword } from '../auth/passwords';
import { loadConfig } from '../config';
import { DEMO_PASSWORD, DEMO_SUPPLIERS, DEMO_USERS } from './demo-users';

export async function seedDemo(db: Db): Promise<{ created: number }> {
  let created = 0;
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const ids = new Map<string, string>();
    for (const s of DEMO_SUPPLIERS) {
      const inserted = await tx.insert(supplier).values({ code: s.code, name: s.name }).onConflictDoNothing().returning({ id: supplier.id });
      created += inserted.length;
      const [row] = await tx.select({ id: supplier.id }).from(supplier).where(eq(supplier.code, s.code));
      ids.set(s.code, row.id);
    }
    for (const u of DEMO_USERS) {
      const supplierId = 'supplier' in u ? (ids.get(u.supplier) ?? null) : null;
      const inserted = await tx
        .insert(appUser)
        .values({ email: u.email, name: u.name, role: u.role, supplierId, passwordHash: hash })
        .onConflictDoNothing()
        .returning({ id: appUser.id });
      created += inserted.length;
    }
  });
  return { created };
}

if (require.main === module) {
  const cfg = loadConfig();
  const pool = createPool(cfg.DATABASE_URL, 2);
  seedDemo(createDb(pool))
    .then(({ created }) => console.log(created ? `Demo data seeded (${created} rows)` : 'Demo data already present'))
    .catch((err: unknown) => {
      console.error('Seeding failed:', err);
      process.exitCode = 1;
    })
    .finally(() => void pool.end());
}
