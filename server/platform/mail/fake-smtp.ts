import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/client';
import { mailboxMessage } from './schema';

// The local fake SMTP server (development, demo, tests): listens on 127.0.0.1, no TLS,
// no auth, and stores each caught mail in mailbox_message (read on the Mailbox (local) page).

export type FakeSmtp = { host: string; port: number; url: string; close(): Promise<void> };

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

export async function startFakeSmtp(options: { db: Db; port?: number; host?: string }): Promise<FakeSmtp> {
  const host = options.host ?? '127.0.0.1';
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    banner: 'Squarewright local fake SMTP',
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          if (!options.db.$client.open) return callback(new Error('mailbox closed'));
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address).join(', ');
          options.db
            .insert(mailboxMessage)
            .values({
              from: addresses(mail.from) || (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
              to: addresses(mail.to) || envelopeTo,
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              html: typeof mail.html === 'string' ? mail.html : null,
              receivedAt: new Date(),
            })
            .run();
          callback();
        })
        .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', () => undefined);
  const port = (server.server.address() as AddressInfo).port;
  let closed: Promise<void> | undefined;
  return {
    host,
    port,
    url: `smtp://${host}:${port}`,
    // idempotent: tests close it to simulate a mail server that is down
    close: () => (closed ??= new Promise<void>((resolve) => server.close(() => resolve()))),
  };
}
