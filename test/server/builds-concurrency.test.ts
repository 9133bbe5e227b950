/**
 * Concurrency (handbook quality.md): many builds reserving one scarce part at once never oversell.
 * 50 builds of one board each, sent together to `POST /api/builds`, each needing one 6.8 pF
 * capacitor of which 10 are on hand and nothing else within the loss budget: exactly 10 get it, the other 40 carry it on
 * their shortfall lists, and PostgreSQL itself shows no more reserved than on hand.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import type { BuildResponse } from '../../shared/api/builds.js';
import { stockFile, stockRow } from './builds-scenario.js';

let t: TestApp;
let designer: { id: number; token: string };
let matchId: number;

beforeAll(async () => {
  t = await startTestApp();
  const stores = await t.addUser('stores');
  designer = await t.addUser('designer');
  const upload = await uploadStock(
    t.app,
    stores.token,
    stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 10), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 500)),
  );
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
  // The designer saves the 868 MHz match with the fit the snapper ranks first: the stock has one
  // capacitor and one inductor, so it is shunt TW-C0402-6P8 and series TW-L0402-10N.
  const saved = await request(t.app)
    .post('/api/matches')
    .set('Authorization', `Bearer ${designer.token}`)
    .send({ name: '868 MHz antenna', request: { source: 50, load: '12-j35', frequencyHz: '868MHz' }, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } });
  expect(saved.status, JSON.stringify(saved.body)).toBe(201);
  matchId = saved.body.id;
});
afterAll(async () => {
  await t?.close();
});

describe('50 builds at once against 10 on hand', () => {
  it('reserves exactly 10, lists the other 40 as short, and never holds more than is on hand', async () => {
    const answers = await Promise.all(
      Array.from({ length: 50 }, (_, i) =>
        request(t.app).post('/api/builds').set('Authorization', `Bearer ${designer.token}`).send({ name: `node-${i}`, quantity: 1, matchIds: [matchId] }),
      ),
    );
    for (const answer of answers) expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    const ids = answers.map((a) => a.body.id as number);
    expect(new Set(ids).size).toBe(50);
    const builds: BuildResponse[] = answers.map((a) => a.body);

    const capacitorLine = (b: (typeof builds)[number]) => b.lines.find((l) => l.position === 'shunt')!;
    const got = builds.filter((b) => capacitorLine(b).reserved === 1);
    const short = builds.filter((b) => capacitorLine(b).reserved === 0);
    expect(got).toHaveLength(10);
    expect(short).toHaveLength(40);
    for (const b of builds) {
      expect(b.status).toBe('reserved');
      expect(capacitorLine(b)).toMatchObject({ partNumber: 'TW-C0402-6P8', needed: 1 });
      // The inductor is plentiful: every build holds its one.
      expect(b.lines.find((l) => l.position === 'series')).toMatchObject({ partNumber: 'TW-L0402-10N', needed: 1, reserved: 1 });
    }
    for (const b of got) expect(b.shortfall.lines).toEqual([]);
    for (const b of short) {
      expect(b.shortfall.lines).toHaveLength(1);
      // Buy-to 6.8 pF: 6.5257 pF in E24 sits between 6.2 and 6.8; ln(6.5257/6.2) = 0.0512 > ln(6.8/6.5257) = 0.0412.
      // Quantity: 1 short x 1.05 = 1.05 -> 2. Minimum SRF: 868 MHz / 0.5 = 1.736 GHz.
      expect(b.shortfall.lines[0]).toMatchObject({ kind: 'capacitor', buyValue: 6.8e-12, series: 'E24', quantity: 2, shortQuantity: 1, reason: 'short-stock', package: '0402' });
      expect(b.shortfall.lines[0].minSrfHz).toBeCloseTo(1.736e9, 0);
    }

    // The database agrees: reserved equals what the held reservations add up to, and stays within on hand.
    const rows = await t.sequelize.query<{ part_number: string; quantity: number; reserved: number; held: string }>(
      `SELECT p.part_number, p.quantity, p.reserved, COALESCE(SUM(r.quantity) FILTER (WHERE r.state = 'held'), 0) AS held
       FROM parts p LEFT JOIN reservations r ON r.part_id = p.id GROUP BY p.id ORDER BY p.part_number`,
      { type: QueryTypes.SELECT },
    );
    expect(rows.map((r) => [r.part_number, r.quantity, r.reserved, Number(r.held)])).toEqual([
      ['TW-C0402-6P8', 10, 10, 10],
      ['TW-L0402-10N', 500, 50, 50],
    ]);
    for (const r of rows) expect(r.reserved).toBeLessThanOrEqual(r.quantity);

    // And so does the stock list: nothing of the capacitor is available any more.
    const parts = await request(t.app).get('/api/parts?search=TW-C0402-6P8').set('Authorization', `Bearer ${designer.token}`);
    expect(parts.body.items[0]).toMatchObject({ quantity: 10, reserved: 10, available: 0 });
  });
});

describe('builds and stock imports at once', () => {
  it('neither deadlocks nor loses a reservation: reserved always equals what held builds add up to', async () => {
    const stores = await t.addUser('stores');
    const recount = (n: number) =>
      uploadStock(t.app, stores.token, stockFile(stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 500 + n)), { fileName: `recount-${n}.csv` });
    const builds = Array.from({ length: 20 }, (_, i) =>
      request(t.app).post('/api/builds').set('Authorization', `Bearer ${designer.token}`).send({ name: `mixed-${i}`, quantity: 2, matchIds: [matchId] }),
    );
    const imports = Array.from({ length: 5 }, (_, i) => recount(i + 1));
    const [built, uploaded] = await Promise.all([Promise.all(builds), Promise.all(imports)]);
    expect(built.map((b) => b.status)).toEqual(Array(20).fill(201));
    expect(uploaded.map((r) => r.status)).toEqual([200, 200, 200, 200, 200]);

    const rows = await t.sequelize.query<{ part_number: string; quantity: number; reserved: number; held: string }>(
      `SELECT p.part_number, p.quantity, p.reserved, COALESCE(SUM(r.quantity) FILTER (WHERE r.state = 'held'), 0) AS held
       FROM parts p LEFT JOIN reservations r ON r.part_id = p.id GROUP BY p.id ORDER BY p.part_number`,
      { type: QueryTypes.SELECT },
    );
    // The capacitor was all held already; 50 + 20 x 2 = 90 inductors are held; the last recount decides on hand.
    expect(rows.map((r) => [r.part_number, r.reserved, Number(r.held)])).toEqual([
      ['TW-C0402-6P8', 10, 10],
      ['TW-L0402-10N', 90, 90],
    ]);
    expect(rows[1].quantity).toBeGreaterThanOrEqual(501);
    expect(rows[1].quantity).toBeLessThanOrEqual(505);
  });
});
