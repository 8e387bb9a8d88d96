import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';

// Outgoing events (webhooks): the endpoints an admin registers, every event as it happened,
// one delivery per endpoint and event (the outbox the sender works through, with retries), the
// attempts made, and what the local receiver caught (development and tests).

const now = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const webhookEndpoint = sqliteTable('webhook_endpoint', {
  id: text('id').primaryKey(),
  url: text('url').notNull(),
  description: text('description').notNull().default(''),
  /** JSON array of event types */
  eventsJson: text('events_json').notNull(),
  /** the signing secret (HMAC-SHA256 key); needed in clear to sign */
  secret: text('secret').notNull(),
  active: integer('active', { mode: 'boolean' }).notNull().default(true),
  createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(now),
});

export const webhookEvent = sqliteTable(
  'webhook_event',
  {
    /** the idempotency key receivers see as `id` */
    id: text('id').primaryKey(),
    type: text('type').notNull(),
    /** the exact JSON body every delivery of this event sends */
    body: text('body').notNull(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [index('webhook_event_created_idx').on(t.createdAt)],
);

export const webhookDelivery = sqliteTable(
  'webhook_delivery',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    endpointId: text('endpoint_id')
      .notNull()
      .references(() => webhookEndpoint.id, { onDelete: 'cascade' }),
    eventId: text('event_id')
      .notNull()
      .references(() => webhookEvent.id, { onDelete: 'cascade' }),
    status: text('status', { enum: ['pending', 'delivered', 'failed'] }).notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' }).notNull(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
    deliveredAt: integer('delivered_at', { mode: 'timestamp_ms' }),
  },
  (t) => [index('webhook_delivery_due_idx').on(t.status, t.nextAttemptAt), index('webhook_delivery_endpoint_idx').on(t.endpointId, t.id)],
);

export const webhookAttempt = sqliteTable(
  'webhook_attempt',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    deliveryId: integer('delivery_id')
      .notNull()
      .references(() => webhookDelivery.id, { onDelete: 'cascade' }),
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
    /** HTTP status answered, null when none (refused, timed out, redirected elsewhere) */
    status: integer('status'),
    ms: integer('ms').notNull(),
    /** the start of the answer's body, or what went wrong */
    answer: text('answer').notNull(),
  },
  (t) => [index('webhook_attempt_delivery_idx').on(t.deliveryId, t.id)],
);

export const webhookReceipt = sqliteTable('webhook_receipt', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  receivedAt: integer('received_at', { mode: 'timestamp_ms' }).notNull().default(now),
  url: text('url').notNull(),
  eventId: text('event_id'),
  eventType: text('event_type'),
  signatureValid: integer('signature_valid', { mode: 'boolean' }).notNull(),
  headersJson: text('headers_json').notNull(),
  body: text('body').notNull(),
});
