/**
 * Databases for server tests on the cluster that `npm test` started (TEST_PG_URL). A migrated
 * template is made once per run; each test file copies it, which takes milliseconds.
 */
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { Sequelize } from 'sequelize';
import { openDatabase } from '../../server/db.js';
import { migrate } from '../../server/migrations/index.js';

/** Name of the migrated template database. */
export const TEMPLATE_DB = 'shelfmatch_template';

/** The admin URL of the test cluster; fails loudly when the tests were not started by `npm test`. */
export function testClusterUrl(): string {
  const url = process.env.TEST_PG_URL;
  if (!url) throw new Error('TEST_PG_URL is not set: run the server tests through `npm test` (or `npm test -- server`).');
  return url;
}

/** `url` with its database name replaced by `name`. */
export function withDatabase(url: string, name: string): string {
  const u = new URL(url);
  u.pathname = `/${name}`;
  return u.toString();
}

/** Runs one SQL statement on the cluster's `postgres` database. */
export async function adminQuery(sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: testClusterUrl() });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** (Re)creates the migrated template. Called once by the global setup. */
export async function createTemplate(): Promise<void> {
  await adminQuery(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
  await adminQuery(`CREATE DATABASE ${TEMPLATE_DB}`);
  const sequelize = new Sequelize(withDatabase(testClusterUrl(), TEMPLATE_DB), { logging: false, dialect: 'postgres' });
  try {
    await migrate(sequelize);
  } finally {
    await sequelize.close();
  }
}

/** A fresh database copied from the template; returns its URL and how to drop it. */
export async function createTestDatabase(): Promise<{ url: string; name: string; drop(): Promise<void> }> {
  const name = `t_${randomBytes(6).toString('hex')}`;
  await adminQuery(`CREATE DATABASE ${name} TEMPLATE ${TEMPLATE_DB}`);
  return {
    name,
    url: withDatabase(testClusterUrl(), name),
    drop: () => adminQuery(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`),
  };
}

/** Opens Sequelize on `url` with the server's own settings. */
export function openTestSequelize(url: string): Sequelize {
  return openDatabase(url);
}
