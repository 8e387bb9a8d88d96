import { z } from 'zod';
import { isoDateTimeSchema, pageOf } from './common';
import { playSchema } from './reader';

// Integrations: API keys for machines, outgoing events (webhooks) and the published-content feed.

// ---------------------------------------------------------------- API keys

/** What a key may do; each scope opens a list of routes (server/platform/auth/api-key-scopes.ts). */
export const apiKeyScopes = [
  'stock:read',
  'submissions:read',
  'submissions:write',
  'puzzles:read',
  'puzzles:write',
  'editions:read',
  'foundry:read',
  'foundry:write',
] as const;
export const apiKeyScopeSchema = z.enum(apiKeyScopes);
export type ApiKeyScope = z.infer<typeof apiKeyScopeSchema>;

export const createApiKeyBodySchema = z.object({
  name: z.string().trim().min(1).max(32),
  scopes: z.array(apiKeyScopeSchema).min(1).max(apiKeyScopes.length),
  /** days until the key stops working (1 to 365) */
  expiresInDays: z.number().int().min(1).max(365),
});
export type CreateApiKeyBody = z.infer<typeof createApiKeyBodySchema>;

export const apiKeySchema = z.object({
  id: z.string(),
  name: z.string(),
  /** the key's first characters, to recognise it */
  start: z.string().nullable(),
  scopes: z.array(apiKeyScopeSchema),
  owner: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  createdAt: isoDateTimeSchema,
  expiresAt: isoDateTimeSchema.nullable(),
  lastUsedAt: isoDateTimeSchema.nullable(),
  /** requests allowed per minute */
  ratePerMinute: z.number().int().positive(),
  status: z.enum(['active', 'expired', 'revoked']),
});
export type ApiKey = z.infer<typeof apiKeySchema>;

export const apiKeyListResponseSchema = z.object({ items: z.array(apiKeySchema) });
/** The new key, the only time its secret is shown. */
export const createApiKeyResponseSchema = z.object({ apiKey: apiKeySchema, secret: z.string() });

// ---------------------------------------------------------------- events (webhooks)

export const eventTypes = [
  'edition.published',
  'edition.proof_sent',
  'edition.proof_returned',
  'edition.approved',
  'submission.reviewed',
  'foundry.run_finished',
  'payout.paid',
] as const;
export const eventTypeSchema = z.enum(eventTypes);
export type EventType = z.infer<typeof eventTypeSchema>;

const editionRefSchema = z.object({
  id: z.string(),
  publicationId: z.string(),
  publicationTitle: z.string(),
  number: z.number().int(),
  /** YYYY-MM-DD */
  editionDate: z.string(),
  /** the edition's state after the event */
  state: z.enum(['draft', 'in_proof', 'approved', 'published']),
});

/** The `data` of each event type. */
export const eventDataSchemas = {
  'edition.published': z.object({ edition: editionRefSchema, publishedAt: isoDateTimeSchema }),
  'edition.proof_sent': z.object({ edition: editionRefSchema, proofVersion: z.number().int().positive() }),
  'edition.proof_returned': z.object({ edition: editionRefSchema, proofVersion: z.number().int().positive(), notes: z.string() }),
  'edition.approved': z.object({ edition: editionRefSchema, proofVersion: z.number().int().positive() }),
  'submission.reviewed': z.object({
    submission: z.object({ id: z.string(), status: z.enum(['accepted', 'rejected']), stockId: z.string().nullable(), order: z.number().int().nullable() }),
  }),
  'foundry.run_finished': z.object({
    run: z.object({ id: z.string(), mode: z.string(), state: z.string(), found: z.number().int().nonnegative(), addedToStock: z.number().int().nonnegative() }),
  }),
  'payout.paid': z.object({ payout: z.object({ id: z.string(), /** in the currency's minor unit (cents) */ amountMinor: z.number().int(), currency: z.string(), paidAt: isoDateTimeSchema }) }),
} satisfies Record<EventType, z.ZodType>;
export type EventData<T extends EventType> = z.infer<(typeof eventDataSchemas)[T]>;

/** What an endpoint receives (the JSON body of each delivery). */
export const eventEnvelopeSchema = z.object({
  /** the event's id: the same on every delivery and re-send of this event (use it to drop repeats) */
  id: z.string(),
  type: eventTypeSchema,
  createdAt: isoDateTimeSchema,
  data: z.record(z.string(), z.unknown()),
});
export type EventEnvelope = z.infer<typeof eventEnvelopeSchema>;

