import { asc, eq } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { roleSchema } from '../../../shared/contracts/common';
import type { AdminUser, UpdateUserBody } from '../../../shared/contracts/users';
import type { PlatformDeps } from '../../platform/deps';
import { session, user } from '../../platform/auth/schema';
import { Conflict, NotFound } from '../../platform/http/errors';

// Admin user list and changes. Deactivating = the admin plugin's ban flag, and every
// session of that user is ended in the same transaction.

const columns = { id: user.id, email: user.email, name: user.name, role: user.role, banned: user.banned, createdAt: user.createdAt };

function toAdminUser(row: { id: string; email: string; name: string; role: string | null; banned: boolean | null; createdAt: Date }): AdminUser {
  const role = roleSchema.safeParse(row.role);
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: role.success ? role.data : 'setter',
    active: !row.banned,
    createdAt: row.createdAt.toISOString(),
  };
}

export function listUsers(deps: PlatformDeps): AdminUser[] {
  return deps.db.select(columns).from(user).orderBy(asc(user.email)).all().map(toAdminUser);
}

export function updateUser(deps: PlatformDeps, actor: SessionUser, id: string, change: UpdateUserBody): AdminUser {
  return deps.db.transaction((tx) => {
    const row = tx.select(columns).from(user).where(eq(user.id, id)).get();
    if (!row) throw new NotFound(`No user ${id}.`);
    if (id === actor.id) {
      if (change.role !== undefined && change.role !== 'admin') throw new Conflict('You cannot change your own role.');
      if (change.active === false) throw new Conflict('You cannot deactivate yourself.');
    }
    const now = deps.clock.now();
    const set: Partial<typeof user.$inferInsert> = { updatedAt: now };
    if (change.role !== undefined) set.role = change.role;
    if (change.active !== undefined) {
      set.banned = !change.active;
      set.banReason = change.active ? null : `deactivated by ${actor.email}`;
    }
    tx.update(user).set(set).where(eq(user.id, id)).run();
    if (change.active === false) tx.delete(session).where(eq(session.userId, id)).run();
    const updated = tx.select(columns).from(user).where(eq(user.id, id)).get();
    if (!updated) throw new NotFound(`No user ${id}.`);
    return toAdminUser(updated);
  });
}
