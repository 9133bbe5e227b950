/** `GET /api/health`: no sign-in; 503 while the database is unreachable. */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { probeDatabase } from '../../db.js';
import { databaseUnavailable } from '../../errors.js';

/** The health route. */
export function healthRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const database = await probeDatabase(ctx.sequelize);
    if (database === 'up') {
      res.json({ status: 'ok', database });
      return;
    }
    const err = databaseUnavailable();
    res.status(503).json({ status: 'degraded', database, error: { code: err.code, message: err.message } });
  });
  return router;
}
