/**
 * `POST /api/builds` end to end (api.md "Builds and shortfall lists"): a designer saves a match
 * through `POST /api/matches`, plans a build from it, and gets api.md's shape back; the shortfall
 * list follows the organisation settings (attrition, preferred E-series) as an admin sets them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { MAX_MATCHES_PER_BUILD } from '../../shared/api/builds.js';
import { SUB_GHZ_SHUNT_C_F, stockFile, stockRow } from './builds-scenario.js';

let t: TestApp;
let designer: { id: number; token: string };
let admin: { id: number; token: string };
let matchId: number;

beforeAll(async () => {
  t = await startTestApp();
  const stores = await t.addUser('stores');
  designer = await t.addUser('designer');
  admin = await t.addUser('admin');
  const upload = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 3), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 100)));
  expect(upload.status).toBe(200);
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

const post = (body: object, token = designer.token) => request(t.app).post('/api/builds').set('Authorization', `Bearer ${token}`).send(body);

describe('POST /api/builds', () => {
  it("answers api.md's shape: id, status, lines per part, and the shortfall lines", async () => {
    const res = await post({ name: 'NODE-868 first run', quantity: 5, matchIds: [matchId] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ id: expect.any(Number), status: 'reserved', name: 'NODE-868 first run', quantity: 5, moves: [] });
    expect(res.body.lines).toEqual([
      expect.objectContaining({ matchId, position: 'shunt', partNumber: 'TW-C0402-6P8', needed: 5, reserved: 3 }),
      expect.objectContaining({ matchId, position: 'series', partNumber: 'TW-L0402-10N', needed: 5, reserved: 5 }),
    ]);
    expect(res.body.shortfall.lines).toHaveLength(1);
    const [line] = res.body.shortfall.lines;
    // 5 - 3 = 2 short -> 2 x 1.05 = 2.1 -> 3; 6.5257 pF in E24 -> 6.8 pF; 868 MHz / 0.5 = 1.736 GHz.
    expect(line).toMatchObject({ kind: 'capacitor', buyValue: 6.8e-12, series: 'E24', quantity: 3, package: '0402', reason: 'short-stock' });
    expect(line.idealValue).toBeCloseTo(SUB_GHZ_SHUNT_C_F, 15);
    expect(line.minSrfHz).toBeCloseTo(1.736e9, 0);
    expect(Object.keys(line)).toEqual(expect.arrayContaining(['kind', 'idealValue', 'buyValue', 'series', 'quantity', 'minSrfHz', 'tolerance', 'package', 'reason']));
    const again = await request(t.app).get(`/api/builds/${res.body.id}`).set('Authorization', `Bearer ${admin.token}`);
    expect(again.body).toEqual(res.body);
  });

  it('follows the organisation settings: attrition and preferred series', async () => {
    const settings = await request(t.app).put('/api/settings').set('Authorization', `Bearer ${admin.token}`).send({ attritionPercent: 10, preferredSeries: { capacitor: 'E3' } });
    expect(settings.status, JSON.stringify(settings.body)).toBe(200);
    const res = await post({ name: 'NODE-868 second run', quantity: 4, matchIds: [matchId] });
    expect(res.status).toBe(201);
    const [line] = res.body.shortfall.lines;
    // Nothing of the capacitor is left: 4 short -> 4 x 1.10 = 4.4 -> 5.
    // 6.5257 pF in E3 (4.7, 10): ln(6.5257/4.7) = 0.328 < ln(10/6.5257) = 0.427 -> 4.7 pF.
    expect(line).toMatchObject({ kind: 'capacitor', buyValue: 4.7e-12, series: 'E3', shortQuantity: 4, quantity: 5 });
    const list = await request(t.app).get(`/api/builds/${res.body.id}/shortfall`).set('Authorization', `Bearer ${designer.token}`);
    expect(list.body.list).toMatchObject({ attritionPercent: 10, lossBudgetDb: 0.5 });
    // The inductor is held in full (100 - 5 = 95 left), so it is not on the list.
    expect(res.body.lines[1]).toMatchObject({ partNumber: 'TW-L0402-10N', reserved: 4 });
    expect(res.body.shortfall.lines).toHaveLength(1);
  });

  it('names the ids that are not saved matches', async () => {
    const res = await post({ name: 'x', quantity: 1, matchIds: [matchId, 98765, 98766] });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('Saved matches 98765, 98766 were not found.');
    expect(res.body.error.details.map((d: { value: number }) => d.value)).toEqual([98765, 98766]);
    expect((await post({ name: 'x', quantity: 1, matchIds: [matchId] }, admin.token)).status).toBe(201);
  });

  it('refuses a board of more matches than MAX_MATCHES_PER_BUILD, or one match listed twice, and plans nothing', async () => {
    const before = await request(t.app).get('/api/builds').set('Authorization', `Bearer ${designer.token}`);
    const tooMany = await post({ name: 'x', quantity: 1, matchIds: Array.from({ length: MAX_MATCHES_PER_BUILD + 1 }, () => matchId).map((id, i) => id + i) });
    expect(tooMany.status).toBe(400);
    expect(JSON.stringify(tooMany.body.error)).toContain(`a board may carry at most ${MAX_MATCHES_PER_BUILD} matches`);
    expect(tooMany.body.error.details.some((d: { field: string }) => d.field === 'matchIds')).toBe(true);
    const twice = await post({ name: 'x', quantity: 1, matchIds: [matchId, matchId] });
    expect(twice.status).toBe(400);
    expect(JSON.stringify(twice.body.error)).toContain('list each match once');
    const after = await request(t.app).get('/api/builds').set('Authorization', `Bearer ${designer.token}`);
    expect(after.body.total).toBe(before.body.total);
  });
});

describe('GET /api/builds?search=', () => {
  const list = async (query: string) => {
    const res = await request(t.app).get(`/api/builds?${query}`).set('Authorization', `Bearer ${designer.token}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return { names: (res.body.items as { name: string }[]).map((b) => b.name), total: res.body.total as number };
  };

  beforeAll(async () => {
    await t.sequelize.query('TRUNCATE reservations, shortfall_lines, shortfall_lists, build_matches, builds CASCADE');
    for (const [name, reserve] of [['Soil node rev B', true], ['soil node rev C', false], ['Gateway 40.68 MHz', true], ['Odd 100%_batch', false]] as const) {
      expect((await post({ name, quantity: 1, matchIds: [matchId], reserve })).status).toBe(201);
    }
  });

  it('keeps the builds whose name holds the text, in any case, newest first, with their total, beside the status filter', async () => {
    expect(await list('search=SOIL%20NODE')).toEqual({ names: ['soil node rev C', 'Soil node rev B'], total: 2 });
    expect(await list('search=soil&pageSize=1')).toEqual({ names: ['soil node rev C'], total: 2 });
    expect(await list('search=soil&status=reserved')).toEqual({ names: ['Soil node rev B'], total: 1 });
    expect(await list('search=%20%20')).toEqual({ names: expect.any(Array), total: 4 });
    expect(await list('search=nothing%20like%20it')).toEqual({ names: [], total: 0 });
  });

  it('reads % and _ as themselves, and refuses a search over 200 characters naming it', async () => {
    expect(await list(`search=${encodeURIComponent('%_')}`)).toEqual({ names: ['Odd 100%_batch'], total: 1 });
    const res = await request(t.app).get(`/api/builds?search=${'x'.repeat(201)}`).set('Authorization', `Bearer ${designer.token}`);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('search');
  });
});