export const webhookEndpointBodySchema = z.object({
  url: z
    .url({ protocol: /^https?$/ })
    .max(2000)
    .refine((u) => {
      const url = new URL(u);
      return url.username === '' && url.password === '';
    }, { message: 'The URL may not carry a user name or password (the signature says who sends).' }),
  description: z.string().trim().max(200).default(''),
  events: z.array(eventTypeSchema).min(1).max(eventTypes.length),
});
export type WebhookEndpointBody = z.infer<typeof webhookEndpointBodySchema>;

export const webhookEndpointPatchSchema = z.object({
  events: z.array(eventTypeSchema).min(1).max(eventTypes.length).optional(),
  description: z.string().trim().max(200).optional(),
  active: z.boolean().optional(),
});

export const webhookEndpointSchema = z.object({
  id: z.string(),
  url: z.string(),
  description: z.string(),
  events: z.array(eventTypeSchema),
  active: z.boolean(),
  createdAt: isoDateTimeSchema,
  /** deliveries waiting or being retried, and those given up */
  pending: z.number().int().nonnegative(),
  failed: z.number().int().nonnegative(),
});
export type WebhookEndpoint = z.infer<typeof webhookEndpointSchema>;
export const webhookEndpointListResponseSchema = z.object({ items: z.array(webhookEndpointSchema) });
/** A new endpoint with its signing secret (shown this once; a new one can be made later). */
export const webhookEndpointCreatedSchema = z.object({ endpoint: webhookEndpointSchema, secret: z.string() });

export const webhookAttemptSchema = z.object({
  at: isoDateTimeSchema,
  /** the HTTP status the endpoint answered, or null when none came (refused, timed out) */
  status: z.number().int().nullable(),
  ms: z.number().int().nonnegative(),
  /** the start of the answer's body, or what went wrong */
  answer: z.string(),
});

export const webhookDeliverySchema = z.object({
  id: z.string(),
  endpointId: z.string(),
  url: z.string(),
  eventId: z.string(),
  eventType: eventTypeSchema,
  status: z.enum(['pending', 'delivered', 'failed']),
  attempts: z.number().int().nonnegative(),
  nextAttemptAt: isoDateTimeSchema.nullable(),
  createdAt: isoDateTimeSchema,
  deliveredAt: isoDateTimeSchema.nullable(),
  lastAttempt: webhookAttemptSchema.nullable(),
});
export type WebhookDelivery = z.infer<typeof webhookDeliverySchema>;
export const webhookDeliveryDetailSchema = webhookDeliverySchema.extend({
  payload: z.string(),
  history: z.array(webhookAttemptSchema),
});
export const webhookDeliveryQuerySchema = z.object({
  endpointId: z.string().optional(),
  status: z.enum(['pending', 'delivered', 'failed']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export const webhookDeliveryPageSchema = pageOf(webhookDeliverySchema);

/** What the local receiver caught (development and tests). */
export const webhookReceiptSchema = z.object({
  id: z.number().int(),
  receivedAt: isoDateTimeSchema,
  url: z.string(),
  eventId: z.string().nullable(),
  eventType: z.string().nullable(),
  /** the signature checked with the endpoint's secret, as a receiver would */
  signatureValid: z.boolean(),
  body: z.string(),
});
export const webhookReceiptListResponseSchema = z.object({ items: z.array(webhookReceiptSchema) });

// ---------------------------------------------------------------- published-content feed

export const feedQuerySchema = z.object({
  publicationId: z.string().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});

const placedSchema = z.object({ x: z.number().int().min(0), y: z.number().int().min(0), size: z.number().int().positive() });

export const feedPuzzleSchema = z.object({
  /** stable: `<edition id>-<position>` */
  id: z.string(),
  position: z.number().int().positive(),
  kind: z.enum(['assembly', 'deduction']),
  title: z.string(),
  /** the engine's grade, 1 (gentle) to 5 (fiendish) */
  grade: z.number().int().min(1).max(5),
  /** what the printed page shows: the frame and pieces (Assembly) or the drawing and givens (Deduction) */
  play: playSchema,
  /** the full tiling, only once the publication's rule makes solutions public; null before */
  solution: z.object({ W: z.number().int().positive(), H: z.number().int().positive(), squares: z.array(placedSchema) }).nullable(),
});
export type FeedPuzzle = z.infer<typeof feedPuzzleSchema>;

export const feedEditionSchema = z.object({
  id: z.string(),
  publicationId: z.string(),
  publicationTitle: z.string(),
  number: z.number().int(),
  editionDate: z.string(),
  releasedAt: isoDateTimeSchema,
  solutionsPublic: z.boolean(),
  solutionsReleasedAt: isoDateTimeSchema.nullable(),
  /** the public reader page, relative to the site */
  path: z.string(),
  puzzles: z.array(feedPuzzleSchema),
});
export type FeedEdition = z.infer<typeof feedEditionSchema>;
export const feedPageSchema = pageOf(feedEditionSchema);
