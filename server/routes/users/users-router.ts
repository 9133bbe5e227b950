/** Admin-only user management: `GET/POST /api/users`, `PATCH /api/users/:id`. */
import { Router } from 'express';
import { z } from 'zod';
import { ROLES, type Role } from '../../../shared/api/auth.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { parseRequest } from '../../validation.js';
import { createUser, listUsers, updateUser } from '../../services/users/manage-users.js';
import { badRequest } from '../../errors.js';

const role = z.enum(ROLES as [Role, ...Role[]], { message: `role must be one of ${ROLES.join(', ')}` });
const createSchema = z.object({
  email: z.email('e-mail must look like name@example.com').max(254),
  name: z.string().trim().min(1, 'name is required').max(120),
  role,
  // Optional: without one, the user sets their own from an invitation.
  password: z.string().min(10, 'a first password needs at least 10 characters').max(1024).optional(),
});
const updateSchema = z
  .object({ role: role.optional(), active: z.boolean().optional(), name: z.string().trim().min(1).max(120).optional() })
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'give at least one of role, active, name');

/** The user routes; every one needs the admin role. */
export function usersRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn, requireRole('admin'));

  router.get('/', async (_req, res) => {
    res.json({ items: await listUsers() });
  });

  router.post('/', async (req, res) => {
    const body = parseRequest(createSchema, req.body, 'new user');
    res.status(201).json(await createUser(ctx.sequelize, req.currentUser!.id, body));
  });

  router.patch('/:id', async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id <= 0) throw badRequest(`User id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', message: 'not a positive whole number' }]);
    const body = parseRequest(updateSchema, req.body, 'user change');
    res.json(await updateUser(ctx.sequelize, req.currentUser!.id, id, body));
  });
  return router;
}
