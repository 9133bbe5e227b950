/**
 * The stock list (api.md "Stock"): `GET /api/parts` (paged, sorted, filtered), `GET /api/parts/locations`,
 * `GET /api/parts/export.csv` (the import schema) and `GET /api/parts/:id`. Every signed-in role reads.
 */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { badRequest } from '../../errors.js';
import { parseRequest } from '../../validation.js';
import { getPart, listPartLocations, listParts } from '../../services/stock/list-parts.js';
import { exportStockList } from '../../services/stock/export-stock-list.js';
import { exportQuerySchema, partListQuerySchema } from './parts-request.js';

/** The part routes. */
export function partsRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);

  router.get('/', async (req, res) => {
    const query = parseRequest(partListQuerySchema, req.query, 'query');
    res.json(await listParts(ctx.sequelize, query));
  });

  router.get('/locations', async (_req, res) => {
    res.json({ items: await listPartLocations(ctx.sequelize) });
  });

  router.get('/export.csv', async (req, res) => {
    const { location } = parseRequest(exportQuerySchema, req.query, 'query');
    const chunks = exportStockList(ctx.sequelize, location);
    // The first chunk comes before any header is sent, so a database failure still gets a JSON error.
    const first = await chunks.next();
    const day = new Date().toISOString().slice(0, 10);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="shelfmatch-stock-${location ? `${location.replace(/[^A-Za-z0-9_-]/g, '_')}-` : ''}${day}.csv"`);
    res.setHeader('Cache-Control', 'no-store');
    try {
      if (!first.done) res.write(first.value);
      for await (const chunk of chunks) {
        if (!res.write(chunk)) await new Promise((resolve) => res.once('drain', resolve));
      }
      res.end();
    } catch (error) {
      ctx.logger.error({ err: error }, 'stock export failed part-way');
      res.destroy(error instanceof Error ? error : undefined);
    }
  });

  router.get('/:id', async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id <= 0) throw badRequest(`Part id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', message: 'not a positive whole number' }]);
    res.json(await getPart(ctx.sequelize, id));
  });
  return router;
}
