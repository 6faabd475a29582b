import type { Logger } from 'pino';
import type { Config } from './config/env';
import type { Db } from './db/knex';
import type { Mailer } from './mail/mailer';

/** What createApp needs from outside; tests pass their own database and mail capture. */
export interface AppDeps {
  config: Config;
  db: Db;
  mailer: Mailer;
  logger: Logger;
}
