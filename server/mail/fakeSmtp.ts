import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';

export interface CapturedMail {
  id: number;
  to: string;
  from: string;
  subject: string;
  text: string;
  html: string;
  date: string;
  messageId: string;
  headers: Record<string, string>;
}

export interface FakeSmtp {
  port: number;
  url: string;
  /** Newest first. */
  list(): CapturedMail[];
  clear(): void;
  /** Resolves once `count` messages have arrived in all (for tests). */
  waitFor(count: number, timeoutMs?: number): Promise<CapturedMail[]>;
  /** While set, every message is refused with a temporary failure (for tests). */
  setFailing(failing: boolean): void;
  close(): Promise<void>;
}

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

/**
 * A local SMTP server that keeps what it receives, for development, the demo and tests.
 * It listens on 127.0.0.1 only and is never started in production.
 */
export async function startFakeSmtp(port = 0, keep = 500): Promise<FakeSmtp> {
  const messages: CapturedMail[] = [];
  const waiters: Array<{ count: number; resolve: (m: CapturedMail[]) => void }> = [];
  let nextId = 1;
  let failing = false;

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      if (failing) {
        stream.resume();
        stream.on('end', () => {
          const err = new Error('Mailbox temporarily unavailable') as Error & {
            responseCode: number;
          };
          err.responseCode = 451;
          callback(err);
        });
        return;
      }
      simpleParser(stream)
        .then((parsed) => {
          const headers: Record<string, string> = {};
          for (const [k, v] of parsed.headers)
            headers[k] = typeof v === 'string' ? v : JSON.stringify(v);
          messages.unshift({
            id: nextId++,
            to: addressText(parsed.to),
            from: addressText(parsed.from),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            date: (parsed.date ?? new Date()).toISOString(),
            messageId: parsed.messageId ?? '',
            headers,
          });
          if (messages.length > keep) messages.length = keep;
          const total = nextId - 1;
          for (const w of [...waiters]) {
            if (total >= w.count) {
              waiters.splice(waiters.indexOf(w), 1);
              w.resolve([...messages]);
            }
          }
          callback();
        })
        .catch((err) => callback(err));
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const actualPort = (server.server.address() as AddressInfo).port;

  return {
    port: actualPort,
    url: `smtp://127.0.0.1:${actualPort}`,
    list: () => [...messages],
    clear: () => {
      messages.length = 0;
    },
    waitFor(count, timeoutMs = 10_000) {
      if (nextId - 1 >= count) return Promise.resolve([...messages]);
      return new Promise((resolve, reject) => {
        const w = { count, resolve };
        waiters.push(w);
        setTimeout(() => {
          const i = waiters.indexOf(w);
          if (i >= 0) {
            waiters.splice(i, 1);
            reject(
              new Error(`Expected ${count} e-mails, got ${nextId - 1} within ${timeoutMs} ms`),
            );
          }
        }, timeoutMs).unref();
      });
    },
    setFailing(f) {
      failing = f;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
