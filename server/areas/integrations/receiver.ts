import { desc } from 'drizzle-orm';
import type { Request } from 'express';
import { eventEnvelopeSchema } from '../../../shared/contracts/integrations';
import type { DbOrTx } from '../../platform/db/client';
import { webhookEndpoint, webhookReceipt } from './schema';
import { eventIdHeader, eventTypeHeader, signatureHeader, timestampHeader, verifySignature } from './signing';

// The local receiver (development, demo and tests): an endpoint of this very server that
// keeps every delivery it gets and checks its signature as a receiver should, with the secret
// of the endpoint registered at the URL it was called on. Admins read the catch on the
// Webhooks page, like the Mailbox (local) for mail.

export const localReceiverPath = '/api/webhooks/local-receiver';

export function receiveLocally(db: DbOrTx, req: Request, nowSeconds: number): { ok: true; signatureValid: boolean } {
  const raw = Buffer.isBuffer(req.body) ? req.body.toString('utf8') : typeof req.body === 'string' ? req.body : JSON.stringify(req.body ?? null);
  const url = `${req.protocol}://${req.headers.host ?? 'localhost'}${req.originalUrl}`;
  const header = (name: string) => {
    const v = req.headers[name.toLowerCase()];
    return typeof v === 'string' ? v : undefined;
  };
  const secrets = db
    .select({ url: webhookEndpoint.url, secret: webhookEndpoint.secret })
    .from(webhookEndpoint)
    .all()
    .filter((e) => e.url === url || new URL(e.url).pathname === req.originalUrl)
    .map((e) => e.secret);
  const signatureValid = secrets.some((s) => verifySignature(s, header(timestampHeader), header(signatureHeader), raw, nowSeconds));
  let envelope: { id: string | null; type: string | null } = { id: header(eventIdHeader) ?? null, type: header(eventTypeHeader) ?? null };
  try {
    const parsed = eventEnvelopeSchema.safeParse(JSON.parse(raw));
    if (parsed.success) envelope = { id: parsed.data.id, type: parsed.data.type };
  } catch {
    // not JSON: kept as it came
  }
  const kept = Object.fromEntries(
    [timestampHeader, signatureHeader, eventIdHeader, eventTypeHeader, 'content-type', 'user-agent'].map((h) => [h, header(h) ?? null]),
  );
  db.insert(webhookReceipt)
    .values({ url, eventId: envelope.id, eventType: envelope.type, signatureValid, headersJson: JSON.stringify(kept), body: raw.slice(0, 64 * 1024) })
    .run();
  return { ok: true, signatureValid };
}

export function listReceipts(db: DbOrTx) {
  return db
    .select()
    .from(webhookReceipt)
    .orderBy(desc(webhookReceipt.id))
    .limit(200)
    .all()
    .map((r) => ({ id: r.id, receivedAt: r.receivedAt.toISOString(), url: r.url, eventId: r.eventId, eventType: r.eventType, signatureValid: r.signatureValid, body: r.body }));
}
