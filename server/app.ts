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
import { BUSY_RETRY_AFTER_S, HttpError } from './errors.js';
import { unavailableError } from './db.js';
import { setSolveThreads } from './services/matches/solve-pool.js';
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
  // One pool of solve threads per process; the configuration sizes it.
  setSolveThreads(config.solveThreads);
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

/** Longest detail value (as JSON) an error answer repeats; longer or unprintable ones are summarised. */
const MAX_DETAIL_VALUE_CHARS = 1000;

/**
 * A detail's value as the answer may repeat it: as given when short, else the start of its JSON with
 * its length, or a note when it cannot be written at all (nested too deep for JSON.stringify).
 */
function boundedValue(value: unknown): unknown {
  if (value === null || typeof value !== 'object') {
    return typeof value === 'string' && value.length > MAX_DETAIL_VALUE_CHARS ? `${value.slice(0, 200)}… (${value.length} characters)` : value;
  }
  let text: string | undefined;
  try {
    text = JSON.stringify(value);
  } catch {
    return '(a value nested too deeply to repeat)';
  }
  if (text === undefined || text.length <= MAX_DETAIL_VALUE_CHARS) return value;
  return `${text.slice(0, 200)}… (${text.length} characters of JSON)`;
}

/** A body-parser failure as our error, or null when `err` is not one (http-errors with `expose`). */
function bodyReadError(err: { type?: string; status?: number; expose?: boolean; message?: string }): HttpError | null {
  if (err?.type === 'entity.parse.failed') return new HttpError(400, 'invalid_json', 'The request body is not valid JSON.');
  if (err?.type === 'entity.too.large') return new HttpError(413, 'too_large', 'The request body is larger than 1 MB.');
  if (err?.type === 'charset.unsupported') {
    return new HttpError(415, 'unsupported_charset', `The request body's ${err.message ?? 'charset'} is not accepted: send JSON in UTF-8.`);
  }
  if (err?.type === 'encoding.unsupported') {
    return new HttpError(415, 'unsupported_encoding', `The request body's ${err.message ?? 'content encoding'} is not accepted: send it plain, or as gzip, deflate or br.`);
  }
  if (err?.expose === true && typeof err.status === 'number' && err.status >= 400 && err.status < 500) {
    return new HttpError(err.status, 'invalid_body', `The request body could not be read (${err.message ?? 'unreadable'}); nothing was changed.`);
  }
  return null;
}

/** The one error middleware: our errors as they are, a database outage or a full pool as 503, the rest as 500. */
function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    // A client that hung up mid-request (an upload dropped half-way) has no one to answer. (Not
    // `req.destroyed`: a request whose body was read to the end is destroyed too.)
    if (!req.socket || req.socket.destroyed) {
      logger.info({ url: req.originalUrl, reason: err?.message }, 'client went away before the answer');
      if (!res.writableEnded) res.end();
      return;
    }
    let httpError: HttpError;
    const unavailable = err instanceof HttpError ? null : unavailableError(err);
    if (err instanceof HttpError) httpError = err;
    else if (unavailable) httpError = unavailable;
    else {
      const bodyError = bodyReadError(err);
      if (bodyError) httpError = bodyError;
      else {
        logger.error({ err, url: req.originalUrl }, 'unhandled error');
        httpError = new HttpError(500, 'internal_error', 'Something went wrong on the server; it has been logged.');
      }
    }
    if (httpError.code === 'database_unavailable') logger.warn({ url: req.originalUrl }, 'database unavailable');
    if (httpError.code === 'server_busy') logger.warn({ url: req.originalUrl }, 'no database connection came free in time');
    if (res.headersSent) return;
    if (httpError.code === 'server_busy') res.set('Retry-After', String(BUSY_RETRY_AFTER_S));
    const details = httpError.details?.map((d) => ('value' in d ? { ...d, value: boundedValue(d.value) } : d));
    res.status(httpError.status).json({
      error: { code: httpError.code, message: httpError.message, ...(details ? { details } : {}) },
    });
  };
}
