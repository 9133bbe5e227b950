/**
 * HTTP errors with a status and a stable snake_case code (handbook api.md). Handlers throw these;
 * the one error middleware in app.ts turns them into `{error: {code, message, details}}`.
 */
import type { ApiErrorDetail } from '../shared/api/errors.js';

/** An error a client caused or can act on; never logged as a server fault. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: ApiErrorDetail[],
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

/** 400: the request is malformed; `details` says where. */
export const badRequest = (message: string, details?: ApiErrorDetail[]) => new HttpError(400, 'invalid_input', message, details);
/** 401: no valid sign-in. */
export const unauthorized = (message = 'Sign in first: this needs a valid token.') => new HttpError(401, 'not_signed_in', message);
/** 403: signed in, but the role may not do this. */
export const forbidden = (message = 'Your role may not do this.') => new HttpError(403, 'forbidden', message);
/** 404: no such thing. */
export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} was not found.`);
/** 409: the request conflicts with the current state. */
export const conflict = (message: string, details?: ApiErrorDetail[]) => new HttpError(409, 'conflict', message, details);
/** 413: the body or file is larger than allowed. */
export const tooLarge = (message: string) => new HttpError(413, 'too_large', message);
/** 422: the content was understood but rows were rejected. */
export const unprocessable = (message: string, details?: ApiErrorDetail[]) => new HttpError(422, 'rejected', message, details);
/** 503: PostgreSQL cannot be reached. */
export const databaseUnavailable = () =>
  new HttpError(503, 'database_unavailable', 'The database is not reachable right now; nothing was changed. Try again shortly.');
/** Seconds a client is asked to wait (`Retry-After`) when the server is busy. */
export const BUSY_RETRY_AFTER_S = 5;
/**
 * 503: the database is up but no connection came free in time: every connection is in use, or the
 * server was too busy computing to hand one out. Not an outage, so said apart from one.
 */
export const serverBusy = () =>
  new HttpError(503, 'server_busy', `The server is busy: no database connection came free in time. Nothing was changed; try again in ${BUSY_RETRY_AFTER_S} seconds.`);
