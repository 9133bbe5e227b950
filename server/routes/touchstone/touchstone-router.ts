/** `GET /api/matches/:id/touchstone?network=fit|ideal`: a saved match as a Touchstone 2-port file. */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { badRequest, notFound } from '../../errors.js';
import { Match } from '../../models/index.js';
import { matchTouchstone } from '../../services/matches/export-touchstone.js';

/** The Touchstone download; any signed-in role (everyone may read matches). */
export function touchstoneRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/:id/touchstone', ctx.requireSignIn, async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id <= 0) throw badRequest(`Match id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', message: 'not a positive whole number' }]);
    const network = req.query.network ?? 'fit';
    if (network !== 'fit' && network !== 'ideal') throw badRequest('network must be "fit" or "ideal".', [{ field: 'network', value: network, message: 'use fit or ideal' }]);
    const match = await Match.findByPk(id);
    if (!match) throw notFound(`Match ${id}`);
    const { fileName, text } = matchTouchstone(match, network);
    res.setHeader('Content-Type', 'text/plain; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(text);
  });
  return router;
}
