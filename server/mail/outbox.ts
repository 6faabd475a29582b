import { randomUUID } from 'node:crypto';
import { EventEmitter } from 'node:events';
import type { Knex } from 'knex';
import type { Db } from '../db/knex';
import { nowIso } from '../db/time';
import type { MailMessage } from './mailer';

/**
 * A file sent with a message: small ones travel inline (base64 in the row); a large one is named by
 * a reference that the worker renders when it sends (a delivery note with its photos), so the row
 * stays small and the file is made from what the committed change recorded.
 */
export type OutboxAttachment = { filename: string; contentType: string; content: Buffer } | { filename: string; contentType: string; render: AttachmentRef };

/** What a renderer needs to make a file again: its kind and the ids it is made from. */
export interface AttachmentRef {
  kind: string;
  [key: string]: string | number;
}

/** A message for the outbox: the rendered words, and files inline or by reference. */
export interface OutboxMessage extends Omit<MailMessage, 'attachments' | 'messageId'> {
  attachments?: OutboxAttachment[];
}

export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed';

export interface OutboxRow {
  id: number;
  message_id: string;
  recipient: string;
  subject: string;
  text: string;
  html: string | null;
  attachments: string | null;
  status: OutboxStatus;
  attempts: number;
  next_attempt_at: string;
  claimed_by: string | null;
  claimed_at: string | null;
  last_error: string | null;
  created_at: string;
  sent_at: string | null;
}

type StoredAttachment = { filename: string; contentType: string; base64: string } | { filename: string; contentType: string; render: AttachmentRef };

/**
 * Tells the in-process workers that mail was committed, so they send it at once instead of at their
 * next poll. Only a nudge: a worker in another process finds the row at its own poll.
 */
export const outboxSignal = new EventEmitter();
outboxSignal.setMaxListeners(0);

function outermost(trx: Knex.Transaction): Knex.Transaction {
  let t = trx;
  while (t.parentTransaction) t = t.parentTransaction;
  return t;
}

/**
 * Writes one e-mail to the outbox inside `trx`, the transaction of the change it reports: the mail
 * exists exactly when the change does (a rolled-back change leaves none). The Message-ID is made
 * here and never changes, so every sending of this row is the same message. Returns the Message-ID.
 */
export async function enqueueMail(trx: Db, message: OutboxMessage, domain: string): Promise<string> {
  const messageId = `<${randomUUID()}@${domain}>`;
  const now = nowIso();
  const attachments: StoredAttachment[] | undefined = message.attachments?.map((a) =>
    'render' in a ? { filename: a.filename, contentType: a.contentType, render: a.render } : { filename: a.filename, contentType: a.contentType, base64: a.content.toString('base64') },
  );
  await trx('mail_outbox').insert({
    message_id: messageId,
    recipient: message.to,
    subject: message.subject,
    text: message.text,
    html: message.html || null,
    attachments: attachments && attachments.length > 0 ? JSON.stringify(attachments) : null,
    status: 'queued',
    attempts: 0,
    next_attempt_at: now,
    created_at: now,
  });
  const t = trx as Knex.Transaction;
  if (t.isTransaction) {
    // After the outermost commit only: a savepoint's release is not yet a commit.
    outermost(t).executionPromise.then(
      () => outboxSignal.emit('committed'),
      () => {},
    );
  } else {
    outboxSignal.emit('committed');
  }
  return messageId;
}

/** The stored attachments of a row: inline files decoded, references left for the worker to render. */
export function storedAttachments(row: Pick<OutboxRow, 'attachments'>): OutboxAttachment[] {
  if (!row.attachments) return [];
  return (JSON.parse(row.attachments) as StoredAttachment[]).map((a) => ('render' in a ? a : { filename: a.filename, contentType: a.contentType, content: Buffer.from(a.base64, 'base64') }));
}

export interface OutboxHealth {
  queued: number;
  sending: number;
  failed: number;
  /** Seconds since the oldest message still waiting (queued or being sent) was written; null when none waits. */
  oldest_queued_age_s: number | null;
}

/** The queue's depth and how long its oldest message has waited, for the health check. */
export async function outboxHealth(db: Db, now = Date.now()): Promise<OutboxHealth> {
  const rows = (await db('mail_outbox').whereIn('status', ['queued', 'sending', 'failed']).groupBy('status').select('status').count({ n: '*' }).min({ oldest: 'created_at' })) as {
    status: OutboxStatus;
    n: number | string;
    oldest: string | null;
  }[];
  const by = (s: OutboxStatus) => rows.find((r) => r.status === s);
  const waiting = [by('queued')?.oldest, by('sending')?.oldest].filter((x): x is string => !!x).sort()[0];
  return {
    queued: Number(by('queued')?.n ?? 0),
    sending: Number(by('sending')?.n ?? 0),
    failed: Number(by('failed')?.n ?? 0),
    oldest_queued_age_s: waiting ? Math.max(0, Math.round((now - Date.parse(waiting)) / 1000)) : null,
  };
}
