import type { Db } from '../../db/knex';
import { apiRouter } from '../../http/endpoint';
import { loopbackOnly } from '../../http/loopback';

/**
 * The development mail reader. It holds live reset and invitation links, so it is mounted only
 * outside production and answers only requests whose socket comes from this machine.
 */
export function outboxRoutes(db: Db) {
  const r = apiRouter();
  r.get('/dev/outbox', { access: { public: 'development mail reader: not mounted in production, and answers loopback only' }, before: [loopbackOnly] }, async (_req, res) => {
    const messages = await db('dev_outbox').select('id', 'from', 'to', 'subject', 'text', 'html', 'created_at').orderBy('id', 'desc').limit(200);
    res.json({ messages });
  });
  return r.router;
}
