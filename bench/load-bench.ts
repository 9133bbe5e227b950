/**
 * The API under load (handbook quality.md "Benchmarks"): 50 concurrent clients solving matches
 * against 10,000 parts on loopback, with autocannon. A real server (server/main.ts in its own
 * process, so the load generator does not share its event loop) on a throw-away PostgreSQL
 * cluster; the 10k parts go in through the stock-list importer over HTTP; a designer signs in with
 * `POST /api/auth/login`; then autocannon runs for a fixed time cycling through varied solve
 * requests of the demo scenario's kind (868/915 MHz chip antennas, 2.45 GHz, 13.56 and 40.68 MHz,
 * single parts and two-part combinations, worst-case, nominal and band objectives). Side by side
 * in the same run: `GET /api/health` under the same load, the floor of the HTTP stack and one
 * database round trip; and single-part solves alone beside the mix. Reports the one-at-a-time
 * service time of each body, then requests/s, p50/p90/p99 latency, errors, timeouts and non-2xx.
 * Both ways solves can run, side by side on the same database: on worker threads (the default,
 * one per core) and on the event loop (`SOLVE_THREADS=0`); beside each mix run, a few clients
 * ask `GET /api/health`, whose latency shows whether solves hold up the other requests; and beside
 * a load of combination solves only, a few clients ask single-part solves, whose latency shows
 * whether a quick question waits behind the long ones.
 * A report, never a test: nothing here passes or fails.
 *
 * Run: `npx tsx bench/load-bench.ts` (or `npm run bench`); `LOAD_BENCH_SECONDS` sets the solve run's length,
 * `LOAD_BENCH_THREADS` the threaded server's solve threads (default: one per core).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import autocannon, { type AutocannonResult } from 'autocannon';
import { PgCluster } from '../scripts/pg-cluster.js';
import { findFreePort } from '../scripts/free-port.js';
import { openDatabase } from '../server/db.js';
import { initModels } from '../server/models/index.js';
import { migrate } from '../server/migrations/index.js';
import { createUser } from '../server/services/users/manage-users.js';
import { mulberry32 } from '../shared/engine/seeded-random.js';
import { eSeriesValues } from '../shared/engine/e-series.js';
import { formatMs } from './report.js';

const ROOT = resolve(import.meta.dirname, '..');
const PARTS = 10_000;
const CONNECTIONS = 50;
const SOLVE_SECONDS = Number(process.env.LOAD_BENCH_SECONDS ?? 20);
const HEALTH_SECONDS = 10;
const WARMUP_SECONDS = 3;
/** Health clients beside the mix, to see whether solves hold up other requests. */
const HEALTH_BESIDE_CONNECTIONS = 5;
/** Clients asking combination solves only (enough to keep every thread busy, few enough that answers come within the run). */
const COMBINATION_CONNECTIONS = 4;
/** Clients asking single-part solves beside them. */
const SINGLES_BESIDE_CONNECTIONS = 5;
/** The server's default solve threads (server/config.ts): one per core. */
const DEFAULT_THREADS = Number(process.env.LOAD_BENCH_THREADS ?? Math.max(1, availableParallelism()));
const PASSWORD = 'load-bench-password-1';
const JWT_SECRET = 'load-bench-secret-0123456789-abcdefghijklmnopqrstuvwxyz';

const HEADER =
  'part_number,kind,value,tolerance,srf,q,q_freq,esr,quantity,package,voltage_rating,current_rating,location,series,unit_cost,manufacturer_part,description';

/**
 * 10k plausible stock rows: C0G capacitors (E24, 0.2 pF to 10 nF) and chip inductors (E12/E24,
 * 1 nH to 1 uH) in 0201/0402/0603, with SRF and loss from the package, over eight locations, some
 * lines with nothing on hand. Invented, in the spirit of seeds/demo-stock.csv.
 */
