import { startPgCluster } from './pg-cluster';

/**
 * `npm run db:pg`: a throw-away PostgreSQL cluster for trying the app on PostgreSQL, stopped and
 * removed on Ctrl-C. Start the app against it with the DATABASE_URL it prints.
 */
const cluster = await startPgCluster();
const url = cluster.adminUrl;
console.log(`PostgreSQL is running on 127.0.0.1:${cluster.port} (thrown away on Ctrl-C).

  DATABASE_URL=${url} SESSION_SECRET=$(openssl rand -hex 32) npm start
`);
const stop = () => {
  cluster.stop();
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
setInterval(() => {}, 1 << 30);
