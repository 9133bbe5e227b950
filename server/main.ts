/**
 * Opens the database, runs migrations and listens. `npm start` calls `startServer`; a deployment
 * with an external PostgreSQL can run this file directly (`tsx server/main.ts`).
 */
import { createServer, type Server } from 'node:http';
import { pino, type Logger } from 'pino';
import type { Sequelize } from 'sequelize';
import { loadConfig, type ServerConfig } from './config.js';
import { openDatabase } from './db.js';
import { initModels } from './models/index.js';
import { migrate } from './migrations/index.js';
import { createApp } from './app.js';
import { closeSolvePool } from './services/matches/solve-pool.js';

/** A running server and how to stop it. */
export interface RunningServer {
  server: Server;
  sequelize: Sequelize;
  logger: Logger;
  url: string;
  close(): Promise<void>;
}

/** Opens the database, migrates it and starts listening on `config.host:config.port`. */
export async function startServer(config: ServerConfig = loadConfig()): Promise<RunningServer> {
  const logger = pino({ level: config.logLevel });
  const sequelize = openDatabase(config.databaseUrl);
  initModels(sequelize);
  const applied = await migrate(sequelize);
  if (applied.length) logger.info({ applied }, 'migrations applied');
  const app = createApp(config, sequelize, logger);
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const url = `http://${config.host}:${config.port}`;
  return {
    server,
    sequelize,
    logger,
    url,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closeSolvePool();
      await sequelize.close();
    },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  startServer().then(
    (running) => {
      running.logger.info(`Shelfmatch listening on ${running.url}`);
      const stop = () => void running.close().then(() => process.exit(0));
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    },
    (error) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );
}
