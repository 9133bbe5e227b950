/**
 * A private PostgreSQL cluster on loopback, owned by one project folder.
 *
 * Used by `npm start` (a kept cluster under `.local/`), by `npm test` (a throw-away cluster under
 * `tmp/`) and by the tests that stop and restart a database on purpose. PostgreSQL refuses to run
 * as root, so when we are root every server command runs as Debian's `postgres` user through
 * `runuser`, and the folders on the way to the data folder are made traversable for that user.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readdirSync, statSync, chownSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { userInfo } from 'node:os';

/** Where Debian puts each major version's server binaries. */
const DEBIAN_PG_ROOT = '/usr/lib/postgresql';

/** Options of one cluster. */
export interface PgClusterOptions {
  /** Folder holding `data/`, `run/` (the unix socket) and `server.log`. */
  baseDir: string;
  /** TCP port on 127.0.0.1; pick one that no stock server uses (not 5432). */
  port: number;
  /** Trade durability for speed (tests only): fsync off, no synchronous commit. */
  fast?: boolean;
}

/** Finds the newest installed PostgreSQL server's `bin` folder, or undefined when none is. */
export function findPgBin(): string | undefined {
  if (!existsSync(DEBIAN_PG_ROOT)) return undefined;
  const versions = readdirSync(DEBIAN_PG_ROOT)
    .filter((v) => existsSync(join(DEBIAN_PG_ROOT, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(DEBIAN_PG_ROOT, versions[0], 'bin') : undefined;
}

/** A private cluster: `ensureStarted()` creates and starts it, `stop()` stops it. */
export class PgCluster {
  readonly baseDir: string;
  readonly dataDir: string;
  readonly socketDir: string;
  readonly logFile: string;
  readonly port: number;
  private readonly fast: boolean;
  private readonly bin: string;
  private readonly asRoot = userInfo().uid === 0;

  constructor(options: PgClusterOptions) {
    this.baseDir = resolve(options.baseDir);
    this.dataDir = join(this.baseDir, 'data');
    this.socketDir = join(this.baseDir, 'run');
    this.logFile = join(this.baseDir, 'server.log');
    this.port = options.port;
    this.fast = options.fast ?? false;
    const bin = findPgBin();
    if (!bin) {
      throw new Error(
        'PostgreSQL server binaries not found under /usr/lib/postgresql: install Debian\'s "postgresql" package (scripts/ensure-system.sh does this).',
      );
    }
    this.bin = bin;
    if (this.socketDir.length > 100) {
      throw new Error(`Socket folder path is too long for a unix socket (${this.socketDir.length} > 100 characters): move the project to a shorter path.`);
    }
  }

  /** The connection URL of database `name` over TCP on loopback as the `postgres` superuser. */
  url(name = 'postgres'): string {
    return `postgres://postgres@127.0.0.1:${this.port}/${name}`;
  }

  /** Whether the server of this data folder is running. */
  isRunning(): boolean {
    if (!existsSync(join(this.dataDir, 'PG_VERSION'))) return false;
    const r = this.run('pg_ctl', ['-D', this.dataDir, 'status'], { check: false });
    return r.status === 0;
  }

  /** Creates the cluster when absent and starts it when stopped. Idempotent. */
  ensureStarted(): void {
    this.prepareFolders();
    if (!existsSync(join(this.dataDir, 'PG_VERSION'))) {
      this.run('initdb', ['-D', this.dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    }
    if (this.isRunning()) return;
    const settings = [
      `-p ${this.port}`,
      `-k ${this.socketDir}`,
      '-c listen_addresses=127.0.0.1',
      '-c max_connections=200',
      ...(this.fast ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
    ].join(' ');
    this.run('pg_ctl', ['-D', this.dataDir, '-l', this.logFile, '-w', '-t', '30', '-o', settings, 'start']);
  }

  /** Stops the server (fast shutdown: open sessions are ended). Does nothing when it is not running. */
  stop(): void {
    if (!this.isRunning()) return;
    this.run('pg_ctl', ['-D', this.dataDir, '-m', 'fast', '-w', '-t', '30', 'stop'], { check: false });
  }

  /** Runs SQL through psql on the unix socket and returns its output (tuples only). */
  psql(sql: string, database = 'postgres'): string {
    const r = this.run('psql', ['-h', this.socketDir, '-p', String(this.port), '-U', 'postgres', '-d', database, '-tAX', '-v', 'ON_ERROR_STOP=1', '-c', sql]);
    return r.stdout.trim();
  }

  /** Creates database `name` unless it exists. */
  ensureDatabase(name: string): void {
    if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Invalid database name "${name}".`);
    const exists = this.psql(`SELECT 1 FROM pg_database WHERE datname = '${name}'`);
    if (exists !== '1') this.psql(`CREATE DATABASE ${name}`);
  }

  private prepareFolders(): void {
    mkdirSync(this.baseDir, { recursive: true });
    mkdirSync(this.socketDir, { recursive: true });
    if (!this.asRoot) return;
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
    // PostgreSQL needs its data folder to be its own and every folder above it to be traversable.
    mkdirSync(this.dataDir, { recursive: true });
    for (const dir of [this.baseDir, this.dataDir, this.socketDir]) chownSync(dir, uid, gid);
    chmodSync(this.dataDir, 0o700);
    if (!existsSync(this.logFile)) writeFileSync(this.logFile, '');
    chownSync(this.logFile, uid, gid);
    // Only the search (x) bit for others is added, never read or write.
    for (let dir = dirname(this.baseDir); ; dir = dirname(dir)) {
      const mode = statSync(dir).mode;
      if ((mode & 0o001) === 0) chmodSync(dir, mode | 0o001);
      if (dir === dirname(dir)) break;
    }
  }

  private run(tool: string, args: string[], options: { check?: boolean } = {}): { status: number; stdout: string; stderr: string } {
    const exe = join(this.bin, tool);
    const r = this.asRoot
      ? spawnSync('runuser', ['-u', 'postgres', '--', exe, ...args], { encoding: 'utf8', cwd: '/' })
      : spawnSync(exe, args, { encoding: 'utf8' });
    const result = { status: r.status ?? 1, stdout: r.stdout ?? '', stderr: r.stderr ?? '' };
    if ((options.check ?? true) && result.status !== 0) {
      throw new Error(`${tool} ${args.join(' ')} failed (exit ${result.status}): ${result.stderr || result.stdout}`);
    }
    return result;
  }
}
