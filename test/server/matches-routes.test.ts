/**
 * The match routes against real PostgreSQL (api.md "Matches"), with the stock loaded through the real
 * stock-list import route. The reference match is a real-to-real L section, 50 ohm to 12.5 ohm at
 * 100 MHz: Q = sqrt(50/12.5 - 1) = sqrt(3), shunt reactance 50/Q across the 50 ohm side and series
 * reactance 12.5 Q beside the 12.5 ohm side (C. Bowick, RF Circuit Design, 2nd ed., ch. 4, the L
 * network design equations; from memory): C = Q/(w 50) = 55.13 pF, L = 12.5 Q / w = 34.46 nH. A shunt
 * across the 12.5 ohm load cannot match (Rs GL = 4 > 1), so shunt-at-load is infeasible.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, clearStock, csvFile, uploadStock } from '../fixtures/stock/stock-upload.js';

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
const solve = (body: object, who = designer) => as(who, request(t.app).post('/api/matches/solve')).send(body);

const F0 = 100e6;
const REQUEST = { source: 50, load: 12.5, frequencyHz: '100MHz', objective: 'nominal', fitsPerNetwork: 10 };

/**
 * Stock for the reference match. 55.13p has no SRF and no loss given; 56p is used above half its
 * SRF (100 MHz / 150 MHz); 100p has its SRF below f0; 39n has too few for five boards; 47p has a
 * 1 V rating; 34.46n is a Q 50 inductor (Q at 100 MHz) with SRF 3 GHz.
 */
const STOCK = csvFile(
  FULL_HEADER,
  'TC-55P13,C,55.13p,1%,,,,,100,0402,50V,,main,,0.0100,,exact value',
  'TC-47P,C,47p,5%,2GHz,,,0.05,100,0402,1V,,main,E12,0.0100,,',
  'TC-56P,C,56p,5%,150MHz,,,0.05,100,0402,50V,,main,E12,0.0100,,',
  'TC-100P,C,100p,5%,90MHz,,,0.05,100,0402,50V,,main,E12,0.0100,,',
  'TL-34N46,L,34.46n,1%,3GHz,50,100MHz,,100,0402,,0.5A,main,,0.0300,,',
  'TL-33N,L,33n,5%,2GHz,40,100MHz,,100,0402,,0.5A,main,E24,0.0300,,',
  'TL-39N,L,39n,5%,2GHz,40,100MHz,,3,0402,,0.5A,main,E24,0.0300,,',
  'TC-55P13,C,55.13p,1%,,,,,100,0402,50V,,lab,,0.0100,,at the lab',
);

/** Minimal complex arithmetic for the independent check (not the engine's). */
type C = [number, number];
const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const inv = (a: C): C => {
  const d = a[0] * a[0] + a[1] * a[1];
  return [a[0] / d, -a[1] / d];
};
const abs2 = (a: C) => a[0] * a[0] + a[1] * a[1];

describe('POST /api/matches/solve with an empty stock', () => {
  it('answers the ideal networks with empty fits and a note, not an error', async () => {
    const res = await solve(REQUEST);
    expect(res.status).toBe(200);
    expect(res.body.networks.length).toBe(2);
    for (const n of res.body.networks) expect(n.fits).toEqual([]);
    expect(res.body.notes.join(' ')).toMatch(/holds no parts/);
    expect(res.body.infeasible).toEqual([{ placement: 'shunt-at-load', reason: expect.stringMatching(/Rs·GL <= 1/) }]);
  });
});

