/**
 * One Shelfmatch app per test file, on its own fresh database, with helpers to make users and
 * tokens. Everything is real: Express, passport, argon2, PostgreSQL.
 */
import { pino } from 'pino';
import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import type { Role } from '../../shared/api/auth.js';
import { loadConfig, type ServerConfig } from '../../server/config.js';
import { createApp } from '../../server/app.js';
import { initModels } from '../../server/models/index.js';
import { createUser } from '../../server/services/users/manage-users.js';
import { signToken } from '../../server/auth/tokens.js';
import { createTestDatabase, openTestSequelize } from './test-database.js';
import { startFakeSmtpServer, type FakeSmtpServer } from '../../server/mail/fake-smtp-server.js';

/** The JWT secret of test apps (tests also forge tokens with other secrets). */
export const TEST_JWT_SECRET = 'test-secret-0123456789-abcdefghijklmnopqrstuvwxyz';
/** The password of every user `addUser` creates. */
export const TEST_PASSWORD = 'correct horse battery';

export interface TestApp {
  app: Express;
  sequelize: Sequelize;
  config: ServerConfig;
  /** This file's own fake SMTP server on a free loopback port; the app sends its e-mail there. */
  mail: FakeSmtpServer;
  /**
   * Another app on the same database with other configuration variables. (Sequelize models are
   * bound to one instance per process, so a test file keeps one database and varies the app.)
   */
  appWith(env: Record<string, string>): { app: Express; config: ServerConfig };
  /** Creates an active user with `role` (e-mail `<role>-<n>@test.example`) and returns it with a token. */
  addUser(role: Role, email?: string): Promise<{ id: number; email: string; token: string }>;
  close(): Promise<void>;
}

/** Starts an app on a new database; `env` overrides configuration variables. */
export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const db = await createTestDatabase();
  const mail = await startFakeSmtpServer({ port: 0 });
  env = { SMTP_HOST: mail.host, SMTP_PORT: String(mail.port), ...env };
  const config = loadConfig({ JWT_SECRET: TEST_JWT_SECRET, DATABASE_URL: db.url, LOG_LEVEL: 'silent', LOGIN_RATE_LIMIT: '1000', ...env });
  const sequelize = openTestSequelize(db.url);
  initModels(sequelize);
  const app = createApp(config, sequelize, pino({ level: 'silent' }));
  let n = 0;
  return {
    app,
    sequelize,
    config,
    mail,
    appWith(more) {
      const other = loadConfig({ JWT_SECRET: TEST_JWT_SECRET, DATABASE_URL: db.url, LOG_LEVEL: 'silent', LOGIN_RATE_LIMIT: '1000', ...env, ...more });
      return { app: createApp(other, sequelize, pino({ level: 'silent' })), config: other };
    },
    async addUser(role, email) {
      n += 1;
      const user = await createUser(sequelize, null, {
        email: email ?? `${role}-${n}@test.example`,
        name: `Test ${role} ${n}`,
        role,
        password: TEST_PASSWORD,
      });
      return { id: user.id, email: user.email, token: signToken(user.id, config.jwtSecret, config.tokenTtl) };
    },
    async close() {
      await mail.close();
      await sequelize.close();
      await db.drop();
    },
  };
}
