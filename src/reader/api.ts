import type { CheckInput, CheckResult, RevealInput, RevealResult, SolveEventInput } from '../../shared/contracts/reader';
import { checkResultSchema, revealResultSchema } from './schemas';

// The play page's calls to the public reader API (same origin, no session, no cookie).
// Answers are parsed with the shared contracts; errors carry the server's message.

export class ReaderApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

async function post(url: string, body: unknown): Promise<unknown> {
  const res = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body), credentials: 'omit' });
  if (res.status === 204) return undefined;
  const data: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const message = (data as { error?: { message?: unknown } } | null)?.error?.message;
    throw new ReaderApiError(res.status, typeof message === 'string' ? message : `The server answered ${res.status}.`);
  }
  return data;
}

export async function checkEntries(api: string, input: CheckInput): Promise<CheckResult> {
  return checkResultSchema.parse(await post(`${api}/check`, input));
}

export async function revealEntries(api: string, input: RevealInput): Promise<RevealResult> {
  return revealResultSchema.parse(await post(`${api}/reveal`, input));
}

/** An anonymous solve event; lost events are not retried (statistics, not records of a reader). */
export function sendEvent(api: string, event: SolveEventInput): void {
  void fetch(`${api}/events`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(event), credentials: 'omit', keepalive: true }).catch(() => undefined);
}
