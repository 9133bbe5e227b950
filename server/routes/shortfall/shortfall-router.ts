/** Purchasing's overview (extension of api.md): `GET /api/shortfall` lists every build's shortfall list. Every signed-in role reads. */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { parseRequest } from '../../validation.js';
import { listShortfallLists } from '../../services/shortfall/read-shortfall-list.js';
import { shortfallListQuerySchema } from '../builds/builds-request.js';

/** The shortfall overview route. */
export function shortfallRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);
  router.get('/', async (req, res) => {
    res.json(await listShortfallLists(ctx.sequelize, parseRequest(shortfallListQuerySchema, req.query, 'query')));
  });
  return router;
}
