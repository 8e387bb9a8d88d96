import { and, asc, eq, isNull } from 'drizzle-orm';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type { InvitationLookup, SessionUser } from '../../../shared/contracts/auth';
import type { Role } from '../../../shared/contracts/common';
import type { PendingInvitation } from '../../../shared/contracts/users';
import type { PlatformDeps } from '../../platform/deps';
import type { DbOrTx } from '../../platform/db/client';
import { user } from '../../platform/auth/schema';
import { invitation } from './schema';
import { Conflict, NotFound } from '../../platform/http/errors';
import { queueMail } from '../../platform/mail/outbox';

// Invitations: an admin invites an e-mail with a role; the mail carries a one-time link
// /invite/:token. Only the SHA-256 of the token is stored; tokens expire and work once.

export const invitationLifetimeMs = 7 * 24 * 60 * 60 * 1000;

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function createInvitation(deps: PlatformDeps, inviter: SessionUser, input: { email: string; role: Role }) {
  const now = deps.clock.now();
  const token = randomBytes(32).toString('base64url');
  const id = randomUUID();
  const expiresAt = new Date(now.getTime() + invitationLifetimeMs);
  deps.db.transaction((tx) => {
    const existing = tx.select({ id: user.id }).from(user).where(eq(user.email, input.email)).get();
    if (existing) throw new Conflict(`There is already a user with the e-mail ${input.email}.`);
    tx.insert(invitation)
      .values({ id, email: input.email, role: input.role, tokenHash: hashToken(token), invitedBy: inviter.id, expiresAt, createdAt: now })
      .run();
    queueMail(
      tx,
      {
        to: input.email,
        template: 'invitation',
        data: {
          inviter: inviter.name,
          role: input.role,
          expires: expiresAt.toISOString().slice(0, 10),
          link: `${deps.env.PUBLIC_URL}/invite/${token}`,
        },
      },
      now,
    );
  });
  deps.mail.kick();
  return { invitation: { id, email: input.email, role: input.role, expiresAt: expiresAt.toISOString() }, token };
}

function findByToken(deps: PlatformDeps, token: string) {
  return deps.db
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt, acceptedAt: invitation.acceptedAt })
    .from(invitation)
    .where(eq(invitation.tokenHash, hashToken(token)))
    .get();
}

export function lookupInvitation(deps: PlatformDeps, token: string): InvitationLookup {
  const row = findByToken(deps, token);
  if (!row) throw new NotFound('This invitation link is not known.');
  if (row.acceptedAt) return { email: row.email, role: row.role, valid: false, reason: 'used' };
  // an account with this e-mail was made meanwhile (another invitation): nothing left to accept
  if (deps.db.select({ id: user.id }).from(user).where(eq(user.email, row.email)).get()) {
    return { email: row.email, role: row.role, valid: false, reason: 'used' };
  }
  if (row.expiresAt.getTime() <= deps.clock.now().getTime()) return { email: row.email, role: row.role, valid: false, reason: 'expired' };
  return { email: row.email, role: row.role, valid: true };
}

/**
 * Accept: claim the invitation (single use, atomically), create the user, sign in.
 * Returns the Set-Cookie headers of the new session. If creating the user fails, the
 * claim is released so the link can be used again.
 */
