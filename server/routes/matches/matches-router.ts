/**
 * Matches (api.md "Matches"): `POST /api/matches/solve` (any role, saves nothing), `POST /api/matches`
 * (designer or admin), `GET /api/matches` and `GET /api/matches/:id` (any role).
 */
import { Router } from 'express';
import type { SolveRequest } from '../../../shared/api/matches.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { badRequest } from '../../errors.js';
import { parseRequest } from '../../validation.js';
import { listMatches, readMatch } from '../../services/matches/read-matches.js';
import { saveMatch } from '../../services/matches/save-match.js';
import { solveMatch } from '../../services/matches/solve-match.js';
import { listMatchesSchema, saveMatchSchema } from './matches-request.js';

/** The match routes. */
export function matchesRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);

  router.post('/solve', async (req, res) => {
    // A caller that goes away (the page asked again, or was closed) needs no answer: its solve
    // leaves the queue, or stops, and frees the thread for the others.
    const gone = new AbortController();
    res.on('close', () => {
      if (!res.writableFinished) gone.abort();
    });
    try {
      const solved = await solveMatch(ctx.sequelize, req.body, undefined, gone.signal);
      res.json(solved.response);
    } catch (error) {
      if (gone.signal.aborted) return;
      throw error;
    }
  });

  router.get('/', async (req, res) => {
    const query = parseRequest(listMatchesSchema, req.query, 'match list query');
    res.json(await listMatches(query.page, query.pageSize));
  });

  router.post('/', requireRole('designer', 'admin'), async (req, res) => {
    const body = parseRequest(saveMatchSchema, req.body, 'saved match');
    // The request as sent (zod's copy of a record drops keys such as `__proto__`, which the
    // engine's reader refuses by name, as the solve route does).
    const sent = (req.body as { request: unknown }).request;
    res.status(201).json(await saveMatch(ctx.sequelize, req.currentUser!.id, { ...body, request: sent as SolveRequest }));
  });

  router.get('/:id', async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id <= 0) throw badRequest(`A match id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', value: req.params.id, message: 'not a positive whole number' }]);
    res.json(await readMatch(ctx.sequelize, id));
  });
  return router;
}
