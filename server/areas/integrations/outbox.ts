import { randomUUID } from 'node:crypto';
import { and, asc, eq, lte, sql } from 'drizzle-orm';
import { eventDataSchemas, type EventData, type EventType } from '../../../shared/contracts/integrations';
import type { Clock } from '../../platform/clock';
import type { Db, DbOrTx } from '../../platform/db/client';
import type { EventSink } from '../../platform/events';
import type { Logger } from '../../platform/log';
import { webhookAttempt, webhookDelivery, webhookEndpoint, webhookEvent } from './schema';
import { eventIdHeader, eventTypeHeader, sign, signatureHeader, timestampHeader } from './signing';
import { parseEndpointEvents } from './stored';

// The webhook outbox, built like the mail outbox (server/platform/mail/outbox.ts): emit()
// writes the event and one delivery per endpoint that wants it in the caller's transaction;
// the sender loop posts due deliveries after the commit and retries with doubling delays.
// Nothing is lost on a crash: a delivery is marked delivered only after the endpoint answered
// 2xx, so one interrupted mid-flight is sent again (receivers drop repeats by the event id).

export type WebhookSenderOptions = {
  db: Db;
  clock: Clock;
  log: Logger;
  /** first retry delay (ms), doubling up to maxDelayMs */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** after this many failed attempts the delivery is marked failed (re-send by hand) */
  maxAttempts?: number;
  /** loop period (ms) */
  intervalMs?: number;
  /** per request (ms) */
  timeoutMs?: number;
  /** the HTTP client (tests may wrap it); default global fetch */
  fetch?: typeof fetch;
};

export type WebhookSender = EventSink & {
  /** deliver every due delivery now */
  flush(): Promise<{ delivered: number; failed: number }>;
  start(): void;
  stop(): Promise<void>;
};

export function retryDelayMs(attempts: number, base: number, max: number): number {
  return Math.min(max, base * 2 ** Math.max(0, attempts - 1));
}

export function emitEvent<T extends EventType>(tx: DbOrTx, type: T, data: EventData<T>, now: Date): string | null {
  const parsed = eventDataSchemas[type].parse(data);
  const endpoints = tx
    .select({ id: webhookEndpoint.id, eventsJson: webhookEndpoint.eventsJson })
    .from(webhookEndpoint)
    .where(eq(webhookEndpoint.active, true))
    .all()
    .filter((e) => parseEndpointEvents(e).includes(type));
  if (endpoints.length === 0) return null;
  const id = `evt_${randomUUID()}`;
  const body = JSON.stringify({ id, type, createdAt: now.toISOString(), data: parsed });
  tx.insert(webhookEvent).values({ id, type, body, createdAt: now }).run();
  tx.insert(webhookDelivery)
    .values(endpoints.map((e) => ({ endpointId: e.id, eventId: id, nextAttemptAt: now, createdAt: now })))
    .run();
  return id;
}

const answerLimit = 500;

async function readAnswer(res: Response): Promise<string> {
  try {
    const text = await res.text();
    return text.slice(0, answerLimit);
  } catch {
    return '';
  }
}

