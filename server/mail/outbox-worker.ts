import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import type { Logger } from 'pino';
import { dialectOf } from '../db/dialect';
import type { Db } from '../db/knex';
import { nowIso } from '../db/time';
import type { Mailer } from './mailer';
import { outboxSignal, storedAttachments, type AttachmentRef, type OutboxRow } from './outbox';

/** Makes a file named by reference in a queued message (a delivery note) when the message is sent. */
export type AttachmentRenderer = (ref: AttachmentRef) => Promise<Buffer>;

export interface MailWorkerOptions {
  /** Rows claimed at a time. */
  batchSize: number;
  /** How often an idle worker looks for due rows (rows of other processes, retries coming due). */
  pollMs: number;
  /** A row left `sending` this long (its worker died) may be claimed again. */
  leaseMs: number;
  /** A send that has not finished by then counts as failed (well inside the lease). */
  sendTimeoutMs: number;
  /** Wait before the second attempt; doubled for each attempt after, up to maxDelayMs. */
  baseDelayMs: number;
  maxDelayMs: number;
  /** Attempts before the row is marked failed. */
  maxAttempts: number;
}

export const DEFAULT_MAIL_WORKER_OPTIONS: MailWorkerOptions = {
  batchSize: 10,
  pollMs: 1000,
  leaseMs: 2 * 60_000,
  sendTimeoutMs: 60_000,
  baseDelayMs: 30_000,
  maxDelayMs: 60 * 60_000,
  maxAttempts: 8,
};

/** Wait after the n-th failed attempt (n ≥ 1): base × 2^(n−1), capped. */
export function retryDelayMs(attempts: number, o: Pick<MailWorkerOptions, 'baseDelayMs' | 'maxDelayMs'>): number {
  return Math.min(o.maxDelayMs, o.baseDelayMs * 2 ** Math.max(0, attempts - 1));
}