function stockCsv(rows: number): string {
  const random = mulberry32(2026);
  const e24 = eSeriesValues('E24');
  const e12 = eSeriesValues('E12');
  const packages = [
    { name: '0201', esl: 0.25e-9, cp: 0.04e-12, q: 14 },
    { name: '0402', esl: 0.4e-9, cp: 0.08e-12, q: 30 },
    { name: '0603', esl: 0.6e-9, cp: 0.12e-12, q: 45 },
  ];
  const locations = ['main', 'lab', 'bench-a', 'bench-b', 'line-1', 'line-2', 'rework', 'quarantine'];
  const lines = [HEADER];
  for (let i = 0; lines.length <= rows; i += 1) {
    const cap = i % 5 < 3;
    const pkg = packages[Math.floor(random() * packages.length)];
    const location = locations[Math.floor(random() * locations.length)];
    const quantity = random() < 0.1 ? 0 : Math.floor(random() * 4000);
    const cost = (0.002 + random() * 0.05).toFixed(4);
    if (cap) {
      const decade = 10 ** (-13 + Math.floor(random() * 5)); // 0.1 pF .. 1 nF decades
      const value = Number((e24[Math.floor(random() * 24)] * decade).toPrecision(3));
      if (value < 0.2e-12) continue;
      const srf = 1 / (2 * Math.PI * Math.sqrt(pkg.esl * value));
      const esr = 0.05 + 0.3 / Math.sqrt(value / 1e-12);
      lines.push(
        [`LB-C${pkg.name}-${i}`, 'C', `${value}`, value < 10e-12 ? 'B' : 'J', `${(srf / 1e9).toPrecision(3)}GHz`, '', '', esr.toPrecision(3), quantity, pkg.name, '50V', '', location, 'E24', cost, `LBC-${i}`, `${pkg.name} C0G chip capacitor`].join(','),
      );
    } else {
      const series = random() < 0.5 ? e12 : e24;
      const decade = 10 ** (-9 + Math.floor(random() * 3)); // 1 nH .. 1 uH
      const value = Number((series[Math.floor(random() * series.length)] * decade).toPrecision(3));
      const srf = 1 / (2 * Math.PI * Math.sqrt(pkg.cp * value));
      lines.push(
        [`LB-L${pkg.name}-${i}`, 'L', `${value}`, value < 10e-9 ? '0.3nH' : '5%', `${(Math.min(srf, 20e9) / 1e9).toPrecision(3)}GHz`, String(pkg.q), '500MHz', '', quantity, pkg.name, '', '300mA', location, series === e12 ? 'E12' : 'E24', cost, `LBL-${i}`, `${pkg.name} chip inductor`].join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}

/** Varied solve requests of the demo scenario's kind. */
function solveBodies(count: number): object[] {
  const random = mulberry32(868);
  const links = [
    { f: '868MHz', loads: ['12-j35', '8-j60', '18-j22', '30+j15'] },
    { f: '915MHz', loads: ['14-j30', '9-j55', '22+j8'] },
    { f: '2.45GHz', loads: ['25+j10', '35-j20', '70+j30', '15-j5'] },
    { f: '13.56MHz', loads: ['2+j40', '5+j85', '1.2+j25'] },
    { f: '40.68MHz', loads: ['10-j80', '150+j20', '20-j40'] },
  ];
  const bodies: object[] = [];
  for (let i = 0; i < count; i += 1) {
    const link = links[i % links.length];
    const body: Record<string, unknown> = { source: random() < 0.9 ? 50 : '50+j0', load: link.loads[Math.floor(random() * link.loads.length)], frequencyHz: link.f };
    const r = random();
    if (r < 0.25) body.objective = 'nominal';
    else if (r < 0.4) {
      body.objective = 'band';
      body.bandwidthHz = link.f.endsWith('GHz') ? '80MHz' : link.f.startsWith('9') || link.f.startsWith('8') ? '10MHz' : '500kHz';
    }
    if (random() < 0.2) body.combinations = true;
    if (random() < 0.3) body.fitsPerNetwork = 5;
    if (random() < 0.2) body.powerW = '100mW';
    if (random() < 0.15) body.location = 'main';
    if (random() < 0.3) body.buildQuantity = 1 + Math.floor(random() * 100);
    bodies.push(body);
  }
  return bodies;
}

async function waitForHealth(url: string, server: ChildProcess): Promise<void> {
  for (let i = 0; i < 600; i += 1) {
    if (server.exitCode !== null) throw new Error(`the server exited with ${server.exitCode}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((done) => setTimeout(done, 100));
  }
  throw new Error('the server did not answer /api/health within 60 s');
}

/**
 * Waits for the server to finish what a run left in flight (autocannon stops sending at the end of
 * its time, but the server still works through the requests it holds), so runs do not overlap.
 */
async function drain(url: string): Promise<void> {
  for (let i = 0; i < 2; i += 1) await (await fetch(`${url}/api/health`)).arrayBuffer();
}

async function signIn(url: string, email: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password: PASSWORD }) });
  if (!res.ok) throw new Error(`sign-in of ${email} answered ${res.status}`);
  return ((await res.json()) as { token: string }).token;
}

function line(label: string, r: AutocannonResult): string {
  const rate = r.requests.total / r.duration;
  return (
    `  ${label.padEnd(34)} ${rate.toFixed(0).padStart(6)} req/s  p50 ${formatMs(r.latency.p50).padStart(9)}  p90 ${formatMs(r.latency.p90).padStart(9)}` +
    `  p99 ${formatMs(r.latency.p99).padStart(9)}  max ${formatMs(r.latency.max).padStart(9)}  ${r.requests.total} requests, ${r.errors} errors, ${r.timeouts} timeouts, ${r.non2xx} non-2xx`
  );
}

/** A server process (server/main.ts) on `databaseUrl` with `solveThreads` solve threads. */
async function startServerProcess(databaseUrl: string, solveThreads: number): Promise<{ url: string; stop(): Promise<void> }> {
  const port = await findFreePort(4391);
  const url = `http://127.0.0.1:${port}`;
  const server = spawn(join(ROOT, 'node_modules', '.bin', 'tsx'), [join(ROOT, 'server', 'main.ts')], {
    cwd: ROOT,
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      JWT_SECRET,
      PORT: String(port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'warn',
      LOGIN_RATE_LIMIT: '100',
      NODE_ENV: 'production',
      SOLVE_THREADS: String(solveThreads),
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const stop = async () => {
    if (server.exitCode !== null) return;
    const exited = new Promise((done) => server.once('exit', done));
    server.kill('SIGTERM');
    await exited;
  };
  try {
    await waitForHealth(url, server);
  } catch (error) {
    await stop();
    throw error;
  }
  return { url, stop };
}

/** What one server configuration gave. */
interface ConfigurationRun {
  label: string;
  single: number[];
  combined: number[];
  singles: AutocannonResult;
  mix: AutocannonResult;
  /** `GET /api/health` from a few more clients while the mix runs. */
  healthDuringMix: AutocannonResult;
  /** Combination solves only, and single-part solves from a few more clients beside them. */
  combosOnly: AutocannonResult;
  singlesBesideCombos: AutocannonResult;
}

/** Service times, singles, then the mix with health requests beside it, on one server. */
async function runConfiguration(label: string, url: string, bodies: object[]): Promise<ConfigurationRun> {
  const designer = await signIn(url, 'designer@bench.example');
  const headers = { Authorization: `Bearer ${designer}`, 'Content-Type': 'application/json' };
  // Every body must solve, or the run would measure refusals; one at a time, this is also the
  // service time of each (what one request costs with no queue in front of it).
  const single: number[] = [];
  const combined: number[] = [];
  for (const body of bodies) {
    const start = performance.now();
    const res = await fetch(`${url}/api/matches/solve`, { method: 'POST', headers, body: JSON.stringify(body) });
    if (res.status !== 200) throw new Error(`solve of ${JSON.stringify(body)} answered ${res.status}: ${(await res.text()).slice(0, 300)}`);
    await res.arrayBuffer();
    ((body as { combinations?: boolean }).combinations ? combined : single).push(performance.now() - start);
  }
  const asRequests = (list: object[]) => list.map((body) => ({ method: 'POST', path: '/api/matches/solve', headers, body: JSON.stringify(body) }));
  const requests = asRequests(bodies);
  const singlesOnly = asRequests(bodies.filter((body) => !(body as { combinations?: boolean }).combinations));
  const combosOnlyRequests = asRequests(bodies.filter((body) => (body as { combinations?: boolean }).combinations));
  await autocannon({ url, connections: CONNECTIONS, duration: WARMUP_SECONDS, requests: singlesOnly, timeout: 60 });
  await drain(url);
  const singles = await autocannon({ url, connections: CONNECTIONS, duration: SOLVE_SECONDS, requests: singlesOnly, timeout: 60 });
  await drain(url);
  const [mix, healthDuringMix] = await Promise.all([
    autocannon({ url, connections: CONNECTIONS, duration: SOLVE_SECONDS, requests, timeout: 60 }),
    autocannon({ url: `${url}/api/health`, connections: HEALTH_BESIDE_CONNECTIONS, duration: SOLVE_SECONDS, timeout: 60 }),
  ]);
  await drain(url);
  // Does a quick question wait behind the long ones? Single-part solves beside combinations only.
  const [combosOnly, singlesBesideCombos] = await Promise.all([
    autocannon({ url, connections: COMBINATION_CONNECTIONS, duration: SOLVE_SECONDS, requests: combosOnlyRequests, timeout: 60 }),
    autocannon({ url, connections: SINGLES_BESIDE_CONNECTIONS, duration: SOLVE_SECONDS, requests: singlesOnly, timeout: 60 }),
  ]);
  await drain(url);
  return { label, single, combined, singles, mix, healthDuringMix, combosOnly, singlesBesideCombos };
}

async function main(): Promise<void> {
  const baseDir = join(ROOT, 'tmp', 'load-bench-postgres');
  rmSync(baseDir, { recursive: true, force: true });
  const cluster = new PgCluster({ baseDir, port: await findFreePort(54369), fast: true });
  const servers: { stop(): Promise<void> }[] = [];
  try {
    cluster.ensureStarted();
    cluster.ensureDatabase('load_bench');
    const databaseUrl = cluster.url('load_bench');
    const sequelize = openDatabase(databaseUrl);
    initModels(sequelize);
    await migrate(sequelize);
    await createUser(sequelize, null, { email: 'stores@bench.example', name: 'Bench stores', role: 'stores', password: PASSWORD });
    await createUser(sequelize, null, { email: 'designer@bench.example', name: 'Bench designer', role: 'designer', password: PASSWORD });
    await sequelize.close();

    const threaded = await startServerProcess(databaseUrl, DEFAULT_THREADS);
    servers.push(threaded);
    const stores = await signIn(threaded.url, 'stores@bench.example');
    const csv = stockCsv(PARTS);
    const form = new FormData();
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'load-bench.csv');
    const imported = await fetch(`${threaded.url}/api/stock/imports`, { method: 'POST', headers: { Authorization: `Bearer ${stores}` }, body: form });
    const report = (await imported.json()) as { created?: number };
    if (imported.status !== 200) throw new Error(`the import answered ${imported.status}: ${JSON.stringify(report).slice(0, 400)}`);

    const bodies = solveBodies(200);
    const combos = bodies.filter((body) => (body as { combinations?: boolean }).combinations).length;
    console.log(
      `API under load: ${CONNECTIONS} connections on loopback, ${report.created} parts imported over HTTP, ` +
        `${bodies.length} solve bodies cycled (${combos} with combinations), server in its own process, PostgreSQL on 127.0.0.1:${cluster.port}`,
    );
    const health = await autocannon({ url: `${threaded.url}/api/health`, connections: CONNECTIONS, duration: HEALTH_SECONDS });
    await drain(threaded.url);
    const runs = [await runConfiguration(`${DEFAULT_THREADS} solve threads (default)`, threaded.url, bodies)];
    await threaded.stop();
    const onLoop = await startServerProcess(databaseUrl, 0);
    servers.push(onLoop);
    runs.push(await runConfiguration('solves on the event loop (SOLVE_THREADS=0)', onLoop.url, bodies));
    await onLoop.stop();

    const quantile = (values: number[], q: number) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.floor(q * values.length))];
    const rate = (r: AutocannonResult) => r.requests.total / r.duration;
    const codes = (r: AutocannonResult) => JSON.stringify(Object.fromEntries(Object.entries(r.statusCodeStats).map(([code, c]) => [code, c.count])));
    console.log(line(`GET /api/health alone, ${HEALTH_SECONDS} s`, health));
    for (const run of runs) {
      console.log(`  ${run.label}:`);
      console.log(
        `    one at a time (service time): singles median ${formatMs(quantile(run.single, 0.5))} (p90 ${formatMs(quantile(run.single, 0.9))}, ${run.single.length} bodies), ` +
          `with combinations median ${formatMs(quantile(run.combined, 0.5))} (p90 ${formatMs(quantile(run.combined, 0.9))}, ${run.combined.length} bodies)`,
      );
      console.log(line(`  solve, single parts only, ${SOLVE_SECONDS} s`, run.singles));
      console.log(line(`  solve, mix (${Math.round((100 * combos) / bodies.length)} % combinations), ${SOLVE_SECONDS} s`, run.mix));
      console.log(line(`  + GET /api/health beside it (${HEALTH_BESIDE_CONNECTIONS} clients)`, run.healthDuringMix));
      console.log(line(`  solve, combinations only (${COMBINATION_CONNECTIONS} clients), ${SOLVE_SECONDS} s`, run.combosOnly));
      console.log(line(`  + single-part solves beside it (${SINGLES_BESIDE_CONNECTIONS} clients)`, run.singlesBesideCombos));
      console.log(
        `    status codes: singles ${codes(run.singles)}, mix ${codes(run.mix)}, health beside ${codes(run.healthDuringMix)}, ` +
          `combinations ${codes(run.combosOnly)}, singles beside ${codes(run.singlesBesideCombos)}`,
      );
    }
    const [threads, loop] = runs;
    console.log(
      `  threads / event loop: singles ${(rate(threads.singles) / rate(loop.singles)).toFixed(2)}x req/s; mix ${(rate(threads.mix) / rate(loop.mix)).toFixed(2)}x req/s; ` +
        `health beside the mix p99 ${formatMs(threads.healthDuringMix.latency.p99)} against ${formatMs(loop.healthDuringMix.latency.p99)}; ` +
        `singles beside combinations p90 ${formatMs(threads.singlesBesideCombos.latency.p90)} against ${formatMs(loop.singlesBesideCombos.latency.p90)}`,
    );
  } finally {
    for (const server of servers) await server.stop();
    cluster.stop();
    rmSync(baseDir, { recursive: true, force: true });
  }
}

await main();
