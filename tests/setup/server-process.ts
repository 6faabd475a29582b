import type { AddressInfo } from 'node:net';
import pino from 'pino';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config/env';
import { createDb } from '../../server/db/knex';

/**
 * One more server process on an existing database, for tests of servers racing each other: the
 * environment names the database (DATA_DIR holding the SQLite file, or DATABASE_URL) and the shared
 * SESSION_SECRET. Prints {"url"} once listening; mail is dropped (another test checks it). Ends when
 * its standard input closes, so it never outlives the test that started it.
 */
const config = loadConfig({ ...process.env, NODE_ENV: 'test', LOGIN_RATE_LIMIT: '1000' });
const db = createDb(config.database);
const app = createApp({ config, db, mailer: { send: async () => {}, close: () => {} }, logger: pino({ level: process.env.TEST_LOG ?? 'silent' }) });
const server = app.listen(0, '127.0.0.1', () => {
  console.log(JSON.stringify({ url: `http://127.0.0.1:${(server.address() as AddressInfo).port}` }));
});
const stop = () => {
  server.close();
  server.closeAllConnections();
  void db.destroy().then(() => process.exit(0));
};
process.stdin.on('end', stop);
process.stdin.on('close', stop);
process.stdin.resume();
process.on('SIGTERM', stop);
