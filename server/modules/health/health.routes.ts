import type { Db } from '../../db/knex';
import { AppError } from '../../http/app-error';
import { apiRouter } from '../../http/endpoint';

export function healthRoutes(db: Db) {
  const r = apiRouter();
  r.get('/health', { access: { public: 'liveness probe' } }, async (_req, res) => {
    try {
      await db.raw('select 1');
    } catch {
      throw new AppError(503, 'database_unreachable', 'The database cannot be reached');
    }
    res.json({ ok: true });
  });
  return r.router;
}
