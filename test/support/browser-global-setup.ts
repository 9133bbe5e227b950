/**
 * Starts one Shelfmatch server for the browser suite: a fresh database on the test cluster, migrated
 * and seeded with the demo scenario exactly as `npm start` seeds it, the built app from dist/.
 */
import type { TestProject } from 'vitest/node';
import { join, resolve } from 'node:path';
import { existsSync } from 'node:fs';
import { loadConfig } from '../../server/config.js';
import { startServer, type RunningServer } from '../../server/main.js';
import { seedDemoData } from '../../seeds/index.js';
import { APP_DIST } from '../../scripts/app-build.js';
import { findFreePort } from '../../scripts/free-port.js';
import { adminQuery, testClusterUrl, withDatabase } from './test-database.js';
import { TEST_JWT_SECRET } from './test-app.js';

const ROOT = resolve(import.meta.dirname, '../..');
/** First port tried for the browser suite's server (npm start uses 4300). */
const BROWSER_SERVER_PORT = Number(process.env.SHELFMATCH_BROWSER_PORT ?? 4390);
const DB = `browser_demo_${process.pid}`;

let running: RunningServer | undefined;

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const staticDir = join(ROOT, APP_DIST);
  if (!existsSync(join(staticDir, 'index.html'))) throw new Error(`No built app in ${staticDir}: npm test builds it before this suite.`);
  await adminQuery(`DROP DATABASE IF EXISTS ${DB} WITH (FORCE)`);
  await adminQuery(`CREATE DATABASE ${DB}`);
  const config = loadConfig({
    JWT_SECRET: TEST_JWT_SECRET,
    DATABASE_URL: withDatabase(testClusterUrl(), DB),
    PORT: String(await findFreePort(BROWSER_SERVER_PORT)),
    LOG_LEVEL: 'warn',
    STATIC_DIR: staticDir,
    LOGIN_RATE_LIMIT: '1000',
  });
  running = await startServer(config);
  await seedDemoData(running.sequelize);
  project.provide('baseUrl', running.url);
  return async () => {
    await running?.close();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}
