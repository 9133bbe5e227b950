/**
 * Matches (api.md "Matches"): `POST /api/matches/solve` (any role, saves nothing), `POST /api/matches`
 * (designer or admin), `GET /api/matches` and `GET /api/matches/:id` (any role); beside api.md,
 * `DELETE /api/matches/:id` (the designer who saved it, or an admin) -> 204.
 */
import { Router } from 'express';
import type { SolveRequest } from '../../../shared/api/matches.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { badRequest } from '../../errors.js';
import { parseRequest } from '../../validation.js';
import { listMatches, readMatch } from '../../services/matches/read-matches.js';
import { saveMatch } from '../../services/matches/save-match.js';
import { deleteMatch } from '../../services/matches/delete-match.js';
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
    res.json(await listMatches(query.page, query.pageSize, query.search));
  });

  router.post('/', requireRole('designer', 'admin'), async (req, res) => {
    const body = parseRequest(saveMatchSchema, req.body, 'saved match');
    // The request as sent (zod's copy of a record drops keys such as `__proto__`, which the
    // engine's reader refuses by name, as the solve route does).
    const sent = (req.body as { request: unknown }).request;
    res.status(201).json(await saveMatch(ctx.sequelize, req.currentUser!.id, { ...body, request: sent as SolveRequest }));
  });

  router.get('/:id', async (req, res) => {
    res.json(await readMatch(ctx.sequelize, matchId(String(req.params.id))));
  });

  router.delete('/:id', requireRole('designer', 'admin'), async (req, res) => {
    await deleteMatch(ctx.sequelize, req.currentUser!, matchId(String(req.params.id)));
    res.status(204).end();
  });
  return router;
}

/** A match id from the path. @throws 400 unless it is a positive whole number */
function matchId(text: string): number {
  const id = Number(text);
  if (!Number.isInteger(id) || id <= 0) throw badRequest(`A match id must be a positive whole number, got "${text}".`, [{ field: 'id', value: text, message: 'not a positive whole number' }]);
  return id;
}
