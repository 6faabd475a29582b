import type { Db } from '../../db/knex';
import { apiRouter } from '../../http/endpoint';

/** The development mail reader. Mounted only outside production. */
export function outboxRoutes(db: Db) {
  const r = apiRouter();
  r.get('/dev/outbox', { access: { public: 'development mail reader; not mounted in production' } }, async (_req, res) => {
    const messages = await db('dev_outbox')
      .select('id', 'from', 'to', 'subject', 'text', 'html', 'created_at')
      .orderBy('id', 'desc')
      .limit(200);
    res.json({ messages });
  });
  return r.router;
}
