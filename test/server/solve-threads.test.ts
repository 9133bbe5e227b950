/**
 * Solves run on worker threads (server/services/matches/solve-pool.ts). What crosses the thread
 * boundary must come back unchanged: the route's answer equals snapMatch run in this process on
 * the same stock and settings (typed and measured loads, with combinations); a thread never
 * answers from an index of stock it has not been sent (each stock change reaches every thread);
 * and the engine's refusals come back as the same EngineInputError, message and details; and a
 * single-part solve is answered while combination searches fill every thread (its own lane); and
 * the solve of a caller that closed its connection is given up, not run; and health shows each lane's
 * running and queued solves.
 * The engine's numbers themselves are checked against outside sources in test/engine/.
 */
import { readFileSync } from 'node:fs';
import { createServer, request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { setTimeout as sleep } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { loadDemoStock } from '../../seeds/load-demo-stock.js';
import { DEMO_ANTENNA_FILE } from '../../seeds/make-demo-antenna.js';
import { parseSolveRequest } from '../../shared/engine/solve-request.js';
import { isEngineInputError } from '../../shared/engine/engine-input-error.js';
import { snapMatch, type SnapSettings } from '../../shared/snapping/snap-match.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';
import { loadSolveStock } from '../../server/services/matches/load-stock-index.js';
import { closeSolvePool, laneOf, snapOnThread, solveCounts, solveLoad, solveThreads } from '../../server/services/matches/solve-pool.js';
import { readSettings } from '../../server/services/settings/read-settings.js';

let t: TestApp;
let token = '';

beforeAll(async () => {
  t = await startTestApp();
  token = (await t.addUser('designer')).token;
  await loadDemoStock(t.sequelize);
});
afterAll(async () => {
  await closeSolvePool();
  await t?.close();
});

async function settings(): Promise<SnapSettings> {
  const org = await readSettings();
  return { usableSrfFraction: org.usableSrfFraction, excludeAboveLimit: org.excludeAboveLimit, defaultObjective: org.defaultObjective, lossBudgetDb: org.lossBudgetDb };
}

/** snapMatch in this process, on the stock as the route reads it. */
async function inProcess(body: Record<string, unknown>) {
  const input = parseSolveRequest(body);
  const { parts } = await loadSolveStock(t.sequelize, { location: input.location });
  return snapMatch(input, buildStockIndex(parts), await settings(), { objectiveGiven: body.objective !== undefined, location: input.location });
}

async function onThread(body: Record<string, unknown>) {
  const res = await request(t.app).post('/api/matches/solve').set('Authorization', `Bearer ${token}`).send(body);
  expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
  return res.body;
}

/** Waits (polling) until `done()`; fails after 20 s, naming what it waited for. */
async function until(done: () => boolean, what: string): Promise<void> {
  for (const start = Date.now(); !done(); await sleep(5)) {
    if (Date.now() - start > 20_000) throw new Error(`waited 20 s for ${what}`);
  }
}

const measured = () => ({ fileName: DEMO_ANTENNA_FILE.split('/').pop(), text: readFileSync(DEMO_ANTENNA_FILE, 'utf8') });

describe('solves on worker threads', () => {
  it('answer as snapMatch does in this process, typed and measured, with combinations', async () => {
    const bodies: Record<string, unknown>[] = [
      { source: 50, load: '12-j35', frequencyHz: '868MHz', objective: 'nominal' },
      { source: 50, load: '12-j35', frequencyHz: '868MHz', bandwidthHz: '20MHz', combinations: true, objective: 'worst-case', fitsPerNetwork: 3 },
      { source: 50, loadTouchstone: measured(), frequencyHz: '868MHz', bandwidthHz: '10MHz', objective: 'band' },
    ];
    for (const body of bodies) {
      // JSON both ways: the route's answer went through res.json().
      expect(await onThread(body)).toEqual(JSON.parse(JSON.stringify(await inProcess(body))));
    }
  });

  it('never answer from an index of stock a thread was not sent', async () => {
    const body = { source: 50, load: '12-j35', frequencyHz: '868MHz', objective: 'nominal', fitsPerNetwork: 1 };
    const first = (answer: { networks: { fits: { elements: { parts: { partNumber: string }[] }[] }[] }[] }) =>
      answer.networks.find((n) => n.fits.length > 0)!.fits[0].elements[0].parts[0].partNumber;
    // Enough solves that every thread has indexed this stock.
    expect(solveThreads()).toBeGreaterThan(0);
    const before = await Promise.all(Array.from({ length: solveThreads() * 3 }, () => onThread(body)));
    const chosen = first(before[0]);
    expect(new Set(before.map(first))).toEqual(new Set([chosen]));
    await t.sequelize.query('UPDATE parts SET quantity = 0 WHERE part_number = :chosen', { replacements: { chosen } });
    const after = await Promise.all(Array.from({ length: solveThreads() * 3 }, () => onThread(body)));
    for (const answer of after) expect(first(answer)).not.toBe(chosen);
    expect(after[0]).toEqual(JSON.parse(JSON.stringify(await inProcess(body))));
  });

  it('answer a single-part solve while combination searches fill every thread of theirs', async () => {
    const stock = await loadSolveStock(t.sequelize, { location: null });
    const s = await settings();
    const single = parseSolveRequest({ source: 50, load: '12-j35', frequencyHz: '868MHz', objective: 'nominal', fitsPerNetwork: 1 });
    const search = parseSolveRequest({ source: 50, load: '12-j35', frequencyHz: '868MHz', bandwidthHz: '20MHz', combinations: true, objective: 'worst-case', fitsPerNetwork: 3 });
    expect([laneOf(single), laneOf(search)]).toEqual(['single', 'combinations']);
    const solve = (input: typeof single) => snapOnThread(input, s, {}, stock);
    const n = solveThreads();
    // Every thread of both lanes started, with this stock indexed, so no start-up is timed below.
    await Promise.all([...Array.from({ length: n }, () => solve(single)), ...Array.from({ length: n }, () => solve(search))]);
    const finished: string[] = [];
    const searches = Array.from({ length: 2 * n }, (_, i) => solve(search).then(() => finished.push(`search ${i}`)));
    const quick = solve(single).then(() => finished.push('single'));
    await Promise.all([...searches, quick]);
    // Asked last, behind twice as many searches as there are threads: in one queue it would wait
    // for n of them to end.
    expect(finished[0]).toBe('single');
  });

  it('show in health how many solves each lane runs and queues', async () => {
    const stock = await loadSolveStock(t.sequelize, { location: null });
    const s = await settings();
    const search = parseSolveRequest({ source: 50, load: '12-j35', frequencyHz: '868MHz', bandwidthHz: '20MHz', combinations: true, objective: 'worst-case', fitsPerNetwork: 3 });
    const n = solveThreads();
    const idle = { threadsPerLane: n, single: { running: 0, queued: 0 }, combinations: { running: 0, queued: 0 } };
    // Every combination thread started and idle, so the next searches go straight to one.
    await Promise.all(Array.from({ length: n }, () => snapOnThread(search, s, {}, stock)));
    expect((await request(t.app).get('/api/health')).body.solves).toEqual(idle);
    // n + 2 searches: n run (a thread each) and 2 wait, counted before any can end.
    const searches = Array.from({ length: n + 2 }, () => snapOnThread(search, s, {}, stock));
    try {
      expect(solveLoad()).toEqual({ threadsPerLane: n, single: { running: 0, queued: 0 }, combinations: { running: n, queued: 2 } });
      // Through the route some may have ended meanwhile, but never more run than the lane has threads.
      const health = await request(t.app).get('/api/health');
      expect(health.status).toBe(200);
      const { single, combinations } = health.body.solves;
      expect(single).toEqual({ running: 0, queued: 0 });
      expect(combinations.running).toBeLessThanOrEqual(n);
      expect(combinations.running + combinations.queued).toBeLessThanOrEqual(n + 2);
      if (combinations.queued > 0) expect(combinations.running).toBe(n);
    } finally {
      await Promise.all(searches);
    }
    expect((await request(t.app).get('/api/health')).body.solves).toEqual(idle);
  });

  it('give up the solve of a caller that closed its connection', async () => {
    const stock = await loadSolveStock(t.sequelize, { location: null });
    const s = await settings();
    const searchBody = { source: 50, load: '12-j35', frequencyHz: '868MHz', bandwidthHz: '20MHz', combinations: true, objective: 'worst-case', fitsPerNetwork: 3 };
    const search = parseSolveRequest(searchBody);
    const n = solveThreads();
    const { abandoned: before } = solveCounts();
    // Every combination thread busy, and as many searches queued, so the request below waits.
    const busy = Array.from({ length: 2 * n }, () => snapOnThread(search, s, {}, stock));
    const server = createServer(t.app);
    await new Promise<void>((ready) => server.listen(0, '127.0.0.1', () => ready()));
    try {
      const { port } = server.address() as AddressInfo;
      const payload = JSON.stringify(searchBody);
      const call = httpRequest({ host: '127.0.0.1', port, method: 'POST', path: '/api/matches/solve', headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(payload) } });
      const closed = new Promise<void>((done) => call.on('close', () => done()));
      call.on('error', () => undefined);
      call.end(payload);
      await until(() => solveCounts().inFlight > 2 * n, 'the request to reach the solve queue');
      call.destroy();
      await closed;
      await until(() => solveCounts().abandoned > before, 'the server to give the solve up');
    } finally {
      await new Promise((done) => server.close(done));
    }
    await Promise.all(busy);
    expect(solveCounts()).toEqual({ inFlight: 0, abandoned: before + 1 });
  });

  it('bring the engine refusals back as the same EngineInputError', async () => {
    const input = parseSolveRequest({ source: 50, load: '12-j35', frequencyHz: '868MHz' });
    // Past the request reader, as no request can be: a negative frequency reaches the engine.
    const bad = { ...input, frequencyHz: -1 };
    const { parts, key, fingerprint } = await loadSolveStock(t.sequelize, { location: null });
    const s = await settings();
    let here: unknown;
    try {
      snapMatch(bad, buildStockIndex(parts), s, {});
    } catch (error) {
      here = error;
    }
    expect(isEngineInputError(here)).toBe(true);
    const there = await snapOnThread(bad, s, {}, { key, fingerprint, parts }).then(
      () => null,
      (error: unknown) => error,
    );
    expect(isEngineInputError(there)).toBe(true);
    const fields = (e: unknown) => {
      const error = e as { message: string; field: string; details: unknown };
      return { message: error.message, field: error.field, details: error.details };
    };
    expect(fields(there)).toEqual(fields(here));
  });
});
