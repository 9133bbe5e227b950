/** `POST /api/auth/login` and `GET /api/auth/me` (handbook api.md, "Sign-in"). */
import { Router } from 'express';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { z } from 'zod';
import type { AppContext } from '../../app-context.js';
import { parseRequest } from '../../validation.js';
import { signIn } from '../../services/users/sign-in.js';
import { presentUser } from '../../services/users/present-user.js';
import { signToken } from '../../auth/tokens.js';
import { HttpError } from '../../errors.js';

const loginSchema = z.object({
  email: z.string().trim().min(1, 'e-mail is required').max(254),
  password: z.string().min(1, 'password is required').max(1024),
});

/** The sign-in routes. */
export function authRouter(ctx: AppContext): Router {
  const router = Router();
  const limiter = rateLimit({
    windowMs: ctx.config.loginWindowMs,
    limit: ctx.config.loginRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // One client address guessing one account is what we slow down.
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').trim().toLowerCase()}`,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'too_many_attempts', 'Too many sign-in attempts for this account from here; wait a few minutes and try again.')),
  });

  router.post('/login', limiter, async (req, res) => {
    const body = parseRequest(loginSchema, req.body, 'sign-in');
    const user = await signIn(body.email, body.password);
    res.json({ token: signToken(user.id, ctx.config.jwtSecret, ctx.config.tokenTtl), user: presentUser(user) });
  });

  router.get('/me', ctx.requireSignIn, (req, res) => {
    res.json(presentUser(req.currentUser!));
  });
  return router;
}