describe('with the reference stock', () => {
  beforeAll(async () => {
    await clearStock(t.sequelize);
    const up = await uploadStock(t.app, stores.token, STOCK);
    expect(up.status).toBe(200);
    expect(up.body.created).toBe(8);
  });

  it('fills fits exactly as api.md names their fields, for every role', async () => {
    for (const who of [admin, designer, stores, purchasing]) {
      const res = await solve(REQUEST, who);
      expect(res.status).toBe(200);
      const network = res.body.networks.find((n: { placement: string; response: string }) => n.placement === 'shunt-at-source' && n.response === 'low-pass');
      expect(network.fits.length).toBeGreaterThan(0);
      const fit = network.fits[0];
      for (const key of ['rank', 'elements', 'loss', 'tpg', 'returnLossDb', 'flags']) expect(fit).toHaveProperty(key);
      expect(Object.keys(fit.loss).sort()).toEqual(['bandDb', 'dissipativeDb', 'totalDb', 'valueErrorDb', 'worstCaseDb']);
      for (const e of fit.elements) {
        for (const key of ['position', 'kind', 'arrangement', 'parts', 'nominalValue', 'effectiveValue', 'frequencyRatio', 'flags']) expect(e).toHaveProperty(key);
        for (const p of e.parts) expect(p).toEqual(expect.objectContaining({ partNumber: expect.any(String), quantity: expect.any(Number) }));
      }
      expect(fit.loss.bandDb).toBeNull();
      expect(fit.rank).toBe(1);
    }
  });

  it('ranks the exact-value parts first, with the loss an independent circuit analysis gives', async () => {
    const res = await solve(REQUEST);
    const network = res.body.networks.find((n: { response: string }) => n.response === 'low-pass');
    const best = network.fits[0];
    const names = best.elements.map((e: { parts: { partNumber: string }[] }) => e.parts.map((p) => p.partNumber).join('+'));
    expect(names).toEqual(['TC-55P13', 'TL-34N46']);
    // Source 50 ohm, shunt C, then series (L + R) || Cp, then the 12.5 ohm load.
    const w = 2 * Math.PI * F0;
    const L = 34.46e-9;
    const R = (w * L) / 50;
    const cp = 1 / ((2 * Math.PI * 3e9) ** 2 * L);
    const zInd = inv(add(inv([R, w * L]), [0, w * cp]));
    const zBranch = add(zInd, [12.5, 0]);
    const zin = inv(add([0, w * 55.13e-12], inv(zBranch)));
    const v1 = mul([1, 0], mul(zin, inv(add([50, 0], zin))));
    const iLoad = mul(v1, inv(zBranch));
    const tpg = ((abs2(iLoad) * 12.5) / 2) / (1 / (8 * 50));
    expect(best.tpg).toBeCloseTo(tpg, 10);
    expect(best.loss.totalDb).toBeCloseTo(-10 * Math.log10(tpg), 8);
    // Exact values: almost no value error, the loss is the inductor's resistance.
    expect(best.loss.valueErrorDb).toBeLessThan(1e-4);
    expect(best.loss.dissipativeDb).toBeCloseTo(best.loss.totalDb - best.loss.valueErrorDb, 12);
    // Fits are in rank order by the objective (nominal: total loss), within each tier.
    const totals = network.fits.filter((f: { flags: string[] }) => !f.flags.includes('above-limit')).map((f: { loss: { totalDb: number } }) => f.loss.totalDb);
    expect(totals).toEqual([...totals].sort((a, b) => a - b));
  });

  it('applies the frequency-limit rules and flags each element', async () => {
    const res = await solve(REQUEST);
    const fits = res.body.networks.flatMap((n: { fits: unknown[] }) => n.fits) as {
      rank: number;
      flags: string[];
      elements: { kind: string; parts: { partNumber: string }[]; flags: string[]; frequencyRatio: number | null }[];
    }[];
    const uses = (fit: (typeof fits)[number], part: string) => fit.elements.some((e) => e.parts.some((p) => p.partNumber === part));
    // At or above SRF: never used as its kind.
    expect(fits.some((f) => uses(f, 'TC-100P'))).toBe(false);
    // Above the usable fraction: flagged, and every fit within limits ranks before it.
    const low = res.body.networks.find((n: { response: string }) => n.response === 'low-pass').fits as typeof fits;
    const above = low.filter((f) => uses(f, 'TC-56P'));
    const within = low.filter((f) => !uses(f, 'TC-56P'));
    expect(above.length).toBeGreaterThan(0);
    expect(Math.min(...above.map((f) => f.rank))).toBeGreaterThan(Math.max(...within.map((f) => f.rank)));
    for (const f of above) {
      expect(f.flags).toContain('above-limit');
      const element = f.elements.find((e) => e.kind === 'capacitor')!;
      expect(element.flags).toContain('above-limit');
      expect(element.frequencyRatio).toBeCloseTo(100 / 150, 12);
    }
    // No SRF: "limit unknown" and a null ratio; no ESR or Q: "loss unknown".
    const exact = low.find((f) => uses(f, 'TC-55P13'))!;
    const cap = exact.elements.find((e) => e.kind === 'capacitor')!;
    expect(cap.flags).toEqual(expect.arrayContaining(['limit-unknown', 'loss-unknown']));
    expect(cap.frequencyRatio).toBeNull();
  });

  it('excludes above-limit parts when the request says so, and widens the limit with usableSrfFraction', async () => {
    const uses = (body: { networks: { fits: { elements: { parts: { partNumber: string }[] }[] }[] }[] }, part: string) =>
      body.networks.some((n) => n.fits.some((f) => f.elements.some((e) => e.parts.some((p) => p.partNumber === part))));
    const excluded = await solve({ ...REQUEST, excludeAboveLimit: true });
    expect(uses(excluded.body, 'TC-56P')).toBe(false);
    expect(excluded.body.snapping.excluded.capacitor.aboveLimitExcluded).toBe(1);
    const widened = await solve({ ...REQUEST, usableSrfFraction: 0.9, excludeAboveLimit: true });
    expect(uses(widened.body, 'TC-56P')).toBe(true);
    const fit = widened.body.networks.flatMap((n: { fits: unknown[] }) => n.fits).find((f: { elements: { parts: { partNumber: string }[] }[] }) => f.elements.some((e) => e.parts.some((p) => p.partNumber === 'TC-56P')));
    expect(fit.flags).not.toContain('above-limit');
  });

  it('flags a part over its rating when a power is given', async () => {
    const res = await solve({ ...REQUEST, powerW: 1, fitsPerNetwork: 10 });
    const fit = res.body.networks.flatMap((n: { fits: unknown[] }) => n.fits).find((f: { elements: { parts: { partNumber: string }[] }[] }) => f.elements.some((e) => e.parts.some((p) => p.partNumber === 'TC-47P')));
    // 1 W into 50 ohm: the source's open-circuit peak is sqrt(8 x 1 x 50) = 20 V, far over a 1 V rating.
    const element = fit.elements.find((e: { parts: { partNumber: string }[] }) => e.parts.some((p) => p.partNumber === 'TC-47P'));
    expect(element.flags).toContain('over-rating');
    expect(fit.flags).toContain('over-rating');
  });

  it('needs stock for the build quantity, and limits the stock to a location', async () => {
    const res = await solve({ ...REQUEST, buildQuantity: 5 });
    const used = res.body.networks.flatMap((n: { fits: { elements: { parts: { partNumber: string }[] }[] }[] }) => n.fits.flatMap((f) => f.elements.flatMap((e) => e.parts.map((p) => p.partNumber))));
    expect(used).not.toContain('TL-39N');
    const few = await solve({ ...REQUEST, buildQuantity: 4 });
    expect(few.body.snapping.excluded.inductor.shortStock).toBe(1);
    const lab = await solve({ ...REQUEST, location: 'lab' });
    expect(lab.body.networks.every((n: { fits: unknown[] }) => n.fits.length === 0)).toBe(true);
    expect(lab.body.notes.join(' ')).toMatch(/no stocked inductor can serve as the series element/);
    const nowhere = await solve({ ...REQUEST, location: 'attic' });
    expect(nowhere.status).toBe(200);
    expect(nowhere.body.notes.join(' ')).toMatch(/No part of the stock list is at location "attic"/);
  });

  it('combines two parts when asked', async () => {
    const res = await solve({ ...REQUEST, combinations: true, fitsPerNetwork: 30 });
    const arrangements = new Set(res.body.networks.flatMap((n: { fits: { elements: { arrangement: string }[] }[] }) => n.fits.flatMap((f) => f.elements.map((e) => e.arrangement))));
    expect(arrangements.has('series') || arrangements.has('parallel')).toBe(true);
  });

  it('refuses bad input with 400 and details naming each field', async () => {
    const res = await solve({ source: '50', load: '12-j', frequencyHz: 'fast', fitsPerNetwork: 0, objective: 'best' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    const fields = res.body.error.details.map((d: { field: string }) => d.field);
    expect(fields).toEqual(expect.arrayContaining(['load', 'frequencyHz', 'fitsPerNetwork', 'objective']));
    const missing = await solve({ load: 50 });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details.map((d: { field: string }) => d.field)).toEqual(expect.arrayContaining(['source', 'frequencyHz']));
    expect((await solve({ ...REQUEST, objective: 'band' })).body.error.details[0].field).toBe('bandwidthHz');
    expect((await request(t.app).post('/api/matches/solve').send(REQUEST)).status).toBe(401);
  });

  it('fills the band loss when a band is given and ranks by it with the band objective', async () => {
    const res = await solve({ ...REQUEST, bandwidthHz: '10MHz', objective: 'band' });
    expect(res.status).toBe(200);
    const fits = res.body.networks[0].fits;
    for (const f of fits) expect(f.loss.bandDb).toBeGreaterThanOrEqual(f.loss.totalDb - 1e-9);
    const within = fits.filter((f: { flags: string[] }) => !f.flags.includes('above-limit')).map((f: { loss: { bandDb: number } }) => f.loss.bandDb);
    expect(within).toEqual([...within].sort((a, b) => a - b));
    expect(res.body.snapping.objective).toBe('band');
  });
});

describe('saving and reopening a match', () => {
  let saved: { id: number; fit: { rank: number; loss: object; elements: { parts: { partNumber: string; partId: number }[] }[] } };

  beforeAll(async () => {
    await clearStock(t.sequelize);
    await t.sequelize.query('DELETE FROM matches');
    expect((await uploadStock(t.app, stores.token, STOCK)).status).toBe(200);
  });

  it('lets designers and admins save, and nobody else', async () => {
    const body = { name: 'Reference L section', request: REQUEST, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } };
    for (const who of [stores, purchasing]) expect((await as(who, request(t.app).post('/api/matches')).send(body)).status).toBe(403);
    expect((await request(t.app).post('/api/matches').send(body)).status).toBe(401);
    const res = await as(designer, request(t.app).post('/api/matches')).send(body);
    expect(res.status).toBe(201);
    saved = res.body;
    expect(res.body).toMatchObject({ id: expect.any(Number), name: 'Reference L section', chosen: body.chosen, request: REQUEST });
    const solved = await solve(REQUEST);
    const fit = solved.body.networks.find((n: { placement: string; solution: number }) => n.placement === 'shunt-at-source' && n.solution === 1).fits[0];
    expect(res.body.fit.loss).toEqual(fit.loss);
    expect(res.body.fit.tpg).toBe(fit.tpg);
    const admins = await as(admin, request(t.app).post('/api/matches')).send({ ...body, name: 'Second' });
    expect(admins.status).toBe(201);
    const audit = await t.sequelize.query<{ actor_id: number }>("SELECT actor_id FROM audit_entries WHERE action = 'match.create' AND entity_id = :id", {
      type: QueryTypes.SELECT,
      replacements: { id: String(saved.id) },
    });
    expect(audit).toEqual([{ actor_id: designer.id }]);
  });

  it('refuses a bad save with 400 naming the field, and a rank the answer does not have with 409', async () => {
    const bad = await as(designer, request(t.app).post('/api/matches')).send({ name: '', request: REQUEST, chosen: { placement: 'nowhere', solution: 3, rank: 0 } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { field: string }) => d.field)).toEqual(expect.arrayContaining(['name', 'chosen.placement', 'chosen.solution', 'chosen.rank']));
    const badRequest = await as(designer, request(t.app).post('/api/matches')).send({ name: 'x', request: { ...REQUEST, load: 'oops' }, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } });
    expect(badRequest.status).toBe(400);
    // The field path as the body has it: the request sits under `request`, like `chosen.rank` above.
    expect(badRequest.body.error.details[0].field).toBe('request.load');
    // A key the request reader refuses by name reaches it as sent.
    const polluted = await as(designer, request(t.app).post('/api/matches'))
      .set('Content-Type', 'application/json')
      .send(`{"name":"x","request":{"source":50,"load":"12-j35","frequencyHz":"868MHz","__proto__":{"x":1}},"chosen":{"placement":"shunt-at-source","solution":1,"rank":1}}`);
    expect(polluted.status).toBe(400);
    expect(polluted.body.error.details.map((d: { field: string }) => d.field)).toEqual(['request.__proto__']);
    const absent = await as(designer, request(t.app).post('/api/matches')).send({ name: 'x', request: REQUEST, chosen: { placement: 'shunt-at-load', solution: 1, rank: 1 } });
    expect(absent.status).toBe(409);
    const deep = await as(designer, request(t.app).post('/api/matches')).send({ name: 'x', request: REQUEST, chosen: { placement: 'shunt-at-source', solution: 1, rank: 40 } });
    expect(deep.status).toBe(409);
  });

  it('lists saved matches for every role and reopens one with its inputs, fit and plots', async () => {
    const list = await as(purchasing, request(t.app).get('/api/matches'));
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(2);
    expect(list.body.items[1]).toMatchObject({ id: saved.id, name: 'Reference L section', frequencyHz: F0 });
    const open = await as(stores, request(t.app).get(`/api/matches/${saved.id}`));
    expect(open.status).toBe(200);
    expect(open.body.fit).toEqual(saved.fit);
    expect(open.body.request).toEqual(REQUEST);
    expect(open.body.sweep.frequenciesHz.length).toBe(201);
    // f0 +- 20 %: 80 MHz to 120 MHz, f0 in the middle, where the ideal network reaches TPG 1.
    expect(open.body.sweep.frequenciesHz[0]).toBeCloseTo(80e6, 0);
    expect(open.body.sweep.frequenciesHz[200]).toBeCloseTo(120e6, 0);
    expect(open.body.sweep.idealTpg[100]).toBeCloseTo(1, 9);
    expect(open.body.sweep.fitTpg[100]).toBeCloseTo(open.body.fit.tpg, 12);
    // The ideal Smith path ends on conj(Zs) = 50 ohm; the fit's end is its Zin.
    const end = open.body.smith.ideal.nodes.at(-1);
    expect(end.re).toBeCloseTo(50, 6);
    expect(end.im).toBeCloseTo(0, 6);
    expect(open.body.smith.fit.nodes.length).toBe(2);
    expect(open.body.stockChanges).toEqual([]);
    expect((await as(designer, request(t.app).get('/api/matches/99999'))).status).toBe(404);
    expect((await as(designer, request(t.app).get('/api/matches/abc'))).status).toBe(400);
  });

  it('reopens with the same results after the stock changes, and says what changed', async () => {
    const changed = csvFile(
      FULL_HEADER,
      'TL-34N46,L,39n,1%,3GHz,50,100MHz,,100,0402,,0.5A,main,,0.0300,,',
      'TC-55P13,C,55.13p,1%,,,,,0,0402,50V,,main,,0.0100,,',
      'TC-55P13,C,55.13p,1%,,,,,0,0402,50V,,lab,,0.0100,,',
    );
    expect((await uploadStock(t.app, stores.token, changed)).status).toBe(200);
    const open = await as(designer, request(t.app).get(`/api/matches/${saved.id}`));
    expect(open.status).toBe(200);
    expect(open.body.fit).toEqual(saved.fit);
    expect(open.body.stockChanges).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ partNumber: 'TL-34N46', change: 'changed' }),
        expect.objectContaining({ partNumber: 'TC-55P13', change: 'short' }),
      ]),
    );
  });
});

