import { randomBytes, randomUUID } from 'node:crypto';
import { and, count, desc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type {
  WebhookDelivery,
  WebhookEndpoint,
  WebhookEndpointBody,
  webhookDeliveryDetailSchema,
  webhookDeliveryQuerySchema,
  webhookEndpointPatchSchema,
} from '../../../shared/contracts/integrations';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import { NotFound } from '../../platform/http/errors';
import { deliveryCounts } from './outbox';
import { webhookAttempt, webhookDelivery, webhookEndpoint, webhookEvent } from './schema';
import { parseEndpointEvents } from './stored';
import type { IntegrationsDeps } from './ports';

// Registered endpoints and their deliveries (admins only).

type EndpointRow = typeof webhookEndpoint.$inferSelect;

function toEndpoint(r: EndpointRow, counts: Map<string, { pending: number; failed: number }>): WebhookEndpoint {
  const c = counts.get(r.id) ?? { pending: 0, failed: 0 };
  return {
    id: r.id,
    url: r.url,
    description: r.description,
    events: parseEndpointEvents(r),
    active: r.active,
    createdAt: r.createdAt.toISOString(),
    pending: c.pending,
    failed: c.failed,
  };
}

export function listEndpoints(db: DbOrTx): WebhookEndpoint[] {
  const counts = deliveryCounts(db);
  return db.select().from(webhookEndpoint).orderBy(desc(webhookEndpoint.createdAt)).all().map((r) => toEndpoint(r, counts));
}

function endpointRow(db: DbOrTx, id: string): EndpointRow {
  const r = db.select().from(webhookEndpoint).where(eq(webhookEndpoint.id, id)).get();
  if (!r) throw new NotFound(`No webhook endpoint ${id}.`);
  return r;
}

/** A new endpoint with a fresh signing secret (returned this once). */
export function createEndpoint(deps: Pick<PlatformDeps, 'db' | 'clock'>, createdBy: string | null, body: WebhookEndpointBody): { endpoint: WebhookEndpoint; secret: string } {
  const secret = `whsq_${randomBytes(24).toString('base64url')}`;
  const id = randomUUID();
  deps.db
    .insert(webhookEndpoint)
    .values({ id, url: body.url, description: body.description, eventsJson: JSON.stringify([...new Set(body.events)]), secret, active: true, createdBy, createdAt: deps.clock.now() })
    .run();
  return { endpoint: toEndpoint(endpointRow(deps.db, id), new Map()), secret };
}

export function updateEndpoint(deps: Pick<PlatformDeps, 'db'>, id: string, patch: z.infer<typeof webhookEndpointPatchSchema>): WebhookEndpoint {
  endpointRow(deps.db, id);
  const set: Partial<EndpointRow> = {};
  if (patch.events) set.eventsJson = JSON.stringify([...new Set(patch.events)]);
  if (patch.description !== undefined) set.description = patch.description;
  if (patch.active !== undefined) set.active = patch.active;
  if (Object.keys(set).length > 0) deps.db.update(webhookEndpoint).set(set).where(eq(webhookEndpoint.id, id)).run();
  return toEndpoint(endpointRow(deps.db, id), deliveryCounts(deps.db));
}

/** Remove an endpoint with its deliveries (nothing more is sent to it). */
export function deleteEndpoint(deps: Pick<PlatformDeps, 'db'>, id: string): void {
  endpointRow(deps.db, id);
  deps.db.delete(webhookEndpoint).where(eq(webhookEndpoint.id, id)).run();
}

/** A new signing secret (the old one stops at once). */
export function rotateSecret(deps: Pick<PlatformDeps, 'db'>, id: string): { endpoint: WebhookEndpoint; secret: string } {
  endpointRow(deps.db, id);
  const secret = `whsq_${randomBytes(24).toString('base64url')}`;
  deps.db.update(webhookEndpoint).set({ secret }).where(eq(webhookEndpoint.id, id)).run();
  return { endpoint: toEndpoint(endpointRow(deps.db, id), deliveryCounts(deps.db)), secret };
}

const deliveryColumns = {
  id: webhookDelivery.id,
  endpointId: webhookDelivery.endpointId,
  url: webhookEndpoint.url,
  eventId: webhookDelivery.eventId,
  eventType: webhookEvent.type,
  status: webhookDelivery.status,
  attempts: webhookDelivery.attempts,
  nextAttemptAt: webhookDelivery.nextAttemptAt,
  createdAt: webhookDelivery.createdAt,
  deliveredAt: webhookDelivery.deliveredAt,
};

type DeliveryRow = { id: number; endpointId: string; url: string; eventId: string; eventType: string; status: 'pending' | 'delivered' | 'failed'; attempts: number; nextAttemptAt: Date; createdAt: Date; deliveredAt: Date | null };

function attemptsOf(db: DbOrTx, deliveryId: number, limit: number) {
  return db
    .select({ at: webhookAttempt.at, status: webhookAttempt.status, ms: webhookAttempt.ms, answer: webhookAttempt.answer })
    .from(webhookAttempt)
    .where(eq(webhookAttempt.deliveryId, deliveryId))
    .orderBy(desc(webhookAttempt.id))
    .limit(limit)
    .all()
    .map((a) => ({ at: a.at.toISOString(), status: a.status, ms: a.ms, answer: a.answer }));
}

function toDelivery(db: DbOrTx, r: DeliveryRow): WebhookDelivery {
  return {
    id: String(r.id),
    endpointId: r.endpointId,
    url: r.url,
    eventId: r.eventId,
    eventType: r.eventType as WebhookDelivery['eventType'],
    status: r.status,
    attempts: r.attempts,
    nextAttemptAt: r.status === 'pending' ? r.nextAttemptAt.toISOString() : null,
    createdAt: r.createdAt.toISOString(),
    deliveredAt: r.deliveredAt ? r.deliveredAt.toISOString() : null,
    lastAttempt: attemptsOf(db, r.id, 1)[0] ?? null,
  };
}

export function listDeliveries(db: DbOrTx, q: z.infer<typeof webhookDeliveryQuerySchema>) {
  const where = and(q.endpointId ? eq(webhookDelivery.endpointId, q.endpointId) : undefined, q.status ? eq(webhookDelivery.status, q.status) : undefined);
  const total = db.select({ n: count() }).from(webhookDelivery).where(where).get()?.n ?? 0;
  const rows = db
    .select(deliveryColumns)
    .from(webhookDelivery)
    .innerJoin(webhookEndpoint, eq(webhookEndpoint.id, webhookDelivery.endpointId))
    .innerJoin(webhookEvent, eq(webhookEvent.id, webhookDelivery.eventId))
    .where(where)
    .orderBy(desc(webhookDelivery.id))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize)
    .all();
  return { items: rows.map((r) => toDelivery(db, r)), total, page: q.page, pageSize: q.pageSize };
}

