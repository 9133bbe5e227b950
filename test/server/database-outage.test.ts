/**
 * The database stops under a running app: health and the API answer 503 with a clear message, the
 * process stays up, and requests succeed again once PostgreSQL is back. This file runs its own
 * cluster, so stopping it disturbs no other test file.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { join } from 'node:path';
import { rmSync } from 'node:fs';
import { pino } from 'pino';
import type { Sequelize } from 'sequelize';
import type { Express } from 'express';
import { PgCluster } from '../../scripts/pg-cluster.js';
import { findFreePort } from '../../scripts/free-port.js';
import { loadConfig } from '../../server/config.js';
import { openDatabase } from '../../server/db.js';
import { initModels } from '../../server/models/index.js';
import { migrate } from '../../server/migrations/index.js';
import { createApp } from '../../server/app.js';
import { createUser } from '../../server/services/users/manage-users.js';
import { signToken } from '../../server/auth/tokens.js';
import { TEST_JWT_SECRET } from '../support/test-app.js';

const baseDir = join(process.env.TEST_PG_BASE ?? 'tmp/test-postgres', '..', `outage-postgres-${process.pid}`);
let cluster: PgCluster;
let sequelize: Sequelize;
let app: Express;
let token: string;

beforeAll(async () => {
  rmSync(baseDir, { recursive: true, force: true });
  cluster = new PgCluster({ baseDir, port: await findFreePort(54349), fast: true });
  cluster.ensureStarted();
  cluster.ensureDatabase('outage');
  const config = loadConfig({ JWT_SECRET: TEST_JWT_SECRET, DATABASE_URL: cluster.url('outage'), LOG_LEVEL: 'silent' });
  sequelize = openDatabase(config.databaseUrl);
  initModels(sequelize);
  await migrate(sequelize);
  app = createApp(config, sequelize, pino({ level: 'silent' }));
  const user = await createUser(sequelize, null, { email: 'o@test.example', name: 'O', role: 'admin', password: 'outage-password' });
  token = signToken(user.id, TEST_JWT_SECRET, '1h');
});

afterAll(async () => {
  await sequelize?.close().catch(() => undefined);
  cluster?.stop();
  rmSync(baseDir, { recursive: true, force: true });
});

describe('database outage', () => {
  it('answers 503 while PostgreSQL is down and recovers by itself when it is back', async () => {
    expect((await request(app).get('/api/users').set('Authorization', `Bearer ${token}`)).status).toBe(200);

    cluster.stop();
    const health = await request(app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toMatchObject({ status: 'degraded', database: 'down', error: { code: 'database_unavailable' } });
    for (const req of [
      request(app).get('/api/users').set('Authorization', `Bearer ${token}`),
      request(app).get('/api/auth/me').set('Authorization', `Bearer ${token}`),
      request(app).post('/api/auth/login').send({ email: 'o@test.example', password: 'outage-password' }),
    ]) {
      const res = await req;
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('database_unavailable');
      expect(res.body.error.message).toMatch(/database is not reachable/);
    }

    cluster.ensureStarted();
    // The pool may hand out one connection that died with the old server; a retry loop bounded in
    // count shows that the app heals without a restart.
    let status = 0;
    for (let i = 0; i < 20 && status !== 200; i++) {
      status = (await request(app).get('/api/health')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
    expect((await request(app).get('/api/users').set('Authorization', `Bearer ${token}`)).status).toBe(200);
  });
});
