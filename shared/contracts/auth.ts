import { z } from 'zod';
import { isoDateTimeSchema, roleSchema } from './common';

// Sign-in, session, invitations, password reset, health and public config.
// better-auth's own endpoints live under /api/auth/* (sign-in/email, sign-out,
// request-password-reset, reset-password); the bodies we send them are here too.

export const emailSchema = z.email({ error: 'must be an e-mail address' }).max(254).transform((v) => v.toLowerCase());
export const passwordSchema = z.string().min(10, 'must be at least 10 characters').max(128);
export const personNameSchema = z.string().trim().min(1, 'is required').max(100);

export const sessionUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** GET /api/me */
export const meResponseSchema = z.object({ user: sessionUserSchema });
export type MeResponse = z.infer<typeof meResponseSchema>;

/** POST /api/auth/sign-in/email (better-auth) */
export const signInBodySchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'is required'),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

/** POST /api/auth/request-password-reset (better-auth) */
export const requestPasswordResetBodySchema = z.object({
  email: emailSchema,
  redirectTo: z.string().optional(),
});
/** POST /api/auth/reset-password (better-auth) */
export const resetPasswordBodySchema = z.object({
  token: z.string().min(1),
  newPassword: passwordSchema,
});

/** POST /api/invitations (admin) */
export const createInvitationBodySchema = z.object({ email: emailSchema, role: roleSchema });
export type CreateInvitationBody = z.infer<typeof createInvitationBodySchema>;
export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  expiresAt: isoDateTimeSchema,
});
export const createInvitationResponseSchema = z.object({ invitation: invitationSchema });

/** GET /api/invitations/:token (public) */
export const invitationTokenParamSchema = z.object({ token: z.string().min(20).max(200) });
export const invitationLookupResponseSchema = z.object({
  email: z.string(),
  role: roleSchema,
  valid: z.boolean(),
  /** why not valid: used / expired */
  reason: z.enum(['used', 'expired']).optional(),
});
export type InvitationLookup = z.infer<typeof invitationLookupResponseSchema>;

/** POST /api/invitations/:token/accept (public) -> signs in (Set-Cookie) */
export const acceptInvitationBodySchema = z.object({ name: personNameSchema, password: passwordSchema });
export type AcceptInvitationBody = z.infer<typeof acceptInvitationBodySchema>;
export const acceptInvitationResponseSchema = z.object({ user: sessionUserSchema });

/**
 * GET /api/health: `status` for everyone ('degraded' when the database does not answer or the
 * mail server is failing); the details (version, database, mail queue and its last error,
 * which names the mail server) only for a signed-in admin.
 */
export const healthResponseSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string().optional(),
  database: z.enum(['ok', 'error']).optional(),
  mail: z
    .object({
      transport: z.enum(['smtp', 'local-fake']),
      pending: z.number().int().nonnegative(),
      failed: z.number().int().nonnegative(),
      lastError: z.string().nullable(),
    })
    .optional(),
});
export type HealthResponse = z.infer<typeof healthResponseSchema>;

/** GET /api/public/config */
export const publicConfigResponseSchema = z.object({
  demo: z.boolean(),
  demoAccounts: z.array(z.object({ email: z.string(), role: roleSchema })).optional(),
  demoPassword: z.string().optional(),
});
export type PublicConfig = z.infer<typeof publicConfigResponseSchema>;
