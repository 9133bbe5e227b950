/** `GET /api/health`: no sign-in; 503 while the database is unreachable, or reachable but every connection is in use (`busy`). */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { probeDatabase } from '../../db.js';
import { BUSY_RETRY_AFTER_S, databaseUnavailable, serverBusy } from '../../errors.js';

/** The health route. */
export function healthRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const database = await probeDatabase(ctx.sequelize);
    if (database === 'up') {
      res.json({ status: 'ok', database });
      return;
    }
    const err = database === 'busy' ? serverBusy() : databaseUnavailable();
    if (database === 'busy') res.set('Retry-After', String(BUSY_RETRY_AFTER_S));
    res.status(503).json({ status: database === 'busy' ? 'busy' : 'degraded', database, error: { code: err.code, message: err.message } });
  });
  return router;
}
