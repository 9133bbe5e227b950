/**
 * A full connection pool is not an outage: with every connection held by other work, a request
 * that cannot get one in time answers 503 `server_busy` with Retry-After (not
 * `database_unavailable`), health says `busy`, and both are fine again once a connection is free.
 * (The outage itself: database-outage.test.ts.) A real pool of two connections on the real
 * database, held by two open transactions.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { pino } from 'pino';
import type { Express } from 'express';
import type { Sequelize, Transaction } from 'sequelize';
import { createTestDatabase } from '../support/test-database.js';
import { TEST_JWT_SECRET } from '../support/test-app.js';
import { loadConfig } from '../../server/config.js';
import { openDatabase } from '../../server/db.js';
import { initModels } from '../../server/models/index.js';
import { createApp } from '../../server/app.js';
import { createUser } from '../../server/services/users/manage-users.js';
import { signToken } from '../../server/auth/tokens.js';

let db: Awaited<ReturnType<typeof createTestDatabase>>;
let sequelize: Sequelize;
let app: Express;
let token: string;

beforeAll(async () => {
  db = await createTestDatabase();
  const config = loadConfig({ JWT_SECRET: TEST_JWT_SECRET, DATABASE_URL: db.url, LOG_LEVEL: 'silent' });
  sequelize = openDatabase(db.url, { max: 2, acquireMs: 300 });
  initModels(sequelize);
  app = createApp(config, sequelize, pino({ level: 'silent' }));
  const user = await createUser(sequelize, null, { email: 'busy@test.example', name: 'Busy', role: 'admin', password: 'busy-password-1' });
  token = signToken(user.id, TEST_JWT_SECRET, '1h');
});
afterAll(async () => {
  await sequelize?.close();
  await db?.drop();
});

describe('a full connection pool', () => {
  it('answers 503 server_busy with Retry-After, health says busy, and recovers when a connection is free', async () => {
    expect((await request(app).get('/api/users').set('Authorization', `Bearer ${token}`)).status).toBe(200);
    const held: Transaction[] = [await sequelize.transaction(), await sequelize.transaction()];
    try {
      const users = await request(app).get('/api/users').set('Authorization', `Bearer ${token}`);
      expect(users.status).toBe(503);
      expect(users.body.error.code).toBe('server_busy');
      expect(users.body.error.message).toMatch(/busy.*Nothing was changed/);
      expect(users.headers['retry-after']).toBe('5');

      const health = await request(app).get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body).toMatchObject({ status: 'busy', database: 'busy', error: { code: 'server_busy' } });
      expect(health.headers['retry-after']).toBe('5');
    } finally {
      for (const transaction of held) await transaction.rollback();
    }
    expect((await request(app).get('/api/users').set('Authorization', `Bearer ${token}`)).status).toBe(200);
    expect((await request(app).get('/api/health')).body).toMatchObject({ status: 'ok', database: 'up' });
  });
});
