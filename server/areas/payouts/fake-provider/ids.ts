import { randomBytes } from 'node:crypto';

// Object ids and timestamps the way the provider writes them.

/** A new object id with the provider's prefix (`acct_...`, `po_...`). */
export function newId(prefix: string): string {
  return `${prefix}_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;
}

/** Now, in the provider's unit (whole seconds since the epoch). */
export function nowSec(): number {
  return Math.floor(Date.now() / 1000);
}
