import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pino from 'pino';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config/env';
import { createDb, migrateLatest, type Db } from '../../server/db/knex';
import { runSeeds } from '../../server/db/seed-runner';
import { startDevSmtp } from '../../server/mail/dev-smtp';
import { createSmtpMailer } from '../../server/mail/mailer';
import { createAppMailWorker } from '../../server/mail-worker';
import { PAYMENT_WEBHOOK_PATH, startDevPayments } from '../../server/payments/dev-payments';
import { copySqliteTemplate } from './db-template';

export interface E2eServer {
  url: string;
  /** The local payment fake's address (its hosted card page lives there). */
  paymentsUrl: string;
  db: Db;
  close: () => Promise<void>;
}

/**
 * The real product as `npm start` runs it: built client, migrated and seeded database, the local
 * mail fake, on a free port of loopback. The database is a copy of the run's seeded template
 * (tests/setup/e2e-global.ts) where there is one, so the demo is seeded once per run, not per journey.
 */
export async function startE2eServer(): Promise<E2eServer> {
  if (!existsSync(new URL('../../dist/client/index.html', import.meta.url))) {
    throw new Error('The client is not built: run `npm run build` first (npm test does it).');
  }
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-e2e-'));
  const payments = await startDevPayments(loadConfig({ NODE_ENV: 'test', DATA_DIR: dir, LOGIN_RATE_LIMIT: '100', RESET_RATE_LIMIT: '100' }), 0);
  const config = payments.config;
  const copied = copySqliteTemplate(config.databaseFile);
  const db = createDb(config.database);
  await migrateLatest(db);
  if (!copied) await runSeeds(db);
  const smtp = await startDevSmtp(db, 0);
  const mailer = createSmtpMailer(`smtp://127.0.0.1:${smtp.port}`, config.mailFrom);
  const deps = { config, db, mailer, logger: pino({ level: 'silent' }) };
  const app = createApp(deps);
  const mailWorker = createAppMailWorker(deps);
  mailWorker.start();
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://127.0.0.1:${port}`;
  config.appUrl = url; // links in e-mails and payment return addresses point at this server
  payments.fake.setWebhookUrl(`${url}${PAYMENT_WEBHOOK_PATH}`);
  return {
    url,
    paymentsUrl: payments.fake.url,
    db,
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections?.();
      await mailWorker.stop();
      mailer.close();
      await smtp.close();
      await payments.fake.close();
      await db.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
