/**
 * A measured load through the API: `POST /api/matches/solve` and `POST /api/matches` with
 * `loadTouchstone` (the demo scenario's 868 MHz chip antenna, seeds/measured/), on the demo stock in
 * the real database. The file's own numbers are the reference: 868 MHz is one of its points, so the
 * match must use exactly the impedance the file gives there (converted with Z = 50 (1 + S)/(1 - S),
 * Pozar, Microwave Engineering, 4th ed., eq. 2.35, by the reader tested against the Touchstone 2.0
 * specification's examples in test/engine/touchstone-read.test.ts).
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { loadDemoStock } from '../../seeds/load-demo-stock.js';
import { DEMO_ANTENNA_FILE } from '../../seeds/make-demo-antenna.js';
import { readOnePortTouchstone, readTwoPortTouchstone } from '../../shared/touchstone/index.js';

let t: TestApp;
let token = '';
const text = readFileSync(DEMO_ANTENNA_FILE, 'utf8');
const fileName = 'tarnwick-868-chip-antenna.s1p';

beforeAll(async () => {
  t = await startTestApp();
  token = (await t.addUser('designer')).token;
  await loadDemoStock(t.sequelize);
});
afterAll(async () => {
  await t?.close();
});

const solve = (body: object) => request(t.app).post('/api/matches/solve').set('Authorization', `Bearer ${token}`).send(body);
const matchCount = async () => Number((await t.sequelize.query('SELECT count(*)::int AS n FROM matches', { plain: true }))!.n);
const fitParts = (body: { networks: { placement: string; solution: number; fits: { elements: { parts: unknown[] }[]; loss: unknown; tpg: number }[] }[] }) =>
  body.networks.map((n) => ({ network: `${n.placement} ${n.solution}`, fits: n.fits.map((f) => ({ parts: f.elements.map((e) => e.parts), loss: f.loss, tpg: f.tpg })) }));

describe('a measured antenna as the load', () => {
  it('gives the same fits as the impedance the file holds at f0, typed in', async () => {
    const data = readOnePortTouchstone(text);
    const i = Array.from(data.frequencyHz).indexOf(868e6);
    expect(i).toBeGreaterThan(0);
    const typed = { re: data.resistanceOhm[i], im: data.reactanceOhm[i] };
    // Far from 50 ohm, as product.md's demo antenna is.
    expect(typed.re).toBeLessThan(15);
    expect(typed.im).toBeLessThan(-20);
    for (const objective of ['nominal', 'worst-case']) {
      const a = await solve({ source: 50, load: typed, frequencyHz: '868MHz', objective, combinations: true });
      const b = await solve({ source: 50, loadTouchstone: { fileName, text }, frequencyHz: '868MHz', objective, combinations: true });
      expect(a.status).toBe(200);
      expect(b.status).toBe(200);
      expect(fitParts(a.body).some((n) => n.fits.length > 0)).toBe(true);
      expect(fitParts(b.body)).toEqual(fitParts(a.body));
      expect(b.body.networks.map((n: { elements: unknown }) => n.elements)).toEqual(a.body.networks.map((n: { elements: unknown }) => n.elements));
    }
  });

  it('ranks by the band loss computed on the measured data, and reports it', async () => {
    const res = await solve({ source: 50, loadTouchstone: { fileName, text }, frequencyHz: '868MHz', bandwidthHz: '20MHz', objective: 'band' });
    expect(res.status).toBe(200);
    const fit = res.body.networks.find((n: { fits: unknown[] }) => n.fits.length > 0).fits[0];
    expect(fit.loss.bandDb).toBeGreaterThanOrEqual(fit.loss.totalDb);
  });

  it('refuses a malformed file with field and line, and a frequency outside the file, saving nothing', async () => {
    const before = await matchCount();
    const broken = text.replace('# MHz S MA R 50', '# MHz S MX R 50');
    const bad = await solve({ source: 50, loadTouchstone: { fileName, text: broken }, frequencyHz: '868MHz' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0]).toMatchObject({ field: 'loadTouchstone.text', value: fileName, line: 4 });
    expect(bad.body.error.details[0].message).toMatch(/line 4/);
    const outside = await solve({ source: 50, loadTouchstone: { fileName, text }, frequencyHz: '2.45GHz' });
    expect(outside.status).toBe(400);
    expect(outside.body.error.details[0].field).toBe('frequencyHz');
    expect(outside.body.error.details[0].message).toMatch(/780 MHz to 960 MHz/);
    const save = await request(t.app)
      .post('/api/matches')
      .set('Authorization', `Bearer ${token}`)
      .send({ name: 'broken', request: { source: 50, loadTouchstone: { fileName, text: broken }, frequencyHz: '868MHz' }, chosen: { placement: 'shunt-at-load', solution: 1, rank: 1 } });
    expect(save.status).toBe(400);
    expect(await matchCount()).toBe(before);
  });
});

describe('size limits', () => {
  it('refuses a file text over the limit by name, and a body over 1 MB with 413', async () => {
    const padded = `${'! padding comment line to make the file long\n'.repeat(20_000)}${text}`;
    expect(padded.length).toBeGreaterThan(900_000);
    expect(padded.length).toBeLessThan(1_000_000);
    const res = await solve({ source: 50, loadTouchstone: { fileName, text: padded }, frequencyHz: '868MHz' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('loadTouchstone.text');
    expect(res.body.error.details[0].message).toMatch(/at most 900000/);
    const huge = await solve({ source: 50, loadTouchstone: { fileName, text: padded + padded }, frequencyHz: '868MHz' });
    expect(huge.status).toBe(413);
    expect(huge.body.error.message).toBeTruthy();
  });
});

describe('a saved match with a measured load', () => {
  let id = 0;
  let detail: Record<string, any>;
  beforeAll(async () => {
    const req = { source: 50, loadTouchstone: { fileName, text }, frequencyHz: '868MHz', bandwidthHz: '10MHz', objective: 'worst-case' };
    const solved = await solve(req);
    const network = solved.body.networks.find((n: { fits: unknown[] }) => n.fits.length > 0);
    const saved = await request(t.app)
      .post('/api/matches')
      .set('Authorization', `Bearer ${token}`)
      .send({ name: 'Soil node antenna, measured', request: req, chosen: { placement: network.placement, solution: network.solution, rank: 1 } });
    expect(saved.status).toBe(201);
    id = saved.body.id;
    detail = (await request(t.app).get(`/api/matches/${id}`).set('Authorization', `Bearer ${token}`)).body;
  });

  it('keeps the file with the match and sweeps inside its range', () => {
    expect(detail.request.loadTouchstone.fileName).toBe(fileName);
    const f: number[] = detail.sweep.frequenciesHz;
    // f0 +- 20 % is 694..1042 MHz; the file covers 780..960 MHz.
    expect(f[0]).toBe(780e6);
    expect(f.at(-1)).toBe(960e6);
    expect(detail.sweep.fitTpg.every((g: number) => g > 0 && g <= 1)).toBe(true);
  });

  it('lists the match with its file by name and size, not its text', async () => {
    const list = await request(t.app).get('/api/matches').set('Authorization', `Bearer ${token}`);
    expect(list.status).toBe(200);
    const item = list.body.items.find((m: { id: number }) => m.id === id);
    expect(item.request.loadTouchstone).toEqual({ fileName, textChars: text.length });
    expect(item.frequencyHz).toBe(868e6);
    // The whole list is far smaller than the one file it names.
    expect(JSON.stringify(list.body).length).toBeLessThan(text.length / 4);
  });

  it('shows the measured trace on the Smith chart: the file points of the sweep range', () => {
    const [trace] = detail.smith.measured;
    expect(trace.port).toBe('load');
    expect(trace.fileName).toBe(fileName);
    expect(trace.frequenciesHz.length).toBe(181);
    const data = readOnePortTouchstone(text);
    expect(trace.impedances[88].re).toBeCloseTo(data.resistanceOhm[88], 9);
    expect(trace.impedances[88].im).toBeCloseTo(data.reactanceOhm[88], 9);
  });

  it('downloads as a 2-port file with f0 as a point', async () => {
    const res = await request(t.app).get(`/api/matches/${id}/touchstone`).set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    expect(Array.from(readTwoPortTouchstone(res.text).frequencyHz)).toContain(868e6);
  });
});
