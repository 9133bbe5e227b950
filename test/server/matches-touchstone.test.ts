/**
 * `GET /api/matches/:id/touchstone`: a saved match of the demo scenario (868 MHz chip antenna,
 * 12 - j35 ohm, on the demo stock) as a Touchstone 2-port file that reads back with the project's
 * reader, holds f0 as a point, names its parts, and describes a passive network.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { loadDemoStock } from '../../seeds/load-demo-stock.js';
import { readTwoPortTouchstone } from '../../shared/touchstone/index.js';

let t: TestApp;
let token = '';
let matchId = 0;
let partNumbers: string[] = [];

beforeAll(async () => {
  t = await startTestApp();
  token = (await t.addUser('designer')).token;
  await loadDemoStock(t.sequelize);
  const req = { source: '50', load: '12-j35', frequencyHz: '868MHz', objective: 'nominal' };
  const solved = await request(t.app).post('/api/matches/solve').set('Authorization', `Bearer ${token}`).send(req);
  const network = solved.body.networks.find((n: { fits: unknown[] }) => n.fits.length > 0);
  partNumbers = network.fits[0].elements.flatMap((e: { parts: { partNumber: string }[] }) => e.parts.map((p) => p.partNumber));
  const saved = await request(t.app)
    .post('/api/matches')
    .set('Authorization', `Bearer ${token}`)
    .send({ name: 'Soil node 868 MHz antenna', request: req, chosen: { placement: network.placement, solution: network.solution, rank: 1 } });
  expect(saved.status).toBe(201);
  matchId = saved.body.id;
});
afterAll(async () => {
  await t?.close();
});

describe('Touchstone download of a saved match', () => {
  it('writes the fitted network as a 2-port file that reads back, with f0 as a point and the parts named', async () => {
    const res = await request(t.app).get(`/api/matches/${matchId}/touchstone`).set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="soil-node-868-mhz-antenna-fit\.s2p"/);
    const data = readTwoPortTouchstone(res.text);
    expect(data.referenceOhm).toEqual([50, 50]);
    expect(Array.from(data.frequencyHz)).toContain(868e6);
    for (const pn of partNumbers) expect(res.text).toContain(pn);
    expect(res.text).toContain('Shelfmatch');
    // At least 10 significant digits in every number (the writer uses 12).
    const firstData = res.text.split('\n').find((l) => /^\s*\d/.test(l))!;
    for (const n of firstData.trim().split(/\s+/).slice(1)) expect(n.replace(/^-/, '').replace(/e.*$/i, '').replace('.', '').replace(/^0+/, '').length).toBeGreaterThanOrEqual(10);
    // Fact of the trade: a passive network's S-matrix satisfies |S11|^2 + |S21|^2 <= 1 at every point.
    for (const m of data.matrices) {
      const s11 = m[0] ** 2 + m[1] ** 2;
      const s21 = m[4] ** 2 + m[5] ** 2;
      expect(s11 + s21).toBeLessThanOrEqual(1 + 1e-9);
    }
  });

  it('writes the ideal network as lossless: |S11|^2 + |S21|^2 = 1 at every point', async () => {
    const res = await request(t.app).get(`/api/matches/${matchId}/touchstone?network=ideal`).set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    const data = readTwoPortTouchstone(res.text);
    for (const m of data.matrices) expect(m[0] ** 2 + m[1] ** 2 + m[4] ** 2 + m[5] ** 2).toBeCloseTo(1, 9);
  });

  it('answers 404 for an unknown match, 400 for a bad network, 401 without a sign-in', async () => {
    expect((await request(t.app).get('/api/matches/999999/touchstone').set('Authorization', `Bearer ${token}`)).status).toBe(404);
    const bad = await request(t.app).get(`/api/matches/${matchId}/touchstone?network=both`).set('Authorization', `Bearer ${token}`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('network');
    expect((await request(t.app).get(`/api/matches/${matchId}/touchstone`)).status).toBe(401);
  });
});