function deliveryRow(db: DbOrTx, id: string): DeliveryRow & { body: string } {
  const n = Number(id);
  const r = Number.isSafeInteger(n)
    ? db
        .select({ ...deliveryColumns, body: webhookEvent.body })
        .from(webhookDelivery)
        .innerJoin(webhookEndpoint, eq(webhookEndpoint.id, webhookDelivery.endpointId))
        .innerJoin(webhookEvent, eq(webhookEvent.id, webhookDelivery.eventId))
        .where(eq(webhookDelivery.id, n))
        .get()
    : undefined;
  if (!r) throw new NotFound(`No webhook delivery ${id}.`);
  return r;
}

export function getDelivery(db: DbOrTx, id: string): z.input<typeof webhookDeliveryDetailSchema> {
  const r = deliveryRow(db, id);
  return { ...toDelivery(db, r), payload: r.body, history: attemptsOf(db, r.id, 50) };
}

/** Send again by hand: the same event (same id, same body), now, with a fresh attempt budget. */
export function resendDelivery(deps: Pick<IntegrationsDeps, 'db' | 'clock' | 'webhooks'>, id: string): WebhookDelivery {
  const r = deliveryRow(deps.db, id);
  deps.db.update(webhookDelivery).set({ status: 'pending', attempts: 0, nextAttemptAt: deps.clock.now(), deliveredAt: null }).where(eq(webhookDelivery.id, r.id)).run();
  deps.webhooks.kick();
  return toDelivery(deps.db, { ...r, status: 'pending', attempts: 0, nextAttemptAt: deps.clock.now(), deliveredAt: null });
}
