import { and, asc, eq, lte, sql } from 'drizzle-orm';
import type { Transporter } from 'nodemailer';
import type { Clock } from '../clock';
import type { Db, DbOrTx } from '../db/client';
import { mailOutbox } from './schema';
import type { Logger } from '../log';
import { loadMailTemplates, renderMail, type MailData } from './templates';

export type QueueMailInput = { to: string; template: string; data: MailData };

/**
 * Write a mail to the outbox inside the caller's transaction (or on the db). It is
 * rendered now, so a wrong template name or missing data fails the event itself.
 * The sender loop delivers it after the transaction commits.
 */
export function queueMail(tx: DbOrTx, input: QueueMailInput, now: Date = new Date()): number {
  const template = loadMailTemplates().get(input.template);
  if (!template) throw new Error(`queueMail: no mail template "${input.template}" in templates/mail`);
  const { subject, body } = renderMail(template, input.data);
  const row = tx
    .insert(mailOutbox)
    .values({ to: input.to, template: input.template, subject, body, nextAttemptAt: now, createdAt: now })
    .returning({ id: mailOutbox.id })
    .get();
  return row.id;
}

export type MailSenderOptions = {
  db: Db;
  transport: Transporter;
  from: string;
  clock: Clock;
  log: Logger;
  /** first retry delay (ms); doubles each attempt up to maxDelayMs */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** after this many failed attempts the mail is marked failed */
  maxAttempts?: number;
  /** loop period (ms) */
  intervalMs?: number;
};

export type MailSender = {
  /** Deliver every due mail now; resolves when this pass is done. */
  flush(): Promise<{ sent: number; failed: number }>;
  /** Ask the loop to run soon (after a commit that queued mail). */
  kick(): void;
  start(): void;
  stop(): Promise<void>;
  status(): { pending: number; failed: number; lastError: string | null };
  /** the last delivery error (null after a success): what health needs, without counting the outbox */
  lastError(): string | null;
};

export function retryDelayMs(attempts: number, base: number, max: number): number {
  return Math.min(max, base * 2 ** Math.max(0, attempts - 1));
}

export function createMailSender(options: MailSenderOptions): MailSender {
  const { db, transport, from, clock, log } = options;
  const base = options.baseDelayMs ?? 2_000;
  const max = options.maxDelayMs ?? 10 * 60_000;
  const maxAttempts = options.maxAttempts ?? 12;
  const intervalMs = options.intervalMs ?? 1_000;
  let timer: NodeJS.Timeout | undefined;
  let current: Promise<{ sent: number; failed: number }> | undefined;
  let lastError: string | null = null;
  let stopped = false;

  async function pass(): Promise<{ sent: number; failed: number }> {
    let sent = 0;
    let failed = 0;
    const due = db
      .select({ id: mailOutbox.id, to: mailOutbox.to, subject: mailOutbox.subject, body: mailOutbox.body, attempts: mailOutbox.attempts })
      .from(mailOutbox)
      .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, clock.now())))
      .orderBy(asc(mailOutbox.id))
      .limit(50)
      .all();
    for (const mail of due) {
      if (!db.$client.open) break;
      try {
        await transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.body });
        if (!db.$client.open) break;
        db.update(mailOutbox)
          .set({ status: 'sent', sentAt: clock.now(), attempts: mail.attempts + 1, lastError: null })
          .where(eq(mailOutbox.id, mail.id))
          .run();
        sent += 1;
        lastError = null;
      } catch (err) {
        if (!db.$client.open) break;
        const attempts = mail.attempts + 1;
        const message = err instanceof Error ? err.message : String(err);
        lastError = message;
        const giveUp = attempts >= maxAttempts;
        db.update(mailOutbox)
          .set({
            attempts,
            lastError: message.slice(0, 500),
            status: giveUp ? 'failed' : 'pending',
            nextAttemptAt: new Date(clock.now().getTime() + retryDelayMs(attempts, base, max)),
          })
          .where(eq(mailOutbox.id, mail.id))
          .run();
        failed += 1;
        log.warn(`mail ${mail.id} to ${mail.to}: attempt ${attempts} failed (${message})${giveUp ? '; giving up' : ''}`);
      }
    }
    return { sent, failed };
  }

  function flush() {
    if (!current) {
      current = pass().finally(() => {
        current = undefined;
      });
    }
    return current;
  }

  function schedule(delay: number) {
    if (stopped) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = undefined;
      flush()
        .catch((err: unknown) => log.warn(`mail sender pass failed: ${String(err)}`))
        .finally(() => schedule(intervalMs));
    }, delay);
    timer.unref?.();
  }

  return {
    flush,
    kick: () => schedule(0),
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
    lastError: () => lastError,
    status() {
      if (!db.$client.open) return { pending: 0, failed: 0, lastError };
      const counts = db
        .select({
          pending: sql<number>`coalesce(sum(case when ${mailOutbox.status} = 'pending' then 1 else 0 end), 0)`,
          failed: sql<number>`coalesce(sum(case when ${mailOutbox.status} = 'failed' then 1 else 0 end), 0)`,
        })
        .from(mailOutbox)
        .get();
      return { pending: Number(counts?.pending ?? 0), failed: Number(counts?.failed ?? 0), lastError };
    },
  };
}