describe('deleting a saved match', () => {
  const save = async (who: { token: string }, name: string) => {
    const res = await as(who, request(t.app).post('/api/matches')).send({ name, request: REQUEST, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } });
    expect(res.status).toBe(201);
    return res.body as { id: number };
  };
  const remove = (who: { token: string } | null, id: number | string) => {
    const r = request(t.app).delete(`/api/matches/${id}`);
    return who ? as(who, r) : r;
  };
  const listed = async () => ((await as(designer, request(t.app).get('/api/matches?pageSize=100'))).body.items as { id: number }[]).map((m) => m.id);

  beforeAll(async () => {
    await clearStock(t.sequelize);
    expect((await uploadStock(t.app, stores.token, STOCK)).status).toBe(200);
  });

  it('lets the designer who saved it delete it, audited with what it was, and it is gone', async () => {
    const match = await save(designer, 'To be deleted');
    const res = await remove(designer, match.id);
    expect(res.status).toBe(204);
    expect(await listed()).not.toContain(match.id);
    expect((await as(designer, request(t.app).get(`/api/matches/${match.id}`))).status).toBe(404);
    const [audit] = await t.sequelize.query<{ actor_id: number; before: { name: string; placement: string; rank: number } }>(
      "SELECT actor_id, before FROM audit_entries WHERE action = 'match.delete' AND entity_id = :id",
      { type: QueryTypes.SELECT, replacements: { id: String(match.id) } },
    );
    expect(audit).toMatchObject({ actor_id: designer.id, before: { name: 'To be deleted', placement: 'shunt-at-source', rank: 1 } });
    expect((await remove(designer, match.id)).status).toBe(404);
  });

  it("refuses another designer's match with 403, lets an admin delete any, and other roles none", async () => {
    const other = await t.addUser('designer');
    const match = await save(designer, 'Not yours');
    const refused = await remove(other, match.id);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/designer who saved this match, or an admin/);
    for (const who of [stores, purchasing]) expect((await remove(who, match.id)).status).toBe(403);
    expect((await remove(null, match.id)).status).toBe(401);
    expect(await listed()).toContain(match.id);
    expect((await remove(admin, match.id)).status).toBe(204);
    expect(await listed()).not.toContain(match.id);
    expect((await remove(admin, 'abc')).status).toBe(400);
  });

  it('leaves a build planned with it readable, with the match as it was planned', async () => {
    const match = await save(designer, 'Carried by a build');
    const build = await as(designer, request(t.app).post('/api/builds')).send({ name: 'Board with a deleted match', quantity: 2, matchIds: [match.id] });
    expect(build.status).toBe(201);
    const before = await as(designer, request(t.app).get(`/api/builds/${build.body.id}`));
    expect((await remove(designer, match.id)).status).toBe(204);
    const after = await as(designer, request(t.app).get(`/api/builds/${build.body.id}`));
    expect(after.status).toBe(200);
    expect(after.body.matches).toEqual(before.body.matches);
    expect(after.body.matches[0]).toMatchObject({ matchId: match.id, name: 'Carried by a build' });
  });
});

