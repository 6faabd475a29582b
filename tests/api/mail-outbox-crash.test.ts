import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/knex';
import { TEST_PASSWORD, makeOrgWithUser } from '../setup/factories';
import { startMailCapture } from '../setup/mail-capture';
import { createTestPgDatabase } from '../setup/pg-database';

const ROOT = new URL('../../', import.meta.url).pathname;
const BURST = 24;

let dir: string;
let pg: Awaited<ReturnType<typeof createTestPgDatabase>> | undefined;
let mail: Awaited<ReturnType<typeof startMailCapture>>;
let db: Db | undefined;
let child: ChildProcess | undefined;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ridgeload-crash-'));
  pg = process.env.TEST_DB === 'postgres' ? await createTestPgDatabase() : undefined;
  mail = await startMailCapture();
});
afterAll(async () => {
  child?.kill('SIGKILL');
  await db?.destroy();
  await mail.close();
  await pg?.drop();
  rmSync(dir, { recursive: true, force: true });
});

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/** The server as a process of its own (run from the sources), on this test's database and mail capture. */
async function startServer(port: number, mailWorker: 'on' | 'off'): Promise<ChildProcess> {
  const env: Record<string, string> = {
    PATH: process.env.PATH ?? '',
    NODE_ENV: 'test',
    PORT: String(port),
    HOST: '127.0.0.1',
    DATA_DIR: dir,
    SEED_DEMO: 'never',
    SMTP_URL: `smtp://127.0.0.1:${mail.port}`,
    MAIL_WORKER: mailWorker,
    SESSION_SECRET: 'a-crash-test-session-secret-of-forty-chars',
    LOGIN_RATE_LIMIT: '1000',
    ...(pg ? { DATABASE_URL: pg.url } : {}),
  };
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: ROOT, env, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  proc.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  // Started from the sources on an empty database, so it compiles and migrates first: slow on a busy machine.
  const deadline = Date.now() + 150_000;
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`the server stopped at start: ${stderr}`);
    const res = await fetch(`http://127.0.0.1:${port}/api/health`).catch(() => null);
    if (res?.ok) return proc;
    if (Date.now() > deadline) throw new Error(`the server did not answer within 150 s: ${stderr}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

function killHard(proc: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    proc.once('exit', () => resolve());
    proc.kill('SIGKILL');
  });
}

describe('mail across a crash', () => {
  it('sends every committed e-mail exactly once after the server is killed before sending and started again', async () => {
    const port = await freePort();
    child = await startServer(port, 'off');
    db = createDb(pg ? pg.url : join(dir, 'ridgeload.sqlite'));
    const owner = await makeOrgWithUser(db, 'contractor', 'contractor_owner');
    const url = `http://127.0.0.1:${port}`;
    // A browser's cookie and CSRF token, by hand over plain fetch.
    let cookie = '';
    const call = async (method: string, path: string, body?: unknown, token?: string) => {
      const res = await fetch(`${url}${path}`, {
        method,
        headers: { cookie, ...(token ? { 'x-csrf-token': token } : {}), ...(body ? { 'content-type': 'application/json' } : {}) },
        body: body ? JSON.stringify(body) : undefined,
      });
      const set = res.headers
        .getSetCookie()
        .map((c) => c.split(';')[0])
        .join('; ');
      if (set) cookie = set;
      return { status: res.status, body: (await res.json().catch(() => null)) as Record<string, unknown> | null };
    };
    const token = async () => (await call('GET', '/api/auth/csrf')).body!.token as string;
    expect((await call('POST', '/api/auth/login', { email: owner.email, password: TEST_PASSWORD }, await token())).status).toBe(200);
    const csrf = await token();

    // A burst of invitations, each committed with its e-mail before it is answered.
    const addresses = Array.from({ length: BURST }, (_, i) => `crash.${i}@outbox.test`);
    const answers = await Promise.all(addresses.map((email) => call('POST', '/api/invitations', { email, role: 'contractor_estimator' }, csrf)));
    expect(answers.map((a) => a.status)).toEqual(addresses.map(() => 201));
    await killHard(child);
    child = undefined;

    // Nothing was sent; everything committed is waiting.
    expect(mail.messages).toHaveLength(0);
    const queued = (await db('mail_outbox').whereIn('recipient', addresses).select('message_id', 'status')) as { message_id: string; status: string }[];
    expect(queued).toHaveLength(BURST);
    expect(queued.every((r) => r.status === 'queued')).toBe(true);
    // A row caught between the mail server's accept and being marked sent (the worst moment to die):
    // claimed by the dead process long ago, and already delivered once.
    const caught = queued[0]!.message_id;
    await db('mail_outbox')
      .where({ message_id: caught })
      .update({ status: 'sending', claimed_by: 'the-dead-server', claimed_at: new Date(Date.now() - 10 * 60_000).toISOString(), attempts: 1 });
    const [caughtRow] = await db('mail_outbox').where({ message_id: caught }).select('recipient', 'subject', 'text', 'html');
    await mail.mailer.send({ to: caughtRow.recipient, subject: caughtRow.subject, text: caughtRow.text, html: caughtRow.html, messageId: caught });

    child = await startServer(port, 'on');
    const deadline = Date.now() + 30_000;
    while ((await db('mail_outbox').whereIn('recipient', addresses).whereNot({ status: 'sent' }).count({ n: '*' }).first())!.n !== 0) {
      if (Date.now() > deadline) throw new Error('the restarted server did not send the outbox within 30 s');
      await new Promise((r) => setTimeout(r, 100));
    }
    // Give a second sending of anything the chance to arrive before counting.
    await new Promise((r) => setTimeout(r, 500));
    const byId = new Map<string, number>();
    for (const m of mail.messages) byId.set(m.messageId, (byId.get(m.messageId) ?? 0) + 1);
    // Every committed e-mail arrived; each Message-ID once, except the one caught mid-send, which
    // arrived twice with one Message-ID (a receiving server keeps one of them).
    expect([...byId.keys()].sort()).toEqual(queued.map((r) => r.message_id).sort());
    expect([...byId.entries()].filter(([, n]) => n !== 1)).toEqual([[caught, 2]]);
    expect(new Set(mail.messages.map((m) => m.to)).size).toBe(BURST);
  }, 420_000);
});
