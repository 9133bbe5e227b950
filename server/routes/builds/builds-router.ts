/**
 * Builds and their shortfall lists (api.md "Builds and shortfall lists"). Every signed-in role reads;
 * designers and admins create, reserve and cancel builds; stores and admins mark them built;
 * purchasing and admins send a list and change its status; purchasing, stores and admins receive.
 */
import { Router } from 'express';
import type { Role } from '../../../shared/api/auth.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { badRequest, forbidden } from '../../errors.js';
import { parseRequest } from '../../validation.js';
import { cancelBuild } from '../../services/builds/cancel-build.js';
import { createBuild } from '../../services/builds/create-build.js';
import { markBuildBuilt } from '../../services/builds/mark-build-built.js';
import { listBuilds, readBuild } from '../../services/builds/read-builds.js';
import { readMatchPlans } from '../../services/builds/read-match-plans.js';
import { reservePlannedBuild } from '../../services/builds/reserve-build.js';
import { changeShortfallStatus } from '../../services/shortfall/change-shortfall-status.js';
import { readShortfallList } from '../../services/shortfall/read-shortfall-list.js';
import { receiveShortfall } from '../../services/shortfall/receive-shortfall.js';
import { sendShortfallList } from '../../services/shortfall/send-shortfall-list.js';
import { shortfallCsv, shortfallCsvFileName } from '../../services/shortfall/shortfall-csv.js';
import {
  buildListQuerySchema,
  buildStatusSchema,
  createBuildSchema,
  receiveShortfallSchema,
  sendShortfallSchema,
  shortfallStatusSchema,
} from './builds-request.js';

/** Roles that plan builds (create, reserve, cancel). */
export const PLANNING_ROLES: readonly Role[] = ['designer', 'admin'];
/** Roles that mark a build built (stores hand the parts out). */
export const BUILDING_ROLES: readonly Role[] = ['stores', 'admin'];
/** Roles that send shortfall lists and track their status. */
export const PURCHASING_ROLES: readonly Role[] = ['purchasing', 'admin'];
/** Roles that receive bought parts into stock. */
export const RECEIVING_ROLES: readonly Role[] = ['purchasing', 'stores', 'admin'];

function buildId(param: string | string[]): number {
  const raw = String(param);
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0 || id > 2_147_483_647) {
    throw badRequest(`Build id must be a positive whole number, got "${raw}".`, [{ field: 'id', message: 'not a positive whole number' }]);
  }
  return id;
}

/** The build routes. */
export function buildsRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);

  router.get('/', async (req, res) => {
    res.json(await listBuilds(ctx.sequelize, parseRequest(buildListQuerySchema, req.query, 'query')));
  });

  router.post('/', requireRole(...PLANNING_ROLES), async (req, res) => {
    const body = parseRequest(createBuildSchema, req.body, 'build');
    const plans = await readMatchPlans(body.matchIds);
    const id = await createBuild(ctx.sequelize, { name: body.name, quantity: body.quantity, reserve: body.reserve, plans }, req.currentUser!.id);
    res.status(201).json(await readBuild(id));
  });

  router.get('/:id', async (req, res) => {
    res.json(await readBuild(buildId(req.params.id)));
  });

  router.post('/:id/reserve', requireRole(...PLANNING_ROLES), async (req, res) => {
    const id = buildId(req.params.id);
    await reservePlannedBuild(ctx.sequelize, id, req.currentUser!.id);
    res.json(await readBuild(id));
  });

  router.patch('/:id', async (req, res) => {
    const id = buildId(req.params.id);
    const { status } = parseRequest(buildStatusSchema, req.body, 'status change');
    const role = req.currentUser!.role;
    const allowed = status === 'built' ? BUILDING_ROLES : PLANNING_ROLES;
    if (!allowed.includes(role)) throw forbidden(`Marking a build ${status} needs the ${allowed.join(' or ')} role; you are signed in as ${role}.`);
    if (status === 'built') await markBuildBuilt(ctx.sequelize, id, req.currentUser!.id);
    else await cancelBuild(ctx.sequelize, id, req.currentUser!.id);
    res.json(await readBuild(id));
  });

  router.get('/:id/shortfall.csv', async (req, res) => {
    const id = buildId(req.params.id);
    const { lines, list } = await readShortfallList(id);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${shortfallCsvFileName(id, list?.buildName ?? '')}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.send(shortfallCsv(lines));
  });

  router.get('/:id/shortfall', async (req, res) => {
    res.json(await readShortfallList(buildId(req.params.id)));
  });

  router.patch('/:id/shortfall', requireRole(...PURCHASING_ROLES), async (req, res) => {
    const id = buildId(req.params.id);
    const { status } = parseRequest(shortfallStatusSchema, req.body, 'status change');
    await changeShortfallStatus(ctx.sequelize, id, status, req.currentUser!.id);
    res.json(await readShortfallList(id));
  });

  router.post('/:id/shortfall/send', requireRole(...PURCHASING_ROLES), async (req, res) => {
    const id = buildId(req.params.id);
    const { to } = parseRequest(sendShortfallSchema, req.body, 'send request');
    res.json(await sendShortfallList(ctx.sequelize, ctx.config.smtp, id, to, req.currentUser!.id));
  });

  router.post('/:id/shortfall/receive', requireRole(...RECEIVING_ROLES), async (req, res) => {
    const id = buildId(req.params.id);
    const body = parseRequest(receiveShortfallSchema, req.body, 'receipt');
    res.json(await receiveShortfall(ctx.sequelize, id, body.lines, req.currentUser!.id));
  });
  return router;
}
