import { mkdtempSync, rmSync } from 'node:fs';
import { AsyncLocalStorage } from 'node:async_hooks';
import type { IncomingMessage, Server, ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config/env';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';
import { createAppMailWorker } from '../../server/mail-worker';
import { outboxSignal } from '../../server/mail/outbox';
import type { MailWorker } from '../../server/mail/outbox-worker';
import { PAYMENT_WEBHOOK_PATH, startDevPayments } from '../../server/payments/dev-payments';
import type { StripeFake } from '../../server/payments/stripe-fake';
import { copySqliteTemplate } from './db-template';
import { startMailCapture } from './mail-capture';
import { createTestPgDatabase } from './pg-database';

export interface TestApp {
  app: Express;
  db: Db;
  config: Config;
  mail: Awaited<ReturnType<typeof startMailCapture>>;
  /** The local card-payment fake this app's SDK talks to; its events reach the app over loopback. */
  payments: StripeFake;
  /** Where the app listens on loopback, for the payment fake's webhooks and redirects. */
  url: string;
  /** The app's mail outbox worker (started unless MAIL_WORKER=off). */
  mailWorker: MailWorker;
  /** Sends every e-mail already committed to the outbox and resolves when none is left due. */
  drainOutbox: () => Promise<void>;
  close: () => Promise<void>;
}

const TEST_SESSION_SECRET = 'a-test-session-secret-of-forty-characters!';

/**
 * A fresh app on its own migrated database with mail captured in-process: a SQLite file in a temp
 * folder, or (in the PostgreSQL pass of the suite, TEST_DB=postgres) a new database in the
 * throw-away cluster. Either is a copy of the run's migrated template (tests/setup/sqlite-global.ts,
 * pg-global.ts) where the project made one; migrateLatest then finds nothing to run.
 */
export async function createTestApp(env: Record<string, string> = {}, options: { sameDatabaseAs?: TestApp } = {}): Promise<TestApp> {
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-test-'));
  const other = options.sameDatabaseAs;
  const pgDb = !other && process.env.TEST_DB === 'postgres' ? await createTestPgDatabase({ migrated: true }) : undefined;
  const dbEnv: Record<string, string> = other
    ? { ...(other.config.databaseUrl ? { DATABASE_URL: other.config.databaseUrl } : {}), SESSION_SECRET: other.config.sessionSecret }
    : pgDb
      ? { DATABASE_URL: pgDb.url, SESSION_SECRET: TEST_SESSION_SECRET }
      : { SESSION_SECRET: TEST_SESSION_SECRET };
  const dev = await startDevPayments(loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, ...dbEnv, ...env }), 0);
  const config = dev.config;
  // A second server on the same database: the other app's SQLite file, or its PostgreSQL database.
  if (other && !other.config.databaseUrl) Object.assign(config, { databaseFile: other.config.databaseFile, database: other.config.databaseFile });
  if (!other && !pgDb) copySqliteTemplate(config.databaseFile);
  const db = createDb(config.database);
  if (!other) await migrateLatest(db);
  // Servers on one database share one mail server, as they would in production: any of them may send a message.
  const mail = other ? other.mail : await startMailCapture();
  const deps = { config, db, mailer: mail.mailer, logger: pino({ level: process.env.TEST_LOG ?? 'silent' }) };
  const app = createApp(deps);
  const mailWorker = createAppMailWorker(deps);
  if (config.mailWorker) {
    mailWorker.start();
    answerAfterMailIsSent(app, mailWorker);
  }
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  config.appUrl = url;
  dev.fake.setWebhookUrl(`${url}${PAYMENT_WEBHOOK_PATH}`);
  return {
    app,
    db,
    config,
    mail,
    payments: dev.fake,
    url,
    mailWorker,
    drainOutbox: () => mailWorker.drain(),
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await mailWorker.stop();
      await dev.fake.close();
      if (!other) await mail.close();
      await db.destroy();
      await pgDb?.drop();
      // A second server leaves the database to the first.
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

const requestMail = new AsyncLocalStorage<{ committed: boolean }>();
outboxSignal.on('committed', () => {
  const store = requestMail.getStore();
  if (store) store.committed = true;
});

/**
 * Tests read a request's e-mails as soon as it answers: a request that committed mail to the outbox
 * answers once the worker has sent it (the server itself answers at once and sends after). Mail
 * written after the answer (the reset request's, on a later turn) is not waited for, so the answer's
 * timing still tells nothing.
 */
function answerAfterMailIsSent(app: Express, worker: MailWorker) {
  const inner = app as unknown as { handle: (req: IncomingMessage, res: ServerResponse, next?: unknown) => void };
  const handle = inner.handle.bind(app);
  Object.assign(app, {
    handle(req: IncomingMessage, res: ServerResponse, next?: unknown) {
      const store = { committed: false };
      const end = res.end.bind(res) as (...args: unknown[]) => ServerResponse;
      res.end = ((...args: unknown[]) => {
        if (!store.committed) return end(...args);
        store.committed = false;
        void worker
          .drain()
          .catch(() => {})
          .finally(() => end(...args));
        return res;
      }) as ServerResponse['end'];
      requestMail.run(store, () => handle(req, res, next));
    },
  });
}

/** A supertest agent that keeps cookies and sends the CSRF token on every state-changing call. */
/**
 * Two servers on one database (two app objects with nothing in memory in common, as two instances behind a
 * balancer), started before a file's tests with the same settings, handed to `take`, and closed after them.
 */
export function twoServersOnOneDatabase(env: Record<string, string>, take: (a: TestApp, b: TestApp) => void): void {
  let a: TestApp | undefined;
  let b: TestApp | undefined;
  beforeAll(async () => {
    a = await createTestApp(env);
    b = await createTestApp(env, { sameDatabaseAs: a });
    take(a, b);
  });
  afterAll(async () => {
    await b?.close();
    await a?.close();
  });
}

export class Client {
  readonly agent: ReturnType<typeof request.agent>;
  private token?: string;

  constructor(app: Express) {
    this.agent = request.agent(app);
  }

  async csrf(): Promise<string> {
    const res = await this.agent.get('/api/auth/csrf').expect(200);
    this.token = res.body.token as string;
    return this.token;
  }

  get(path: string) {
    return this.agent.get(path);
  }

  async send(method: 'post' | 'patch' | 'put' | 'delete', path: string, body?: unknown) {
    const token = this.token ?? (await this.csrf());
    const req = this.agent[method](path).set('X-CSRF-Token', token);
    return body === undefined ? req : req.send(body as object);
  }

  post = (path: string, body?: unknown) => this.send('post', path, body);
  patch = (path: string, body?: unknown) => this.send('patch', path, body);
  delete = (path: string) => this.send('delete', path);

  /** Signs in and refreshes the token, since the session id changes at sign-in. */
  async login(email: string, password: string) {
    const res = await this.post('/api/auth/login', { email, password });
    if (res.status === 200) await this.csrf();
    return res;
  }
}