export function createWebhookSender(options: WebhookSenderOptions): WebhookSender {
  const { db, clock, log } = options;
  const base = options.baseDelayMs ?? 5_000;
  const max = options.maxDelayMs ?? 60 * 60_000;
  const maxAttempts = options.maxAttempts ?? 12;
  const intervalMs = options.intervalMs ?? 2_000;
  const timeoutMs = options.timeoutMs ?? 10_000;
  const http = options.fetch ?? fetch;
  let timer: NodeJS.Timeout | undefined;
  let current: Promise<{ delivered: number; failed: number }> | undefined;
  let stopped = true;

  async function post(url: string, secret: string, eventId: string, type: string, body: string) {
    const t0 = performance.now();
    const timestamp = Math.floor(clock.now().getTime() / 1000);
    try {
      const res = await http(url, {
        method: 'POST',
        // only the registered URL: no redirect is followed (a 3xx counts as a failed attempt)
        redirect: 'manual',
        signal: AbortSignal.timeout(timeoutMs),
        headers: {
          'content-type': 'application/json',
          'user-agent': 'Squarewright-Webhooks/1',
          [timestampHeader]: String(timestamp),
          [signatureHeader]: sign(secret, timestamp, body),
          [eventIdHeader]: eventId,
          [eventTypeHeader]: type,
        },
        body,
      });
      const answer = await readAnswer(res);
      const ms = Math.round(performance.now() - t0);
      if (res.status >= 300 && res.status < 400) {
        return { ok: false, status: res.status, ms, answer: `redirect to ${res.headers.get('location') ?? '(no location)'} not followed: deliveries go only to the registered URL` };
      }
      return { ok: res.status >= 200 && res.status < 300, status: res.status, ms, answer };
    } catch (err) {
      const ms = Math.round(performance.now() - t0);
      const e = err as { name?: string; message?: string; cause?: { code?: string; message?: string } };
      const why = e.name === 'TimeoutError' ? `no answer within ${timeoutMs} ms` : (e.cause?.code ?? e.cause?.message ?? e.message ?? String(err));
      return { ok: false, status: null, ms, answer: why.slice(0, answerLimit) };
    }
  }

  async function pass() {
    let delivered = 0;
    let failed = 0;
    const due = db
      .select({
        id: webhookDelivery.id,
        attempts: webhookDelivery.attempts,
        url: webhookEndpoint.url,
        secret: webhookEndpoint.secret,
        eventId: webhookEvent.id,
        type: webhookEvent.type,
        body: webhookEvent.body,
      })
      .from(webhookDelivery)
      .innerJoin(webhookEndpoint, eq(webhookEndpoint.id, webhookDelivery.endpointId))
      .innerJoin(webhookEvent, eq(webhookEvent.id, webhookDelivery.eventId))
      .where(and(eq(webhookDelivery.status, 'pending'), lte(webhookDelivery.nextAttemptAt, clock.now())))
      .orderBy(asc(webhookDelivery.id))
      .limit(50)
      .all();
    for (const d of due) {
      if (!db.$client.open) break;
      const result = await post(d.url, d.secret, d.eventId, d.type, d.body);
      if (!db.$client.open) break;
      const attempts = d.attempts + 1;
      const at = clock.now();
      const giveUp = !result.ok && attempts >= maxAttempts;
      db.transaction((tx) => {
        tx.insert(webhookAttempt).values({ deliveryId: d.id, at, status: result.status, ms: result.ms, answer: result.answer }).run();
        tx.update(webhookDelivery)
          .set(
            result.ok
              ? { status: 'delivered', attempts, deliveredAt: at }
              : { status: giveUp ? 'failed' : 'pending', attempts, nextAttemptAt: new Date(at.getTime() + retryDelayMs(attempts, base, max)) },
          )
          .where(eq(webhookDelivery.id, d.id))
          .run();
      });
      if (result.ok) delivered += 1;
      else {
        failed += 1;
        log.warn(`webhook delivery ${d.id} (${d.type}) to ${d.url}: attempt ${attempts} failed (${result.status ?? result.answer})${giveUp ? '; giving up' : ''}`);
      }
    }
    return { delivered, failed };
  }

  function flush() {
    current ??= pass().finally(() => {
      current = undefined;
    });
    return current;
  }

  function schedule(delay: number) {
    if (stopped) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = undefined;
      flush()
        .catch((err: unknown) => log.warn(`webhook sender pass failed: ${String(err)}`))
        .finally(() => schedule(intervalMs));
    }, delay);
    timer.unref?.();
  }

  return {
    emit(tx, type, data) {
      emitEvent(tx, type, data, clock.now());
    },
    kick: () => schedule(0),
    flush,
    start() {
      stopped = false;
      schedule(0);
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = undefined;
      await current?.catch(() => undefined);
    },
  };
}

/** Deliveries waiting and given up, per endpoint. */
export function deliveryCounts(db: DbOrTx): Map<string, { pending: number; failed: number }> {
  const rows = db
    .select({
      endpointId: webhookDelivery.endpointId,
      pending: sql<number>`sum(case when ${webhookDelivery.status} = 'pending' then 1 else 0 end)`,
      failed: sql<number>`sum(case when ${webhookDelivery.status} = 'failed' then 1 else 0 end)`,
    })
    .from(webhookDelivery)
    .groupBy(webhookDelivery.endpointId)
    .all();
  return new Map(rows.map((r) => [r.endpointId, { pending: Number(r.pending ?? 0), failed: Number(r.failed ?? 0) }]));
}
