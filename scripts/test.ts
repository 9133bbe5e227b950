/**
 * `npm test`: starts a throw-away PostgreSQL cluster under tmp/ on 127.0.0.1:54339, runs every suite
 * (type check, engine, server, Angular unit tests, app build, browser), stops the cluster whatever happens, and
 * exits non-zero when any suite failed. `npm test -- engine server` runs only the named suites;
 * `npm test -- server stock-import` also passes the other words to vitest as file filters.
 */
import { spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PgCluster } from './pg-cluster.js';
import { buildAppIfStale } from './app-build.js';
import { findFreePort } from './free-port.js';

const ROOT = resolve(import.meta.dirname, '..');
/** First port tried for the throw-away cluster; the next free one is taken when it is busy. */
const TEST_PG_PORT = Number(process.env.SHELFMATCH_TEST_PG_PORT ?? 54339);

interface Suite {
  name: string;
  run(): number;
}

const bin = (tool: string) => join(ROOT, 'node_modules/.bin', tool);
/** Words on the command line that are not suite names: vitest file filters. */
let fileFilters: string[] = [];
const exec = (cmd: string, args: string[], env: NodeJS.ProcessEnv = {}) =>
  spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false', ...env } }).status ?? 1;

const SUITES: Suite[] = [
  { name: 'types', run: () => exec(bin('tsc'), ['-p', 'tsconfig.server.json']) },
  { name: 'engine', run: () => exec(bin('vitest'), ['run', '--config', 'test/vitest.engine.config.ts', ...fileFilters]) },
  { name: 'server', run: () => exec(bin('vitest'), ['run', '--config', 'test/vitest.server.config.ts', ...fileFilters]) },
  { name: 'app', run: () => exec(bin('ng'), ['test', '--watch=false']) },
  {
    name: 'browser',
    run: () => {
      try {
        buildAppIfStale(ROOT);
      } catch (error) {
        console.error(error instanceof Error ? error.message : error);
        return 1;
      }
      return exec(bin('vitest'), ['run', '--config', 'test/vitest.browser.config.ts', ...fileFilters]);
    },
  },
];

async function main(): Promise<number> {
  const args = process.argv.slice(2);
  const wanted = args.filter((w) => SUITES.some((s) => s.name === w));
  fileFilters = args.filter((w) => !wanted.includes(w));
  if (fileFilters.length && !wanted.some((w) => ['engine', 'server', 'browser'].includes(w))) {
    console.error(
      `Unknown suite(s): ${fileFilters.join(', ')}. Suites: ${SUITES.map((s) => s.name).join(', ')}; ` +
        'other words are file filters and need one of engine, server, browser.',
    );
    return 2;
  }
  const suites = wanted.length ? SUITES.filter((s) => wanted.includes(s.name)) : SUITES;

  // One folder and port per run, so runs in parallel (two checkouts, helpers) do not collide.
  const baseDir = join(ROOT, 'tmp', `test-postgres-${process.pid}`);
  rmSync(baseDir, { recursive: true, force: true });
  const cluster = new PgCluster({ baseDir, port: await findFreePort(TEST_PG_PORT), fast: true });
  const stop = () => {
    try {
      cluster.stop();
    } catch (error) {
      console.error(`Could not stop the test database: ${error instanceof Error ? error.message : error}`);
    }
  };
  process.on('SIGINT', () => {
    stop();
    process.exit(130);
  });
  process.on('SIGTERM', () => {
    stop();
    process.exit(143);
  });

  const results: { name: string; ok: boolean; seconds: number }[] = [];
  try {
    cluster.ensureStarted();
    process.env.TEST_PG_URL = cluster.url('postgres');
    process.env.TEST_PG_BASE = baseDir;
    for (const suite of suites) {
      console.log(`\n=== ${suite.name} ===`);
      const t0 = Date.now();
      const status = suite.run();
      results.push({ name: suite.name, ok: status === 0, seconds: (Date.now() - t0) / 1000 });
    }
  } finally {
    stop();
    rmSync(baseDir, { recursive: true, force: true });
  }
  console.log('\n=== summary ===');
  for (const r of results) console.log(`${r.ok ? 'ok    ' : 'FAILED'} ${r.name.padEnd(8)} ${r.seconds.toFixed(1)} s`);
  const failed = results.filter((r) => !r.ok).length;
  console.log(`suites: ${results.length - failed} passed, ${failed} failed`);
  return failed ? 1 : 0;
}

main().then((code) => process.exit(code));
