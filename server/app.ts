/**
 * The Express application. `createApp` never listens (tests drive it with supertest); main.ts does.
 */
import express, { type ErrorRequestHandler } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { Sequelize } from 'sequelize';
import type { Logger } from 'pino';
import type { ServerConfig } from './config.js';
import type { AppContext } from './app-context.js';
import { createPassport, requireSignIn } from './auth/passport.js';
import { HttpError, databaseUnavailable } from './errors.js';
import { isDatabaseUnavailable } from './db.js';
import { authRouter } from './routes/auth/auth-router.js';
import { usersRouter } from './routes/users/users-router.js';
import { healthRouter } from './routes/health/health-router.js';
import { stockRouter } from './routes/stock/stock-router.js';
import { partsRouter } from './routes/parts/parts-router.js';
import { invitationsRouter, setPasswordRouter } from './routes/invitations/invitations-router.js';
import { outboxRouter } from './routes/outbox/outbox-router.js';
import { buildsRouter } from './routes/builds/builds-router.js';
import { shortfallRouter } from './routes/shortfall/shortfall-router.js';
import { matchesRouter } from './routes/matches/matches-router.js';
import { touchstoneRouter } from './routes/touchstone/touchstone-router.js';
import { settingsRouter } from './routes/settings/settings-router.js';

/** Builds the app on an open (models initialised, migrated) `sequelize`. */
export function createApp(config: ServerConfig, sequelize: Sequelize, logger: Logger): express.Express {
  const passport = createPassport(config.jwtSecret);
  const ctx: AppContext = { config, sequelize, logger, requireSignIn: requireSignIn(passport) };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Material sets style attributes at run time; scripts stay same-origin only.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  // The set-password page's address carries a link token: keep it out of the request log.
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => req.url === '/api/health' || Boolean(req.url?.startsWith('/set-password')) } }));
  app.use('/api', express.json({ limit: '1mb' }));

  app.use('/api/health', healthRouter(ctx));
  app.use('/api/auth', setPasswordRouter(ctx));
  app.use('/api/auth', authRouter(ctx));
  app.use('/api/users', invitationsRouter(ctx));
  app.use('/api/users', usersRouter(ctx));
  app.use('/api/stock', stockRouter(ctx));
  app.use('/api/parts', partsRouter(ctx));
  app.use('/api/outbox', outboxRouter(ctx));
  app.use('/api/builds', buildsRouter(ctx));
  app.use('/api/shortfall', shortfallRouter(ctx));
  app.use('/api/matches', matchesRouter(ctx));
  app.use('/api/matches', touchstoneRouter(ctx));
  app.use('/api/settings', settingsRouter(ctx));

  app.use('/api', (req, _res, next) => next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.originalUrl}.`)));

  if (config.staticDir && existsSync(join(config.staticDir, 'index.html'))) {
    app.use(express.static(config.staticDir, { index: false, maxAge: '1h', setHeaders: noCacheForIndex }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(join(config.staticDir, 'index.html'));
    });
  }
  app.use((req, _res, next) => next(new HttpError(404, 'not_found', `Nothing at ${req.originalUrl}.`)));
  app.use(errorHandler(logger));
  return app;
}

function noCacheForIndex(res: express.Response, path: string): void {
  if (path.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
}

/** The one error middleware: our errors as they are, a database outage as 503, the rest as 500. */
function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let httpError: HttpError;
    if (err instanceof HttpError) httpError = err;
    else if (isDatabaseUnavailable(err)) httpError = databaseUnavailable();
    else if (err?.type === 'entity.parse.failed') httpError = new HttpError(400, 'invalid_json', 'The request body is not valid JSON.');
    else if (err?.type === 'entity.too.large') httpError = new HttpError(413, 'too_large', 'The request body is larger than 1 MB.');
    else {
      logger.error({ err, url: req.originalUrl }, 'unhandled error');
      httpError = new HttpError(500, 'internal_error', 'Something went wrong on the server; it has been logged.');
    }
    if (httpError.status === 503) logger.warn({ url: req.originalUrl }, 'database unavailable');
    if (res.headersSent) return;
    res.status(httpError.status).json({
      error: { code: httpError.code, message: httpError.message, ...(httpError.details ? { details: httpError.details } : {}) },
    });
  };
}