export async function acceptInvitation(deps: PlatformDeps, token: string, input: { name: string; password: string }) {
  const row = findByToken(deps, token);
  if (!row) throw new NotFound('This invitation link is not known.');
  const now = deps.clock.now();
  if (row.expiresAt.getTime() <= now.getTime()) throw new Conflict('This invitation has expired; ask an admin for a new one.');
  const claimed = deps.db
    .update(invitation)
    .set({ acceptedAt: now })
    .where(and(eq(invitation.id, row.id), isNull(invitation.acceptedAt)))
    .run();
  if (claimed.changes !== 1) throw new Conflict('This invitation has already been used.');
  let userId: string;
  try {
    if (deps.db.select({ id: user.id }).from(user).where(eq(user.email, row.email)).get()) {
      throw new Conflict(`There is already a user with the e-mail ${row.email}.`);
    }
    const created = await deps.auth.api.createUser({
      body: { email: row.email, password: input.password, name: input.name, role: row.role, data: { emailVerified: true } },
    });
    userId = created.user.id;
  } catch (err) {
    deps.db.update(invitation).set({ acceptedAt: null }).where(eq(invitation.id, row.id)).run();
    // two invitations for one e-mail accepted at once: the other made the account between our
    // check and our insert (a UNIQUE constraint inside better-auth): the same 409 as above
    if (deps.db.select({ id: user.id }).from(user).where(eq(user.email, row.email)).get()) {
      throw new Conflict(`There is already a user with the e-mail ${row.email}: this invitation was already used.`);
    }
    throw err;
  }
  deps.db.update(invitation).set({ acceptedUserId: userId }).where(eq(invitation.id, row.id)).run();
  const signIn = await deps.auth.api.signInEmail({
    body: { email: row.email, password: input.password },
    returnHeaders: true,
  });
  return {
    user: { id: userId, email: row.email, name: input.name, role: row.role },
    setCookies: signIn.headers.getSetCookie(),
  };
}

// ---- pending invitations: list, resend, revoke (admin) --------------------------------------

function pendingRow(db: DbOrTx, id: string) {
  const row = db
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, invitedBy: invitation.invitedBy, createdAt: invitation.createdAt, expiresAt: invitation.expiresAt, acceptedAt: invitation.acceptedAt })
    .from(invitation)
    .where(eq(invitation.id, id))
    .get();
  if (!row) throw new NotFound(`No invitation ${id}.`);
  if (row.acceptedAt) throw new Conflict(`The invitation to ${row.email} was accepted already.`);
  if (db.select({ id: user.id }).from(user).where(eq(user.email, row.email)).get()) throw new Conflict(`There is already a user with the e-mail ${row.email}.`);
  return row;
}

/** Invitations not yet accepted whose e-mail has no account yet, oldest first (expired ones too: they can be resent). */
export function listPendingInvitations(deps: PlatformDeps): PendingInvitation[] {
  const now = deps.clock.now().getTime();
  const rows = deps.db
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, inviter: user.name, createdAt: invitation.createdAt, expiresAt: invitation.expiresAt })
    .from(invitation)
    .leftJoin(user, eq(user.id, invitation.invitedBy))
    .where(isNull(invitation.acceptedAt))
    .orderBy(asc(invitation.createdAt))
    .all();
  const taken = new Set(deps.db.select({ email: user.email }).from(user).all().map((u) => u.email));
  return rows
    .filter((r) => !taken.has(r.email))
    .map((r) => ({ id: r.id, email: r.email, role: r.role, invitedByName: r.inviter ?? null, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString(), expired: r.expiresAt.getTime() <= now }));
}

/** Resend: a new one-time link valid for another week, mailed again; the old link stops working. */
export function resendInvitation(deps: PlatformDeps, admin: SessionUser, id: string): PendingInvitation {
  const now = deps.clock.now();
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + invitationLifetimeMs);
  deps.db.transaction((tx) => {
    const row = pendingRow(tx, id);
    tx.update(invitation).set({ tokenHash: hashToken(token), expiresAt }).where(and(eq(invitation.id, id), isNull(invitation.acceptedAt))).run();
    queueMail(tx, { to: row.email, template: 'invitation', data: { inviter: admin.name, role: row.role, expires: expiresAt.toISOString().slice(0, 10), link: `${deps.env.PUBLIC_URL}/invite/${token}` } }, now);
  });
  deps.mail.kick();
  const found = listPendingInvitations(deps).find((i) => i.id === id);
  if (!found) throw new NotFound(`No invitation ${id}.`);
  return found;
}

/** Revoke: the invitation is deleted, so its link is no longer known. */
export function revokeInvitation(deps: PlatformDeps, id: string): void {
  deps.db.transaction((tx) => {
    pendingRow(tx, id);
    tx.delete(invitation).where(and(eq(invitation.id, id), isNull(invitation.acceptedAt))).run();
  });
}
