import { z } from 'zod';
import { sessionUserSchema } from './auth';
import { isoDateTimeSchema, roleSchema } from './common';

// Admin user management and the Mailbox (local).

export const adminUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  active: z.boolean(),
  createdAt: isoDateTimeSchema,
});
export type AdminUser = z.infer<typeof adminUserSchema>;

/** GET /api/admin/users */
export const adminUserListResponseSchema = z.object({ users: z.array(adminUserSchema) });

/** PATCH /api/admin/users/:id */
export const updateUserBodySchema = z
  .object({ role: roleSchema.optional(), active: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, 'give role or active');
export type UpdateUserBody = z.infer<typeof updateUserBodySchema>;
export const updateUserResponseSchema = z.object({ user: adminUserSchema });

/**
 * GET /api/session (public): who is signed in, or null. The app asks this at start-up
 * instead of GET /api/me, whose 401 for a signed-out visitor the browser logs as an error.
 */
export const sessionResponseSchema = z.object({ user: sessionUserSchema.nullable() });

/** An invitation not yet accepted (GET /api/invitations, admin): resend it (a new link, a new week) or revoke it (the link stops working). */
export const pendingInvitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  invitedByName: z.string().nullable(),
  createdAt: isoDateTimeSchema,
  expiresAt: isoDateTimeSchema,
  /** the link no longer works; resending makes a new one */
  expired: z.boolean(),
});
export type PendingInvitation = z.infer<typeof pendingInvitationSchema>;
export const invitationListResponseSchema = z.object({ invitations: z.array(pendingInvitationSchema) });
export const invitationIdParamSchema = z.object({ id: z.uuid({ error: 'invitation id must be a UUID' }) });
export const resendInvitationResponseSchema = z.object({ invitation: pendingInvitationSchema });

export const mailboxSummarySchema = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  receivedAt: isoDateTimeSchema,
});
export const mailboxMessageSchema = mailboxSummarySchema.extend({
  text: z.string(),
  html: z.string().nullable(),
});
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;

/** GET /api/mailbox (admin) */
export const mailboxListResponseSchema = z.object({ messages: z.array(mailboxSummarySchema) });
/** GET /api/mailbox/:id (admin) */
export const mailboxMessageResponseSchema = z.object({ message: mailboxMessageSchema });
