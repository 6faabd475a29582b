import { ConfigError, loadConfig } from './config/env';
import { createLogger } from './logger';
import { createDb } from './db/knex';
import { createAppMailWorker } from './mail-worker';
import { createSmtpMailer } from './mail/mailer';
import { exitOnSignal, runMain } from './process-main';

/**
 * `npm run worker`: sends the mail outbox apart from the web servers (start those with
 * MAIL_WORKER=off). Any number may run on one database; each claims its own rows. Without SMTP_URL
 * it sends to the local mail fake a development server keeps on DEV_SMTP_PORT.
 */
async function main() {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  if (!config.smtpUrl && config.isProduction) throw new ConfigError('SMTP_URL is required in production');
  const db = createDb(config.database);
  if (!(await db.schema.hasTable('mail_outbox'))) {
    await db.destroy();
    throw new ConfigError('The database has no mail outbox yet: start the server once, or run `npm run db:migrate`, then start the worker');
  }
  const mailer = createSmtpMailer(config.smtpUrl ?? `smtp://127.0.0.1:${config.devSmtpPort}`, config.mailFrom);
  const worker = createAppMailWorker({ config, db, mailer, logger });
  worker.start();
  logger.info({ worker: worker.id }, 'mail outbox worker started');
  // The process stays up on the poll; a signal lets the sends in flight finish first.
  const keepAlive = setInterval(() => {}, 60_000);
  exitOnSignal(async () => {
    clearInterval(keepAlive);
    await worker.stop();
    mailer.close();
    await db.destroy();
  });
}

runMain(main);
