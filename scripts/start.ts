/**
 * `npm start`: the product on one machine. Without DATABASE_URL it keeps its own PostgreSQL cluster
 * in `.local/postgres` (git-ignored) on 127.0.0.1:54329, migrated and seeded with the demo scenario;
 * with DATABASE_URL it uses that database, seeds nothing, and creates the first admin from
 * ADMIN_EMAIL / ADMIN_PASSWORD when there are no users. Ctrl-C stops what it started.
 */
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PgCluster } from './pg-cluster.js';
import { APP_DIST, buildAppIfStale } from './app-build.js';
import type { FakeSmtpServer } from '../server/mail/fake-smtp-server.js';

const ROOT = resolve(import.meta.dirname, '..');
const LOCAL = join(ROOT, '.local');
const EMBEDDED_PG_PORT = Number(process.env.SHELFMATCH_PG_PORT ?? 54329);

/** Reads `.local/jwt-secret`, creating it (48 random bytes, owner-only) the first time. */
function localJwtSecret(): string {
  const file = join(LOCAL, 'jwt-secret');
  if (!existsSync(file)) {
    mkdirSync(LOCAL, { recursive: true });
    writeFileSync(file, randomBytes(48).toString('hex'), { mode: 0o600 });
  }
  chmodSync(file, 0o600);
  return readFileSync(file, 'utf8').trim();
}

async function main(): Promise<void> {
  const external = Boolean(process.env.DATABASE_URL);
  let cluster: PgCluster | undefined;
  let startedCluster = false;
  if (!external) {
    cluster = new PgCluster({ baseDir: join(LOCAL, 'postgres'), port: EMBEDDED_PG_PORT });
    startedCluster = !cluster.isRunning();
    cluster.ensureStarted();
    cluster.ensureDatabase('shelfmatch');
    process.env.DATABASE_URL = cluster.url('shelfmatch');
  }
  process.env.JWT_SECRET ??= localJwtSecret();
  process.env.STATIC_DIR ??= join(ROOT, APP_DIST);

  const stopCluster = () => {
    if (cluster && startedCluster) cluster.stop();
  };
  // Without SMTP_HOST, e-mail goes to a local fake SMTP server and stays on this machine.
  let fakeSmtp: FakeSmtpServer | undefined;
  try {
    buildAppIfStale(ROOT);
    if (!process.env.SMTP_HOST) {
      const { startFakeSmtpServer, FAKE_SMTP_DEFAULT_PORT } = await import('../server/mail/fake-smtp-server.js');
      fakeSmtp = await startFakeSmtpServer({ port: Number(process.env.SMTP_PORT || FAKE_SMTP_DEFAULT_PORT), emlDir: join(LOCAL, 'mail') });
    }
    const { loadConfig } = await import('../server/config.js');
    const { startServer } = await import('../server/main.js');
    const { prepareData } = await import('./prepare-data.js');
    const running = await startServer(loadConfig());
    const accounts = await prepareData(running.sequelize, { embedded: !external });

    console.log(`\nShelfmatch is running at ${running.url}`);
    if (accounts.length) {
      console.log('Demo accounts (password "shelfmatch-demo"):');
      for (const a of accounts) console.log(`  ${a.role.padEnd(10)} ${a.email}`);
    }
    if (fakeSmtp) {
      console.log(`E-mail goes to a local fake SMTP server on ${fakeSmtp.host}:${fakeSmtp.port} and stays on this machine:`);
      console.log('  admins see it under Outbox; each message is also kept in .local/mail/. Set SMTP_HOST to send real mail.');
    }
    console.log('Press Ctrl-C to stop.\n');

    let stopping = false;
    const stop = async () => {
      if (stopping) return;
      stopping = true;
      console.log('\nStopping...');
      await running.close().catch(() => undefined);
      await fakeSmtp?.close().catch(() => undefined);
      stopCluster();
      process.exit(0);
    };
    process.on('SIGINT', () => void stop());
    process.on('SIGTERM', () => void stop());
  } catch (error) {
    console.error(`\nShelfmatch could not start: ${error instanceof Error ? error.message : String(error)}`);
    await fakeSmtp?.close().catch(() => undefined);
    stopCluster();
    process.exit(1);
  }
}

void main();
