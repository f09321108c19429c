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
import { NestFactory } from '@nestjs/core';
import { AppModule } from '../app.module';
import { UsersRepository } from '../users/users.repository';
import { toSessionUser } from '../auth/auth.service';
import { seedDemoScenario } from './demo-scenario';

export async function seedDemo(db: Db): Promise<{ created: number }> {
  let created = 0;
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const ids = new Map<string, string>();
    for (const s of DEMO_SUPPLIERS) {
      const inserted = await tx.insert(supplier).values({ code: s.code, name: s.name, contactEmails: [`quality@${s.domain}`] }).onConflictDoNothing().returning({ id: supplier.id });
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

/** Users and suppliers, then (unless told not to) the six-month demo scenario through the real services. */
async function main(): Promise<void> {
  const cfg = loadConfig({ ...process.env, LOG_LEVEL: 'warn', WORKERS: 'false' });
  const pool = createPool(cfg.DATABASE_URL, 2);
  try {
    const { created } = await seedDemo(createDb(pool));
    console.log(created ? `Demo users and suppliers seeded (${created} rows)` : 'Demo users and suppliers already present');
  } finally {
    await pool.end();
  }
  if (process.argv.includes('--users-only')) return;
  const started = Date.now();
  const app = await NestFactory.createApplicationContext(AppModule.forRoot(cfg), { logger: ['error', 'warn'] });
  try {
    const users = app.get(UsersRepository);
    const inspector = await users.byEmail('inspector@harrowgate.test');
    const engineer = await users.byEmail('engineer@harrowgate.test');
    const r = await seedDemoScenario(app, { inspector: toSessionUser(inspector!), engineer: toSessionUser(engineer!) });
    console.log(r ? `Demo scenario seeded: ${r.lots} lots in ${((Date.now() - started) / 1000).toFixed(1)} s` : 'Demo scenario already present');
  } finally {
    await app.close();
  }
}

if (require.main === module) {
  main().catch((err: unknown) => {
    console.error('Seeding failed:', err);
    process.exitCode = 1;
  });
}