describe('finding saved matches by name', () => {
  // The reference stock from the blocks above stays (a build there holds some of it).
  beforeAll(async () => {
    await t.sequelize.query('DELETE FROM matches');
    for (const name of ['Gateway 40.68 MHz link', 'Soil node 868 MHz', 'soil node 915 MHz', 'Odd 100%_match']) {
      const res = await as(designer, request(t.app).post('/api/matches')).send({ name, request: REQUEST, chosen: { placement: 'shunt-at-source', solution: 1, rank: 1 } });
      expect(res.status).toBe(201);
    }
  });
  const names = async (query: string) => {
    const res = await as(purchasing, request(t.app).get(`/api/matches?${query}`));
    expect(res.status).toBe(200);
    return { names: (res.body.items as { name: string }[]).map((m) => m.name), total: res.body.total as number };
  };

  it('keeps the names holding the search text, in any case, newest first, with their total', async () => {
    expect(await names('search=SOIL%20NODE')).toEqual({ names: ['soil node 915 MHz', 'Soil node 868 MHz'], total: 2 });
    expect(await names('search=soil&pageSize=1')).toEqual({ names: ['soil node 915 MHz'], total: 2 });
    expect(await names('search=%20%20')).toEqual({ names: expect.any(Array), total: 4 });
    expect(await names('search=nothing%20like%20it')).toEqual({ names: [], total: 0 });
  });

  it('reads % and _ in the search as themselves, not as wildcards', async () => {
    expect(await names(`search=${encodeURIComponent('%_')}`)).toEqual({ names: ['Odd 100%_match'], total: 1 });
    expect(await names(`search=${encodeURIComponent('_')}`)).toEqual({ names: ['Odd 100%_match'], total: 1 });
  });

  it('refuses a search longer than 200 characters with 400 naming it', async () => {
    const res = await as(designer, request(t.app).get(`/api/matches?search=${'x'.repeat(201)}`));
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('search');
  });
});
