/**
 * `GET /api/health`: no sign-in; 503 while the database is unreachable, or reachable but every
 * connection is in use (`busy`). Beside api.md's `{status, database}` it gives `solves`: the threads
 * each solve lane may run and the solves running and queued in each, so an operator can tell a
 * server that is slow because its solve queues are long from one whose database is slow.
 */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { probeDatabase } from '../../db.js';
import { BUSY_RETRY_AFTER_S, databaseUnavailable, serverBusy } from '../../errors.js';
import { solveLoad } from '../../services/matches/solve-pool.js';

/** The health route. */
export function healthRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const database = await probeDatabase(ctx.sequelize);
    if (database === 'up') {
      res.json({ status: 'ok', database, solves: solveLoad() });
      return;
    }
    const err = database === 'busy' ? serverBusy() : databaseUnavailable();
    if (database === 'busy') res.set('Retry-After', String(BUSY_RETRY_AFTER_S));
    res.status(503).json({ status: database === 'busy' ? 'busy' : 'degraded', database, solves: solveLoad(), error: { code: err.code, message: err.message } });
  });
  return router;
}
