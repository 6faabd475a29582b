import { createApp } from './app';
import { ConfigError, loadConfig } from './config/env';
import { createLogger } from './logger';
import { createDb, migrateLatest } from './db/knex';
import { seedDemoIfEmpty } from './db/seed-runner';
import { startDevSmtp } from './mail/dev-smtp';
import { createAppMailWorker } from './mail-worker';
import { createSmtpMailer } from './mail/mailer';
import { PAYMENT_WEBHOOK_PATH, startDevPayments } from './payments/dev-payments';
import type { StripeFake } from './payments/stripe-fake';
import { exitOnSignal, runMain } from './process-main';

async function main() {
  let config = loadConfig();
  const logger = createLogger(config.logLevel);
  const db = createDb(config.database);
  await migrateLatest(db);
  if (config.seedDemo === 'auto' && (await seedDemoIfEmpty(db))) logger.info('seeded the demo data');

  let smtpUrl = config.smtpUrl;
  let devSmtp: Awaited<ReturnType<typeof startDevSmtp>> | undefined;
  if (!smtpUrl) {
    if (config.isProduction) throw new ConfigError('SMTP_URL is required in production');
    devSmtp = await startDevSmtp(db, config.devSmtpPort);
    smtpUrl = `smtp://127.0.0.1:${devSmtp.port}`;
  }
  const mailer = createSmtpMailer(smtpUrl, config.mailFrom);

  // Card payments: the real service in production; otherwise the local fake, unless a key is given.
  let payments: StripeFake | undefined;
  if (config.isProduction) {
    if (!config.stripe.secretKey || !config.stripe.webhookSecret) throw new ConfigError('STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET are required in production');
    if (config.stripe.apiBase) throw new ConfigError('STRIPE_API_BASE points the payment SDK at a local fake: leave it unset in production');
  } else if (!config.stripe.secretKey) {
    const dev = await startDevPayments(config);
    payments = dev.fake;
    config = dev.config;
  }

  const app = createApp({ config, db, mailer, logger });
  // Mail goes out through the outbox; MAIL_WORKER=off leaves the sending to `npm run worker`.
  const worker = config.mailWorker ? createAppMailWorker({ config, db, mailer, logger }) : undefined;
  worker?.start();
  const server = app.listen(config.port, config.host, () => {
    const url = `http://localhost:${config.port}`;
    logger.info(`Ridgeload is running at ${url}`);
    if (devSmtp) logger.info(`mail is captured by the local fake; read it at ${url}/outbox`);
    if (payments) {
      payments.setWebhookUrl(`http://127.0.0.1:${config.port}${PAYMENT_WEBHOOK_PATH}`);
      logger.info(`card payments go to the local payment fake at ${payments.url} (test card 4242 4242 4242 4242)`);
    }
    console.log(`\n  Ridgeload: ${url}\n  Demo sign-in: contractor@demo.test / ridgeload-demo (see README)\n`);
  });

  exitOnSignal(async () => {
    server.close();
    await worker?.stop();
    mailer.close();
    await devSmtp?.close();
    await payments?.close();
    await db.destroy();
  });
}

runMain(main);
