import { z } from 'zod';
import { jobEnvSchema } from './jobs/runtime';

// The environment, validated once at start-up. Every bad variable is reported at once.
// Feature areas add their variables to `envSchema` with a small edit (one line each).

const booleanish = z
  .enum(['1', '0', 'true', 'false', 'on', 'off', 'yes', 'no'], {
    error: 'must be one of 1, 0, true, false, on, off, yes, no',
  })
  .transform((v) => ['1', 'true', 'on', 'yes'].includes(v));

const emptyToUndefined = (v: unknown) => (v === '' ? undefined : v);

export const envSchema = z.object({
  NODE_ENV: z.preprocess(emptyToUndefined, z.enum(['development', 'production', 'test']).default('development')),
  PORT: z.preprocess(emptyToUndefined, z.coerce.number().int().min(0).max(65535).default(3000)),
  HOST: z.preprocess(emptyToUndefined, z.string().min(1).default('127.0.0.1')),
  DATA_DIR: z.preprocess(emptyToUndefined, z.string().min(1).default('data')),
  PUBLIC_URL: z.preprocess(emptyToUndefined, z.url({ error: 'must be an absolute URL like http://localhost:3000' }).optional()),
  /** undefined = decide at start-up: on when the database file is new */
  DEMO: z.preprocess(emptyToUndefined, booleanish.optional()),
  SMTP_URL: z.preprocess(
    emptyToUndefined,
    z
      .url({ error: 'must be an smtp:// or smtps:// URL' })
      .refine((v) => /^smtps?:\/\//.test(v), 'must start with smtp:// or smtps://')
      .optional(),
  ),
  MAIL_FROM: z.preprocess(
    emptyToUndefined,
    z.string().min(3).default('Squarewright <no-reply@squarewright.test>'),
  ),
  AUTH_SECRET: z.preprocess(
    emptyToUndefined,
    z.string().min(32, 'must be at least 32 characters').optional(),
  ),
  LOG_LEVEL: z.preprocess(emptyToUndefined, z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info')),
  /** sign-in attempts allowed per minute per client address */
  SIGN_IN_LIMIT_PER_MINUTE: z.preprocess(emptyToUndefined, z.coerce.number().int().min(1).max(100_000).default(10)),
  /** requests one API key may make per minute (more get 429) */
  API_KEY_RATE_PER_MINUTE: z.preprocess(emptyToUndefined, z.coerce.number().int().min(1).max(100_000).default(600)),
  /** readers' checks and reveals allowed per minute from one address on the public puzzle pages (more get 429) */
  READER_CHECKS_PER_MINUTE: z.preprocess(emptyToUndefined, z.coerce.number().int().min(1).max(100_000).default(30)),
  /** payments: the provider's secret key; unset = the local fake provider (server/areas/payouts/fake-provider.ts) */
  PAYMENTS_SECRET_KEY: z.preprocess(emptyToUndefined, z.string().regex(/^(sk|rk)_(test|live)_[A-Za-z0-9_]+$/, 'must be a provider secret key (sk_test_..., sk_live_... or rk_...)').optional()),
  /** payments: the webhook signing secret (whsec_...); required with PAYMENTS_SECRET_KEY, set by the local fake otherwise */
  PAYMENTS_WEBHOOK_SECRET: z.preprocess(emptyToUndefined, z.string().min(16, 'must be the webhook signing secret (whsec_...)').optional()),
  /** payments: API base URL of a local fake provider (set by the fake itself; not for the real provider) */
  PAYMENTS_API_URL: z.preprocess(emptyToUndefined, z.url({ error: 'must be an http URL like http://127.0.0.1:41234' }).optional()),
  /** jobs: REDIS_URL, JOB_WORKERS, JOB_QUEUE_PREFIX, JOB_LOCK_MS (server/platform/jobs/runtime.ts) */
  ...jobEnvSchema.shape,
});

export type EnvInput = z.input<typeof envSchema>;
export type Env = Omit<z.infer<typeof envSchema>, 'PUBLIC_URL'> & { PUBLIC_URL: string };

export class EnvError extends Error {
  constructor(readonly problems: { variable: string; message: string }[]) {
    super(
      `Invalid environment (${problems.length} problem${problems.length === 1 ? '' : 's'}):\n` +
        problems.map((p) => `  ${p.variable}: ${p.message}`).join('\n'),
    );
    this.name = 'EnvError';
  }
}

/** Parse and validate the environment; throws EnvError listing every bad variable. */
export function loadEnv(source: Record<string, string | undefined> = process.env): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const problems = result.error.issues.map((issue) => ({
      variable: String(issue.path[0] ?? '(environment)'),
      message: issue.message,
    }));
    throw new EnvError(problems);
  }
  const env = result.data;
  return { ...env, PUBLIC_URL: (env.PUBLIC_URL ?? `http://localhost:${env.PORT}`).replace(/\/+$/, '') };
}
