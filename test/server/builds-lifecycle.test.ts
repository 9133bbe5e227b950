/**
 * A build's life (issue 6): reserved holds stock, built consumes on-hand stock, cancelled releases
 * it, planned holds nothing until reserved; every change is in the audit table; each role may do
 * only what product.md gives it, and everyone reads.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { createBuild } from '../../server/services/builds/create-build.js';
import { stockFile, stockRow, subGhzDesign } from './builds-scenario.js';

let t: TestApp;
let designer: { id: number; token: string };
let stores: { id: number; token: string };
let purchasing: { id: number; token: string };
let admin: { id: number; token: string };

const STOCK = [stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 10), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 100)];

beforeAll(async () => {
  t = await startTestApp();
  designer = await t.addUser('designer');
  stores = await t.addUser('stores');
  purchasing = await t.addUser('purchasing');
  admin = await t.addUser('admin');
  const upload = await uploadStock(t.app, stores.token, stockFile(...STOCK));
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
});
afterAll(async () => {
  await t?.close();
});

const as = (user: { token: string }) => ({
  get: (url: string) => request(t.app).get(url).set('Authorization', `Bearer ${user.token}`),
  patch: (url: string, body: object) => request(t.app).patch(url).set('Authorization', `Bearer ${user.token}`).send(body),
  post: (url: string, body: object = {}) => request(t.app).post(url).set('Authorization', `Bearer ${user.token}`).send(body),
});

const newBuild = (name: string, quantity: number, reserve = true) =>
  createBuild(t.sequelize, { name, quantity, reserve, plans: [{ matchId: 11, matchName: '868 MHz antenna', design: subGhzDesign() }] }, designer.id);

async function stock(): Promise<Record<string, { quantity: number; reserved: number }>> {
  const rows = await t.sequelize.query<{ part_number: string; quantity: number; reserved: number }>('SELECT part_number, quantity, reserved FROM parts ORDER BY part_number', { type: QueryTypes.SELECT });
  return Object.fromEntries(rows.map((r) => [r.part_number, { quantity: r.quantity, reserved: r.reserved }]));
}

const auditActions = async (buildId: number) =>
  (
    await t.sequelize.query<{ action: string; actor_id: number | null }>(`SELECT action, actor_id FROM audit_entries WHERE entity_type = 'build' AND entity_id = :id ORDER BY id`, {
      replacements: { id: String(buildId) },
      type: QueryTypes.SELECT,
    })
  ).map((r) => [r.action, r.actor_id]);

describe('built consumes on-hand stock', () => {
  it('takes what the build holds out of on hand and reserved, and only stores or admin may do it', async () => {
    const id = await newBuild('consume', 4);
    expect(await stock()).toEqual({ 'TW-C0402-6P8': { quantity: 10, reserved: 4 }, 'TW-L0402-10N': { quantity: 100, reserved: 4 } });

    for (const user of [designer, purchasing]) {
      const refused = await as(user).patch(`/api/builds/${id}`, { status: 'built' });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toMatch(/stores or admin/);
    }
    const res = await as(stores).patch(`/api/builds/${id}`, { status: 'built' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe('built');
    // 10 - 4 = 6 and 100 - 4 = 96 left on hand; nothing held any more.
    expect(await stock()).toEqual({ 'TW-C0402-6P8': { quantity: 6, reserved: 0 }, 'TW-L0402-10N': { quantity: 96, reserved: 0 } });
    const states = await t.sequelize.query<{ state: string; quantity: number }>('SELECT state, quantity FROM reservations WHERE build_id = :id', { replacements: { id }, type: QueryTypes.SELECT });
    expect(states).toEqual([{ state: 'consumed', quantity: 4 }, { state: 'consumed', quantity: 4 }]);
    expect(await auditActions(id)).toEqual([
      ['build.create', designer.id],
      ['build.reserve', designer.id],
      ['build.built', stores.id],
    ]);

    const again = await as(stores).patch(`/api/builds/${id}`, { status: 'built' });
    expect(again.status).toBe(409);
    expect((await as(designer).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(409);
  });
});

describe('cancelled releases', () => {
  it('gives back what the build held, leaves on hand alone, and only designer or admin may do it', async () => {
    const before = await stock();
    const id = await newBuild('release', 3);
    expect((await stock())['TW-C0402-6P8'].reserved).toBe(before['TW-C0402-6P8'].reserved + 3);

    expect((await as(stores).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(403);
    expect((await as(purchasing).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(403);
    const res = await as(designer).patch(`/api/builds/${id}`, { status: 'cancelled' });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('cancelled');
    expect(res.body.lines.every((l: { reserved: number }) => l.reserved === 0)).toBe(true);
    expect(await stock()).toEqual(before);
    expect((await auditActions(id)).map(([action]) => action)).toEqual(['build.create', 'build.reserve', 'build.cancel']);
    expect((await as(admin).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(409);
    expect((await as(stores).patch(`/api/builds/${id}`, { status: 'built' })).status).toBe(409);
  });
});

describe('planned holds nothing until reserved', () => {
  it('reserves on request, once, for designers and admins only', async () => {
    const before = await stock();
    const id = await newBuild('later', 2, false);
    expect(await stock()).toEqual(before);
    const planned = await as(purchasing).get(`/api/builds/${id}`);
    expect(planned.body).toMatchObject({ status: 'planned', lines: [], shortfall: { lines: [] } });

    expect((await as(stores).post(`/api/builds/${id}/reserve`)).status).toBe(403);
    const res = await as(admin).post(`/api/builds/${id}/reserve`);
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('reserved');
    expect(res.body.lines.map((l: { partNumber: string; needed: number; reserved: number }) => [l.partNumber, l.needed, l.reserved])).toEqual([
      ['TW-C0402-6P8', 2, 2],
      ['TW-L0402-10N', 2, 2],
    ]);
    expect((await as(admin).post(`/api/builds/${id}/reserve`)).status).toBe(409);
    // Release it again so later tests see the stock as before.
    expect((await as(admin).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(200);
  });
});

describe('a stock count below what a build holds', () => {
  it('refuses to mark it built and names the part, until the stock list is right', async () => {
    const id = await newBuild('recount', 5);
    // Stores count only 2 of the capacitor (5 are held for this build): the importer warns and applies.
    const recount = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 2)));
    expect(recount.status).toBe(200);
    expect(recount.body.warnings.map((w: { message: string }) => w.message).join()).toMatch(/below the 5 reserved/);
    const refused = await as(stores).patch(`/api/builds/${id}`, { status: 'built' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/TW-C0402-6P8 at main has 2 for 5 held/);
    expect((await stock())['TW-C0402-6P8']).toEqual({ quantity: 2, reserved: 5 });
    expect((await as(designer).patch(`/api/builds/${id}`, { status: 'cancelled' })).status).toBe(200);
  });
});

describe('reading', () => {
  it('lets every role read builds and their shortfall lists, and nobody without a token', async () => {
    const id = await newBuild('read', 1);
    for (const user of [designer, stores, purchasing, admin]) {
      const list = await as(user).get('/api/builds');
      expect(list.status).toBe(200);
      expect(list.body.items.some((b: { id: number; name: string }) => b.id === id && b.name === 'read')).toBe(true);
      expect((await as(user).get(`/api/builds/${id}`)).status).toBe(200);
      expect((await as(user).get(`/api/builds/${id}/shortfall`)).status).toBe(200);
      expect((await as(user).get(`/api/builds/${id}/shortfall.csv`)).status).toBe(200);
    }
    expect((await request(t.app).get('/api/builds')).status).toBe(401);
    expect((await request(t.app).get(`/api/builds/${id}`)).status).toBe(401);
    expect((await as(designer).get('/api/builds/999999')).status).toBe(404);
    const bad = await as(designer).get('/api/builds/abc');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/"abc"/);
  });

  it('refuses a malformed new build with the field named, before reading any match', async () => {
    const cases: [object, RegExp][] = [
      [{ name: '', quantity: 1, matchIds: [1] }, /name/],
      [{ name: 'x', quantity: 0, matchIds: [1] }, /quantity/],
      [{ name: 'x', quantity: 1.5, matchIds: [1] }, /whole number/],
      [{ name: 'x', quantity: 1, matchIds: [] }, /at least one saved match/],
      [{ name: 'x', quantity: 1, matchIds: [3, 3] }, /once/],
      [{ name: 'x', quantity: 1, matchIds: [1], extra: true }, /extra/],
    ];
    for (const [body, message] of cases) {
      const res = await as(designer).post('/api/builds', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.message).toMatch(message);
    }
    expect((await as(stores).post('/api/builds', { name: 'x', quantity: 1, matchIds: [1] })).status).toBe(403);
    expect((await as(purchasing).post('/api/builds', { name: 'x', quantity: 1, matchIds: [1] })).status).toBe(403);
  });
});
