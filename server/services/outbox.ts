import crypto from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import type { Transporter } from 'nodemailer';
import { OutboxMessage } from '../models';
import type { OutboxStatus } from '../models/OutboxMessage';
import { HttpError } from '../errors';
import { audit } from './audit';
import type { MailContent } from '../mail/templates';
import type { Logger } from '../logger';

export interface OutgoingMail extends MailContent {
  to: string;
  kind?: string;
  headers?: Record<string, string>;
}

/**
 * Queues an e-mail in the outbox table. Pass the transaction of the change that causes
 * it, so the message exists exactly when the change does.
 */
export async function enqueueMail(
  mail: OutgoingMail,
  opts: { transaction?: Transaction; domain?: string } = {},
): Promise<OutboxMessage> {
  const messageId = `<${crypto.randomUUID()}@${opts.domain ?? 'loomwright.test'}>`;
  return OutboxMessage.create(
    {
      messageId,
      toAddress: mail.to,
      subject: mail.subject,
      textBody: mail.text,
      htmlBody: mail.html,
      headers: mail.headers ?? null,
      kind: mail.kind ?? 'general',
      nextAttemptAt: new Date(),
      lastError: null,
      sentAt: null,
    },
    { transaction: opts.transaction },
  );
}

export interface OutboxWorkerOptions {
  transport: Transporter;
  from: string;
  logger: Logger;
  pollMs: number;
  maxAttempts: number;
  baseBackoffMs: number;
}

/**
 * Delivers queued mail with retries and exponential backoff. A message that still
 * fails after `maxAttempts` is marked failed and logged; nothing is deleted.
 */
export class OutboxWorker {
  private timer?: NodeJS.Timeout;
  private running: Promise<number> | null = null;
  private stopped = false;

  constructor(private readonly opts: OutboxWorkerOptions) {}

  async start() {
    // A message left "sending" by a crash was not confirmed; send it again.
    await OutboxMessage.update({ status: 'queued' }, { where: { status: 'sending' } });
    this.stopped = false;
    this.schedule();
  }

  private schedule() {
    if (this.stopped) return;
    this.timer = setTimeout(() => {
      void this.flush().finally(() => this.schedule());
    }, this.opts.pollMs);
    this.timer.unref();
  }

  /** Sends every message that is due now; resolves with how many were sent. */
  flush(): Promise<number> {
    // Once stopped (shutting down) nothing new starts: the database is about to close.
    if (this.stopped) return this.running ?? Promise.resolve(0);
    if (!this.running) {
      this.running = this.deliverDue().finally(() => {
        this.running = null;
      });
    }
    return this.running;
  }

  private async deliverDue(): Promise<number> {
    let sent = 0;
    for (;;) {
      const due = await OutboxMessage.findAll({
        where: { status: 'queued', nextAttemptAt: { [Op.lte]: new Date() } },
        order: [['id', 'ASC']],
        limit: 20,
      });
      if (!due.length) return sent;
      for (const msg of due) {
        if (this.stopped) return sent;
        const [claimed] = await OutboxMessage.update(
          { status: 'sending' },
          { where: { id: msg.id, status: 'queued' } },
        );
        if (!claimed) continue;
        try {
          await this.opts.transport.sendMail({
            from: this.opts.from,
            to: msg.toAddress,
            subject: msg.subject,
            text: msg.textBody,
            html: msg.htmlBody ?? undefined,
            messageId: msg.messageId,
            headers: msg.headers ?? undefined,
          });
          // By id: the claim above was a static UPDATE, so this instance still reads
          // 'queued' and an instance update would skip a status it thinks unchanged.
          await OutboxMessage.update(
            { status: 'sent', sentAt: new Date(), attempts: msg.attempts + 1, lastError: null },
            { where: { id: msg.id } },
          );
          sent++;
        } catch (err) {
          const attempts = msg.attempts + 1;
          const failed = attempts >= this.opts.maxAttempts;
          const delay = this.opts.baseBackoffMs * 2 ** (attempts - 1);
          await OutboxMessage.update(
            {
              status: failed ? 'failed' : 'queued',
              attempts,
              lastError: String((err as Error).message ?? err).slice(0, 1000),
              nextAttemptAt: new Date(Date.now() + delay),
            },
            { where: { id: msg.id } },
          );
          const log = {
            messageId: msg.messageId,
            to: msg.toAddress,
            attempts,
            err: (err as Error).message,
          };
          if (failed) this.opts.logger.error(log, 'e-mail delivery failed for good');
          else this.opts.logger.warn(log, 'e-mail delivery failed; will retry');
        }
      }
    }
  }

  async stop() {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    if (this.running) await this.running.catch(() => undefined);
  }
}

/** One outbox row as the admins' mail page shows it. */
function outboxJson(m: OutboxMessage) {
  return {
    id: m.id,
    messageId: m.messageId,
    to: m.toAddress,
    subject: m.subject,
    kind: m.kind,
    status: m.status,
    attempts: m.attempts,
    lastError: m.lastError,
    nextAttemptAt: m.nextAttemptAt,
    sentAt: m.sentAt,
    createdAt: m.createdAt,
  };
}

/**
 * The outbox for admins: how many messages are in each state, and the newest ones of
 * `status` ('all' for every state).
 */
export async function listOutbox(status: 'failed' | 'queued' | 'sent' | 'all', limit = 100) {
  const counts = { queued: 0, sending: 0, sent: 0, failed: 0 };
  const grouped = (await OutboxMessage.count({ group: ['status'] })) as unknown as Array<{
    status: OutboxStatus;
    count: number;
  }>;
  for (const g of grouped) counts[g.status] = Number(g.count);
  const where =
    status === 'all' ? {} : status === 'queued' ? { status: ['queued', 'sending'] } : { status };
  const rows = await OutboxMessage.findAll({ where, order: [['id', 'DESC']], limit });
  return { counts, items: rows.map(outboxJson) };
}

/**
 * Sends a failed (or waiting) message again now, with a fresh count of attempts, and
 * writes who asked to the audit log. Refused for a message that was sent or is being sent.
 */
export async function retryOutboxMessage(id: number, actorId: number) {
  const msg = await OutboxMessage.findByPk(id);
  if (!msg)
    throw new HttpError(404, 'NOT_FOUND', 'There is no message with this number in the outbox.');
  if (msg.status === 'sent' || msg.status === 'sending')
    throw new HttpError(
      409,
      'NOT_RETRYABLE',
      msg.status === 'sent'
        ? 'This message was already delivered, so it is not sent again.'
        : 'This message is being delivered right now. Reload the list in a moment.',
    );
  const [changed] = await OutboxMessage.update(
    { status: 'queued', attempts: 0, nextAttemptAt: new Date() },
    { where: { id, status: ['queued', 'failed'] } },
  );
  if (!changed)
    throw new HttpError(
      409,
      'NOT_RETRYABLE',
      'This message changed meanwhile. Reload the list and try again.',
    );
  await audit({
    actorId,
    action: 'mail.retry',
    targetType: 'mail',
    targetId: id,
    details: { to: msg.toAddress, subject: msg.subject, attempts: msg.attempts },
  });
  return outboxJson((await OutboxMessage.findByPk(id))!);
}
