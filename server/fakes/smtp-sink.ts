import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { OutboxMessage } from '@shared/orgs/org-schemas';

/**
 * A local SMTP server that accepts every message and keeps it in memory, with a
 * small HTTP listing (GET /messages, DELETE /messages) for the Dev outbox and tests.
 * Development and tests only: it binds to loopback and never relays anything.
 */
export interface SmtpSink {
  smtpPort: number;
  httpPort: number;
  messages(): OutboxMessage[];
  clear(): void;
  /** Resolves with the first message kept from now on that matches, or rejects after `timeoutMs`. */
  waitFor(match: (m: OutboxMessage) => boolean, timeoutMs?: number): Promise<OutboxMessage>;
  close(): Promise<void>;
}

const LINK = /https?:\/\/[^\s<>"')]+/g;

export async function startSmtpSink(
  options: { host?: string; smtpPort?: number; httpPort?: number } = {},
): Promise<SmtpSink> {
  const host = options.host ?? '127.0.0.1';
  const kept: OutboxMessage[] = [];
  const waiters = new Set<(m: OutboxMessage) => void>();

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const text = mail.text ?? '';
          const message: OutboxMessage = {
            id: randomUUID(),
            from: mail.from?.text ?? '',
            replyTo: mail.replyTo?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text,
            receivedAt: new Date().toISOString(),
            links: [...new Set(text.match(LINK) ?? [])],
          };
          kept.unshift(message);
          for (const w of waiters) w(message);
          callback();
        })
        .catch((err: unknown) => callback(err as Error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(options.smtpPort ?? 0, host, () => resolve());
  });

  const http: Server = createServer((req, res) => {
    if (req.url === '/messages' && req.method === 'GET') {
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(kept));
    } else if (req.url === '/messages' && req.method === 'DELETE') {
      kept.length = 0;
      res.writeHead(204).end();
    } else {
      res.writeHead(404).end();
    }
  });
  await new Promise<void>((resolve, reject) => {
    http.once('error', reject);
    http.listen(options.httpPort ?? 0, host, () => resolve());
  });

  return {
    smtpPort: (smtp.server.address() as AddressInfo).port,
    httpPort: (http.address() as AddressInfo).port,
    messages: () => [...kept],
    clear: () => {
      kept.length = 0;
    },
    waitFor(match, timeoutMs = 5000) {
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => {
          waiters.delete(waiter);
          reject(new Error('no matching e-mail arrived'));
        }, timeoutMs);
        const waiter = (m: OutboxMessage) => {
          if (!match(m)) return;
          clearTimeout(timer);
          waiters.delete(waiter);
          resolve(m);
        };
        waiters.add(waiter);
      });
    },
    async close() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      await new Promise<void>((resolve) => http.close(() => resolve()));
    },
  };
}
