/**
 * Organisation settings against real PostgreSQL: defaults, who may read and change them, the audit
 * entry, refusals naming the field, and their effect on solving (the default objective and the
 * exclusion of above-limit parts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, csvFile, uploadStock } from '../fixtures/stock/stock-upload.js';

let t: TestApp;
let admin: { id: number; token: string };
let designer: { id: number; token: string };
let stores: { id: number; token: string };
let purchasing: { id: number; token: string };
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.addUser('admin');
  designer = await t.addUser('designer');
  stores = await t.addUser('stores');
  purchasing = await t.addUser('purchasing');
});
afterAll(async () => {
  await t?.close();
});
const as = (who: { token: string }, r: request.Test) => r.set('Authorization', `Bearer ${who.token}`);

describe('GET and PUT /api/settings', () => {
  it('starts with the defaults and is readable by every role', async () => {
    for (const who of [admin, designer, stores, purchasing]) {
      const res = await as(who, request(t.app).get('/api/settings'));
      expect(res.status).toBe(200);
      expect(res.body).toEqual({
        usableSrfFraction: 0.5,
        excludeAboveLimit: false,
        defaultObjective: 'worst-case',
        lossBudgetDb: 0.5,
        preferredSeries: { capacitor: 'E24', inductor: 'E12' },
        attritionPercent: 5,
        updatedAt: null,
        updatedBy: null,
      });
    }
    expect((await request(t.app).get('/api/settings')).status).toBe(401);
  });

  it('lets only admins change them, keeps the fields not given, and audits the change', async () => {
    for (const who of [designer, stores, purchasing]) expect((await as(who, request(t.app).put('/api/settings')).send({ lossBudgetDb: 1 })).status).toBe(403);
    const res = await as(admin, request(t.app).put('/api/settings')).send({ lossBudgetDb: 0.8, preferredSeries: { inductor: 'E24' }, attritionPercent: 7.5 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ lossBudgetDb: 0.8, preferredSeries: { capacitor: 'E24', inductor: 'E24' }, attritionPercent: 7.5, usableSrfFraction: 0.5, updatedBy: { id: admin.id } });
    expect(Date.parse(res.body.updatedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect((await as(purchasing, request(t.app).get('/api/settings'))).body.lossBudgetDb).toBe(0.8);
    const audit = await t.sequelize.query<{ actor_id: number; before: { lossBudgetDb: number }; after: { lossBudgetDb: number } }>(
      "SELECT actor_id, before, after FROM audit_entries WHERE action = 'settings.update'",
      { type: QueryTypes.SELECT },
    );
    expect(audit).toEqual([expect.objectContaining({ actor_id: admin.id, before: expect.objectContaining({ lossBudgetDb: 0.5 }), after: expect.objectContaining({ lossBudgetDb: 0.8 }) })]);
  });

  it('refuses bad values with 400 naming each field, and changes nothing', async () => {
    const res = await as(admin, request(t.app).put('/api/settings')).send({ usableSrfFraction: 1.5, lossBudgetDb: -1, defaultObjective: 'best', preferredSeries: { capacitor: 'E5' }, attritionPercent: 'lots' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual(['attritionPercent', 'defaultObjective', 'lossBudgetDb', 'preferredSeries.capacitor', 'usableSrfFraction']);
    expect((await as(admin, request(t.app).put('/api/settings')).send({ colour: 'teal' })).status).toBe(400);
    expect((await as(admin, request(t.app).put('/api/settings')).send({})).status).toBe(400);
    expect((await as(admin, request(t.app).get('/api/settings'))).body.usableSrfFraction).toBe(0.5);
  });
});

describe('settings in a solve', () => {
  const REQUEST = { source: 50, load: 12.5, frequencyHz: '100MHz' };
  beforeAll(async () => {
    const stock = csvFile(
      FULL_HEADER,
      'SC-56P,C,56p,5%,150MHz,,,0.05,100,0402,50V,,main,E12,0.0100,,',
      'SC-47P,C,47p,5%,2GHz,,,0.05,100,0402,50V,,main,E12,0.0100,,',
      'SL-33N,L,33n,5%,2GHz,40,100MHz,,100,0402,,0.5A,main,E24,0.0300,,',
    );
    expect((await uploadStock(t.app, stores.token, stock)).status).toBe(200);
  });
  const usesAboveLimit = (body: { networks: { fits: { elements: { parts: { partNumber: string }[] }[] }[] }[] }) =>
    body.networks.some((n) => n.fits.some((f) => f.elements.some((e) => e.parts.some((p) => p.partNumber === 'SC-56P'))));

  it('ranks by the default objective when the request names none, and the request wins when it does', async () => {
    expect((await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body.snapping.objective).toBe('worst-case');
    await as(admin, request(t.app).put('/api/settings')).send({ defaultObjective: 'nominal' });
    expect((await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body.snapping.objective).toBe('nominal');
    expect((await as(designer, request(t.app).post('/api/matches/solve')).send({ ...REQUEST, objective: 'worst-case' })).body.snapping.objective).toBe('worst-case');
  });

  it('excludes above-limit parts when the setting says so, unless the request overrides it', async () => {
    expect(usesAboveLimit((await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body)).toBe(true);
    await as(admin, request(t.app).put('/api/settings')).send({ excludeAboveLimit: true });
    expect(usesAboveLimit((await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body)).toBe(false);
    expect(usesAboveLimit((await as(designer, request(t.app).post('/api/matches/solve')).send({ ...REQUEST, excludeAboveLimit: false })).body)).toBe(true);
  });

  it('judges yield against the loss budget in force', async () => {
    await as(admin, request(t.app).put('/api/settings')).send({ lossBudgetDb: 0.01 });
    const tight = (await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body.networks[0].fits[0];
    await as(admin, request(t.app).put('/api/settings')).send({ lossBudgetDb: 20 });
    const loose = (await as(designer, request(t.app).post('/api/matches/solve')).send(REQUEST)).body.networks[0].fits[0];
    expect(tight.yieldBudgetDb).toBe(0.01);
    expect(loose.yield).toBe(1);
    // With E12 5 % parts the loss always exceeds 0.01 dB, so no sample is within the tight budget.
    expect(tight.loss.totalDb).toBeGreaterThan(0.01);
    expect(tight.yield).toBe(0);
  });
});
