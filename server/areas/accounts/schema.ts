import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { createdAt, user } from '../../platform/auth/schema';

/** An admin's invitation: only the SHA-256 of the token is stored. */
export const invitation = sqliteTable(
  'invitation',
  {
    id: text('id').primaryKey(),
    email: text('email').notNull(),
    role: text('role', { enum: ['admin', 'editor', 'setter', 'printer'] }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    invitedBy: text('invited_by').references(() => user.id, { onDelete: 'set null' }),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
    acceptedUserId: text('accepted_user_id').references(() => user.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('invitation_email_idx').on(t.email)],
);
