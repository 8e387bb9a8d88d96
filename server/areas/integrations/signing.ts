import { createHmac, timingSafeEqual } from 'node:crypto';

// How every delivery is signed (README "Integrations"):
//   Squarewright-Timestamp: <seconds since 1970>
//   Squarewright-Signature: sha256=<hex HMAC-SHA256(secret, "<timestamp>.<raw body>")>
// A receiver recomputes the HMAC over the timestamp header, a dot and the raw body bytes,
// compares in constant time, and refuses a timestamp more than 5 minutes from its clock.

export const timestampHeader = 'Squarewright-Timestamp';
export const signatureHeader = 'Squarewright-Signature';
export const eventIdHeader = 'Squarewright-Event-Id';
export const eventTypeHeader = 'Squarewright-Event-Type';
export const signatureToleranceSeconds = 300;

export function sign(secret: string, timestamp: number, body: string): string {
  return `sha256=${createHmac('sha256', secret).update(`${timestamp}.${body}`).digest('hex')}`;
}

/** The documented check: true when the signature matches and the timestamp is within the tolerance. */
export function verifySignature(secret: string, timestamp: string | undefined, signature: string | undefined, body: string, nowSeconds: number): boolean {
  if (!timestamp || !signature || !/^\d{1,12}$/.test(timestamp)) return false;
  if (Math.abs(nowSeconds - Number(timestamp)) > signatureToleranceSeconds) return false;
  const expected = Buffer.from(sign(secret, Number(timestamp), body));
  const given = Buffer.from(signature);
  return given.length === expected.length && timingSafeEqual(given, expected);
}
