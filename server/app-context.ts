/** What every router gets: configuration, the database, the logger and the sign-in middleware. */
import type { Sequelize } from 'sequelize';
import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import type { ServerConfig } from './config.js';

export interface AppContext {
  config: ServerConfig;
  sequelize: Sequelize;
  logger: Logger;
  /** 401 unless the request carries a valid token of an active user. */
  requireSignIn: RequestHandler;
}
