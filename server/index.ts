import pino from 'pino';
import { createApp } from './app';
import { ConfigError, loadConfig } from './config/env';
import { createDb, migrateLatest } from './db/knex';
import { seedDemoIfEmpty } from './db/seed-runner';
import { startDevSmtp } from './mail/dev-smtp';
import { createSmtpMailer } from './mail/mailer';

async function main() {
  const config = loadConfig();
  const logger = pino({ level: config.logLevel });
  const db = createDb(config.databaseFile);
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

  const app = createApp({ config, db, mailer, logger });
  const server = app.listen(config.port, config.host, () => {
    const url = `http://localhost:${config.port}`;
    logger.info(`Ridgeload is running at ${url}`);
    if (devSmtp) logger.info(`mail is captured by the local fake; read it at ${url}/outbox`);
    console.log(`\n  Ridgeload: ${url}\n  Demo sign-in: contractor@demo.test / ridgeload-demo (see README)\n`);
  });

  const stop = async () => {
    server.close();
    mailer.close();
    await devSmtp?.close();
    await db.destroy();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(err instanceof ConfigError ? err.message : err);
  process.exit(1);
});
