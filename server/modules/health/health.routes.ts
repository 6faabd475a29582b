import type { Db } from '../../db/knex';
import { AppError } from '../../http/app-error';
import { apiRouter } from '../../http/endpoint';
import { outboxHealth } from '../../mail/outbox';

export function healthRoutes(db: Db) {
  const r = apiRouter();
  r.get('/health', { access: { public: 'liveness probe' } }, async (_req, res) => {
    let mail;
    try {
      await db.raw('select 1');
      // How far the mail outbox is behind: a growing depth or age means no worker is sending.
      mail = await outboxHealth(db);
    } catch {
      throw new AppError(503, 'database_unreachable', 'The database cannot be reached');
    }
    res.json({ ok: true, mail });
  });
  return r.router;
}
