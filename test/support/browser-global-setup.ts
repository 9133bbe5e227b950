/**
 * Starts one Shelfmatch server for the browser suite: a fresh database on the test cluster, migrated
 * and seeded with the demo scenario exactly as `npm start` seeds it, the built app from dist/.
 */
import type { TestProject } from 'vitest/node';
import { join, resolve } from 'node:path';
import { existsSync, rmSync } from 'node:fs';
import { loadConfig } from '../../server/config.js';
import { startServer, type RunningServer } from '../../server/main.js';
import { seedDemoData } from '../../seeds/index.js';
import { APP_DIST } from '../../scripts/app-build.js';
import { findFreePort } from '../../scripts/free-port.js';
import { adminQuery, testClusterUrl, withDatabase } from './test-database.js';
import { TEST_JWT_SECRET } from './test-app.js';
import { startFakeSmtpServer, type FakeSmtpServer } from '../../server/mail/fake-smtp-server.js';

const ROOT = resolve(import.meta.dirname, '../..');
/** First port tried for the browser suite's server (npm start uses 4300). */
const BROWSER_SERVER_PORT = Number(process.env.SHELFMATCH_BROWSER_PORT ?? 4390);
const DB = `browser_demo_${process.pid}`;
/** Where the suite's fake SMTP server writes each message it receives, as an .eml file. */
const MAIL_DIR = join(ROOT, 'tmp', `browser-mail-${process.pid}`);

let running: RunningServer | undefined;
let mail: FakeSmtpServer | undefined;

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const staticDir = join(ROOT, APP_DIST);
  if (!existsSync(join(staticDir, 'index.html'))) throw new Error(`No built app in ${staticDir}: npm test builds it before this suite.`);
  await adminQuery(`DROP DATABASE IF EXISTS ${DB} WITH (FORCE)`);
  await adminQuery(`CREATE DATABASE ${DB}`);
  rmSync(MAIL_DIR, { recursive: true, force: true });
  mail = await startFakeSmtpServer({ port: 0, emlDir: MAIL_DIR });
  const config = loadConfig({
    JWT_SECRET: TEST_JWT_SECRET,
    DATABASE_URL: withDatabase(testClusterUrl(), DB),
    PORT: String(await findFreePort(BROWSER_SERVER_PORT)),
    LOG_LEVEL: 'warn',
    STATIC_DIR: staticDir,
    LOGIN_RATE_LIMIT: '1000',
    SMTP_HOST: mail.host,
    SMTP_PORT: String(mail.port),
  });
  running = await startServer(config);
  await seedDemoData(running.sequelize);
  project.provide('baseUrl', running.url);
  project.provide('mailDir', MAIL_DIR);
  return async () => {
    await running?.close();
    await mail?.close();
    rmSync(MAIL_DIR, { recursive: true, force: true });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    /** Folder of the .eml files the suite's fake SMTP server received (see test/support/received-mail.ts). */
    mailDir: string;
  }
}
