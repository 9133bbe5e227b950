/** Organisation settings: `GET /api/settings` (any role), `PUT /api/settings` (admin, audited). */
import { Router } from 'express';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { parseRequest } from '../../validation.js';
import { readSettings } from '../../services/settings/read-settings.js';
import { updateSettings } from '../../services/settings/update-settings.js';
import { settingsUpdateSchema } from './settings-request.js';

/** The settings routes. */
export function settingsRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);

  router.get('/', async (_req, res) => {
    res.json(await readSettings());
  });

  router.put('/', requireRole('admin'), async (req, res) => {
    const change = parseRequest(settingsUpdateSchema, req.body, 'settings change');
    res.json(await updateSettings(ctx.sequelize, req.currentUser!.id, change));
  });
  return router;
}
