/**
 * Account links by e-mail: `POST /api/users/:id/invitation` and `POST /api/users/:id/password-reset`
 * (admin only) send a single-use set-password link; `POST /api/auth/set-password/check` and
 * `POST /api/auth/set-password` (no sign-in: the token is the credential) read and use it.
 */
import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { MIN_PASSWORD_LENGTH, type AccountLinkPurpose } from '../../../shared/api/account-links.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { parseRequest } from '../../validation.js';
import { badRequest } from '../../errors.js';
import { sendAccountLink } from '../../services/mail/send-account-link.js';
import { checkUserToken, setPasswordWithToken } from '../../services/users/user-tokens.js';

const tokenField = z.string({ message: 'token is required' }).trim().min(1, 'token is required').max(200, 'token is too long');
const checkSchema = z.object({ token: tokenField }).strict();
const setPasswordSchema = z
  .object({
    token: tokenField,
    password: z
      .string({ message: 'password is required' })
      .min(MIN_PASSWORD_LENGTH, `a password needs at least ${MIN_PASSWORD_LENGTH} characters`)
      .max(1024, 'a password may have at most 1024 characters'),
  })
  .strict();
const noBody = z.object({}).strict();

/** The positive whole-number `:id` of the route, or a 400 saying what was given. */
function userIdOf(req: Request): number {
  const id = Number(req.params.id);
  if (!Number.isInteger(id) || id <= 0) {
    throw badRequest(`User id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', message: 'not a positive whole number' }]);
  }
  return id;
}

/** The admin routes under `/api/users`; each checks sign-in and role itself, so other user routes are untouched. */
export function invitationsRouter(ctx: AppContext): Router {
  const router = Router();
  const send = (purpose: AccountLinkPurpose) => async (req: Request, res: Response) => {
    const id = userIdOf(req);
    parseRequest(noBody, req.body ?? {}, `${purpose} request`);
    res.status(201).json(await sendAccountLink(ctx.sequelize, ctx.config, req.currentUser!, id, purpose));
  };
  router.post('/:id/invitation', ctx.requireSignIn, requireRole('admin'), send('invitation'));
  router.post('/:id/password-reset', ctx.requireSignIn, requireRole('admin'), send('password-reset'));
  return router;
}

/** The public routes under `/api/auth` that the set-password page calls. */
export function setPasswordRouter(ctx: AppContext): Router {
  const router = Router();
  router.post('/set-password/check', async (req, res) => {
    const body = parseRequest(checkSchema, req.body, 'link check');
    res.json(await checkUserToken(body.token));
  });
  router.post('/set-password', async (req, res) => {
    const body = parseRequest(setPasswordSchema, req.body, 'new password');
    const user = await setPasswordWithToken(ctx.sequelize, body.token, body.password);
    res.json({ email: user.email });
  });
  return router;
}
