/**
 * passport-jwt wired to our users table, and the middleware that demands a sign-in and a role.
 */
import { Passport } from 'passport';

type PassportInstance = InstanceType<typeof Passport>;
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import type { NextFunction, Request, Response, RequestHandler } from 'express';
import type { Role } from '../../shared/api/auth.js';
import { User } from '../models/index.js';
import { forbidden, unauthorized } from '../errors.js';
import { unavailableError } from '../db.js';

declare module 'express-serve-static-core' {
  interface Request {
    /** The signed-in user, set by `requireSignIn`. */
    currentUser?: User;
  }
}

/** A passport instance of our own (no globals), with the `jwt` strategy. */
export function createPassport(secret: string): PassportInstance {
  const passport = new Passport();
  passport.use(
    new JwtStrategy(
      { jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(), secretOrKey: secret, algorithms: ['HS256'] },
      (payload: { sub?: string }, done: (err: unknown, user?: User | false, info?: unknown) => void) => {
        const id = Number(payload.sub);
        if (!Number.isInteger(id)) return done(null, false, { message: 'Token has no user.' });
        User.findByPk(id).then(
          (user) => done(null, user && user.active ? user : false, { message: user ? 'This account is deactivated.' : 'No such user.' }),
          (err) => done(err),
        );
      },
    ),
  );
  return passport;
}

/** Express middleware: 401 without a valid token of an active user; sets `req.currentUser`. */
export function requireSignIn(passport: PassportInstance): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    passport.authenticate('jwt', { session: false }, (err: unknown, user: User | false, info: { name?: string; message?: string } | undefined) => {
      if (err) return next(unavailableError(err) ?? err);
      if (!user) {
        if (info?.name === 'TokenExpiredError') return next(unauthorized('Your sign-in has expired: sign in again.'));
        if (info?.message === 'This account is deactivated.') return next(unauthorized('This account is deactivated.'));
        return next(unauthorized());
      }
      req.currentUser = user;
      next();
    })(req, res, next);
  };
}

/** Express middleware after `requireSignIn`: 403 unless the user has one of `roles`. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const user = req.currentUser;
    if (!user) return next(unauthorized());
    if (!roles.includes(user.role)) {
      return next(forbidden(`This needs the ${roles.join(' or ')} role; you are signed in as ${user.role}.`));
    }
    next();
  };
}
