import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { ORGANISATION_HEADER } from './mailer.js';

/** One message received by the fake SMTP server. */
export interface ReceivedMail {
  id: string;
  from: string;
  to: string[];
  /** From the X-Headroom-Organisation header, when the sender set it. */
  organisationId: string | null;
  subject: string;
  text: string;
  html: string | null;
  attachments: Array<{ filename: string | null; contentType: string; size: number; content: Buffer }>;
  receivedAt: string;
}

/** The fake server's in-memory inbox (newest last), kept to the last `MAILBOX_LIMIT` messages. */
export interface FakeMailbox {
  /** `smtp://127.0.0.1:<port>`, for the mailer. */
  readonly url: string;
  messages(): ReceivedMail[];
  /** Resolves with the first message (already received or arriving) that matches. */
  waitFor(match: (mail: ReceivedMail) => boolean, timeoutMs?: number): Promise<ReceivedMail>;
  clear(): void;
  close(): Promise<void>;
}

const MAILBOX_LIMIT = 200;
const MESSAGE_LIMIT_BYTES = 25 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

function headerText(value: unknown): string | null {
  return typeof value === 'string' && value.length > 0 ? value : null;
}

/**
 * A local SMTP server for development and tests: accepts every message (no TLS, no authentication) on
 * 127.0.0.1 and keeps it in memory. `npm start` runs it when no SMTP_URL is configured, so invitations
 * and password resets can be tried without a mail provider; it never relays anything anywhere.
 */
export async function startFakeSmtpServer(options: { host?: string; port?: number } = {}): Promise<FakeMailbox> {
  const received: ReceivedMail[] = [];
  const waiters = new Set<{ match: (m: ReceivedMail) => boolean; resolve: (m: ReceivedMail) => void }>();

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    size: MESSAGE_LIMIT_BYTES,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const mail: ReceivedMail = {
            id: randomUUID(),
            from: addresses(parsed.from)[0] ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
            to: session.envelope.rcptTo.map((r) => r.address),
            organisationId: headerText(parsed.headers.get(ORGANISATION_HEADER.toLowerCase())),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, size: a.size, content: a.content })),
            receivedAt: new Date().toISOString(),
          };
          received.push(mail);
          if (received.length > MAILBOX_LIMIT) received.shift();
          for (const w of waiters) {
            if (w.match(mail)) {
              waiters.delete(w);
              w.resolve(mail);
            }
          }
          callback();
        })
        .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
    },
  });

  const host = options.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const { port } = server.server.address() as AddressInfo;

  return {
    url: `smtp://${host}:${port}`,
    messages: () => [...received],
    waitFor(match, timeoutMs = 10_000) {
      const found = received.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const waiter = { match, resolve };
        waiters.add(waiter);
        setTimeout(() => {
          if (waiters.delete(waiter)) reject(new Error(`No matching mail arrived within ${timeoutMs} ms`));
        }, timeoutMs).unref();
      });
    },
    clear: () => {
      received.length = 0;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