/** A name for this worker, different in every process and every start, kept on the rows it claims. */
export const newWorkerId = () => `${hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;

/**
 * Claims up to `limit` due rows for `workerId`: queued rows whose next attempt has come, and rows
 * left `sending` longer than the lease (their worker died). Each claim sets status `sending`, the
 * claimer and the time, and counts an attempt. No two claimers ever get the same row:
 * PostgreSQL locks the chosen rows with FOR UPDATE SKIP LOCKED (another claimer skips them and takes
 * the next ones) in the transaction that marks them; SQLite runs the choosing and the marking as one
 * UPDATE statement, which its single writer makes atomic across processes.
 */
export async function claimDue(db: Db, workerId: string, limit: number, leaseMs: number, now = new Date()): Promise<OutboxRow[]> {
  const at = now.toISOString();
  const leaseCutoff = new Date(now.getTime() - leaseMs).toISOString();
  const due = (q: ReturnType<Db>) => q.where((w) => w.where({ status: 'queued' }).andWhere('next_attempt_at', '<=', at)).orWhere((w) => w.where({ status: 'sending' }).andWhere('claimed_at', '<', leaseCutoff));
  const mark = { status: 'sending', claimed_by: workerId, claimed_at: at, attempts: db.raw('attempts + 1') };
  if (dialectOf(db) === 'postgres') {
    return db.transaction(async (trx) => {
      const ids = (await due(trx('mail_outbox')).orderBy('next_attempt_at').orderBy('id').limit(limit).forUpdate().skipLocked().pluck('id')) as number[];
      if (ids.length === 0) return [];
      const rows = (await trx('mail_outbox')
        .whereIn('id', ids)
        .update({ ...mark, attempts: trx.raw('attempts + 1') }, '*')) as OutboxRow[];
      return rows.sort((a, b) => a.id - b.id);
    });
  }
  const rows = (await db('mail_outbox')
    .whereIn('id', (sub) => {
      due(sub.from('mail_outbox')).orderBy('next_attempt_at').orderBy('id').limit(limit).select('id');
    })
    .andWhere((w) => due(w as unknown as ReturnType<Db>))
    .update(mark, '*')) as OutboxRow[];
  return rows.sort((a, b) => a.id - b.id);
}

export interface MailWorker {
  readonly id: string;
  /** Sends due mail now and whenever mail is committed in this process, and polls for the rest. */
  start(): void;
  /** Stops polling and waits for the sends in flight. */
  stop(): Promise<void>;
  /** Sends everything due, including what this process is sending now; resolves when nothing due is left. */
  drain(): Promise<void>;
  /** One claim and its sends; returns how many rows it claimed. */
  runOnce(): Promise<number>;
}

/**
 * The outbox's sender. At least once: a row is marked sent only after the mail server accepted it,
 * so a crash in between sends it again after the lease, with the same Message-ID, which receiving
 * servers and clients use to drop the second copy. A failed send waits with exponential backoff and
 * is marked failed after the last attempt, its error kept on the row.
 */
export function createMailWorker(deps: { db: Db; mailer: Mailer; logger: Logger }, options: Partial<MailWorkerOptions> = {}, renderers: Record<string, AttachmentRenderer> = {}): MailWorker {
  const { db, mailer, logger } = deps;
  const o: MailWorkerOptions = { ...DEFAULT_MAIL_WORKER_OPTIONS, ...options };
  const id = newWorkerId();
  let timer: NodeJS.Timeout | undefined;
  let loop: Promise<void> | null = null;
  let pending = false;
  let stopping = false;

  async function attachmentsOf(row: OutboxRow) {
    return Promise.all(
      storedAttachments(row).map(async (a) => {
        if (!('render' in a)) return a;
        const render = renderers[a.render.kind];
        if (!render) throw new Error(`no renderer for the attachment kind "${a.render.kind}"`);
        return { filename: a.filename, contentType: a.contentType, content: await render(a.render) };
      }),
    );
  }

  function withTimeout<T>(p: Promise<T>): Promise<T> {
    let t: NodeJS.Timeout | undefined;
    return Promise.race([
      p,
      new Promise<never>((_, reject) => {
        t = setTimeout(() => reject(new Error(`the mail server did not answer within ${o.sendTimeoutMs} ms`)), o.sendTimeoutMs);
      }),
    ]).finally(() => clearTimeout(t));
  }

  async function sendOne(row: OutboxRow): Promise<void> {
    try {
      const attachments = await attachmentsOf(row);
      await withTimeout(mailer.send({ to: row.recipient, subject: row.subject, text: row.text, html: row.html ?? '', messageId: row.message_id, ...(attachments.length > 0 ? { attachments } : {}) }));
    } catch (err) {
      const error = (err instanceof Error ? err.message : String(err)).slice(0, 2000);
      const last = row.attempts >= o.maxAttempts;
      // Only while this claim still holds: after the lease another worker may own the row.
      await db('mail_outbox')
        .where({ id: row.id, status: 'sending', claimed_by: id, claimed_at: row.claimed_at })
        .update(
          last
            ? { status: 'failed', last_error: error, claimed_by: null, claimed_at: null }
            : { status: 'queued', last_error: error, claimed_by: null, claimed_at: null, next_attempt_at: new Date(Date.now() + retryDelayMs(row.attempts, o)).toISOString() },
        );
      logger[last ? 'error' : 'warn']({ err, mail: row.id, attempts: row.attempts }, last ? 'e-mail failed for good' : 'e-mail failed; will retry');
      return;
    }
    await db('mail_outbox').where({ id: row.id }).whereIn('status', ['sending', 'queued']).update({ status: 'sent', sent_at: nowIso(), last_error: null });
  }

  async function runOnce(): Promise<number> {
    const rows = await claimDue(db, id, o.batchSize, o.leaseMs);
    await Promise.all(rows.map(sendOne));
    return rows.length;
  }

  /** Runs claims until one finds nothing; calls while it runs make it look once more before it ends. */
  function kick(): Promise<void> {
    pending = true;
    loop ??= (async () => {
      try {
        while (pending && !stopping) {
          pending = false;
          while (!stopping && (await runOnce()) > 0);
        }
      } catch (err) {
        if (!stopping) logger.error({ err }, 'mail outbox worker failed; it tries again at its next poll');
      } finally {
        loop = null;
      }
    })();
    return loop;
  }

  const onCommit = () => void kick();

  return {
    id,
    runOnce,
    start() {
      stopping = false;
      outboxSignal.on('committed', onCommit);
      timer = setInterval(onCommit, o.pollMs);
      timer.unref();
      void kick();
    },
    async stop() {
      stopping = true;
      outboxSignal.off('committed', onCommit);
      clearInterval(timer);
      await loop;
    },
    async drain() {
      await kick();
    },
  };
}
