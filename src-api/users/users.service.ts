import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { eq } from 'drizzle-orm';
import { UsersRepository, type UserRow } from './users.repository';
import { AuditRepository } from '../audit/audit.repository';
import { appUser, supplier } from '../db/schema';
import { hashPassword } from '../auth/passwords';
import type { CreateUserInput, SessionUser, UpdateUserInput, User } from '../../shared/schemas/auth';
import { ValidationFailed } from '../common/zod.pipe';

export function toUser(u: UserRow): User {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    supplierId: u.supplierId ?? null,
    active: u.active,
    lockedUntil: u.lockedUntil && u.lockedUntil.getTime() > Date.now() ? u.lockedUntil.toISOString() : null,
    createdAt: u.createdAt.toISOString(),
  };
}

@Injectable()
export class UsersService {
  constructor(
    private readonly users: UsersRepository,
    private readonly audit: AuditRepository,
  ) {}

  async list(page: number, pageSize: number): Promise<{ items: User[]; total: number }> {
    const r = await this.users.list(page, pageSize);
    return { items: r.items.map(toUser), total: r.total };
  }

  async create(actor: SessionUser, input: CreateUserInput): Promise<User> {
    const passwordHash = await hashPassword(input.password);
    return this.users.db.transaction(async (tx) => {
      if (input.supplierId) {
        const [s] = await tx.select({ id: supplier.id }).from(supplier).where(eq(supplier.id, input.supplierId));
        if (!s) throw new ValidationFailed({ supplierId: 'No such supplier' });
      }
      const [exists] = await tx.select({ id: appUser.id }).from(appUser).where(eq(appUser.email, input.email));
      if (exists) throw new ConflictException({ error: 'conflict', message: 'A user with that e-mail already exists', fields: { email: 'Already in use' } });
      const [row] = await tx
        .insert(appUser)
        .values({ email: input.email, name: input.name, role: input.role, supplierId: input.supplierId ?? null, passwordHash })
        .returning();
      const user = toUser(row);
      await this.audit.record(tx, { actorId: actor.id, actorEmail: actor.email, action: 'user.created', entity: 'app_user', entityId: row.id, after: user });
      return user;
    });
  }

  async update(actor: SessionUser, id: string, input: UpdateUserInput): Promise<User> {
    return this.users.db.transaction(async (tx) => {
      const [before] = await tx.select().from(appUser).where(eq(appUser.id, id)).for('update');
      if (!before) throw new NotFoundException('No such user');
      const role = input.role ?? before.role;
      const supplierId = input.supplierId !== undefined ? input.supplierId : before.supplierId;
      if (role === 'supplier' && !supplierId) throw new ValidationFailed({ supplierId: 'A supplier user needs a supplier' });
      if (role !== 'supplier' && supplierId) throw new ValidationFailed({ supplierId: 'Only supplier users belong to a supplier' });
      if (actor.id === id && (input.active === false || (input.role && input.role !== 'admin'))) {
        throw new ConflictException('You cannot deactivate yourself or remove your own admin role');
      }
      const [row] = await tx
        .update(appUser)
        .set({ role, supplierId, active: input.active ?? before.active, name: input.name ?? before.name, updatedAt: new Date() })
        .where(eq(appUser.id, id))
        .returning();
      await this.audit.record(tx, {
        actorId: actor.id,
        actorEmail: actor.email,
        action: 'user.updated',
        entity: 'app_user',
        entityId: id,
        before: toUser(before),
        after: toUser(row),
      });
      return toUser(row);
    });
  }
}
