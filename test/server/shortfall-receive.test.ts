/**
 * Receiving bought parts (issue 6): the parts enter stock through the stock-list importer, so the
 * import history shows the receipt with each part's quantity before and after; an existing part
 * number gains what arrived, a new one is created to the line's buy-to spec; the lines count what
 * they received and a list covered in full is marked received. Bad receipts change nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { createBuild } from '../../server/services/builds/create-build.js';
import type { PlannedMatchDesign } from '../../server/models/build-match.js';
import { stockFile, stockRow, subGhzDesign } from './builds-scenario.js';

let t: TestApp;
let designer: { id: number; token: string };
let purchasing: { id: number; token: string };
let stores: { id: number; token: string };
let buildId: number;
let lines: { id: number; buyValue: number; quantity: number }[];

/** 885 MHz: C = 0.035590 / (2 pi 885 MHz) = 6.4004 pF (buys 6.2 pF in E24), L = 10.134 nH. */
function design885(): PlannedMatchDesign {
  const base = subGhzDesign();
  return { ...base, frequencyHz: 885e6, elements: [{ ...base.elements[0], idealValue: 6.4004e-12 }, { ...base.elements[1], idealValue: 10.134e-9 }] };
}

beforeAll(async () => {
  t = await startTestApp();
  designer = await t.addUser('designer');
  purchasing = await t.addUser('purchasing');
  stores = await t.addUser('stores');
  const upload = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 0), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 500)));
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
  buildId = await createBuild(
    t.sequelize,
    {
      name: 'NODE-868',
      quantity: 20,
      reserve: true,
      plans: [
        { matchId: 31, matchName: '868 MHz antenna', design: subGhzDesign() },
        { matchId: 32, matchName: '885 MHz antenna', design: design885() },
      ],
    },
    designer.id,
  );
  lines = (await request(t.app).get(`/api/builds/${buildId}/shortfall`).set('Authorization', `Bearer ${purchasing.token}`)).body.lines;
  // 20 boards short of 6.8 pF and of 6.2 pF: 20 x 1.05 = 21 of each.
  expect(lines.map((l) => [l.buyValue, l.quantity])).toEqual([
    [6.8e-12, 21],
    [6.2e-12, 21],
  ]);
});
afterAll(async () => {
  await t?.close();
});

const receive = (user: { token: string }, body: object) => request(t.app).post(`/api/builds/${buildId}/shortfall/receive`).set('Authorization', `Bearer ${user.token}`).send(body);
const part = async (partNumber: string) =>
  (await t.sequelize.query<Record<string, unknown>>('SELECT * FROM parts WHERE part_number = :partNumber', { replacements: { partNumber }, type: QueryTypes.SELECT }))[0];

describe('POST /api/builds/:id/shortfall/receive', () => {
  it('refuses bad receipts and changes nothing', async () => {
    const importsBefore = await t.sequelize.query('SELECT id FROM stock_imports', { type: QueryTypes.SELECT });
    const cases: [object, number, RegExp][] = [
      [{ lines: [{ lineId: 999999, quantity: 1, partNumber: 'X' }] }, 400, /lines.0.lineId: line 999999 is not on the shortfall list/],
      [{ lines: [{ lineId: lines[0].id, quantity: 0, partNumber: 'X' }] }, 400, /at least 1/],
      [{ lines: [] }, 400, /at least one line/],
      [{ lines: [{ lineId: lines[0].id, quantity: 5, partNumber: 'TW-L0402-10N' }] }, 400, /TW-L0402-10N at main is a stocked inductor; this line buys a capacitor/],
      [{ lines: [{ lineId: lines[1].id, quantity: 5, partNumber: 'TW-C0402-6P8' }] }, 400, /another value than this line's buy-to value/],
      [{ lines: [{ lineId: lines[0].id, quantity: 5, partNumber: 'TW-C0402-6P8', srfHz: '9GHz' }] }, 400, /give an SRF only for a new part/],
      [{ lines: [{ lineId: lines[1].id, quantity: 5, partNumber: 'NEW-6P2', srfHz: 'fast' }] }, 400, /lines.0.srfHz/],
    ];
    for (const [body, status, message] of cases) {
      const res = await receive(purchasing, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.message).toMatch(message);
    }
    expect((await receive(designer, { lines: [{ lineId: lines[0].id, quantity: 1, partNumber: 'TW-C0402-6P8' }] })).status).toBe(403);
    expect(await t.sequelize.query('SELECT id FROM stock_imports', { type: QueryTypes.SELECT })).toEqual(importsBefore);
    expect((await part('TW-C0402-6P8')).quantity).toBe(0);
  });

  it('enters a partial receipt through the importer: existing part raised, new part made to spec', async () => {
    const res = await receive(purchasing, {
      lines: [
        { lineId: lines[0].id, quantity: 21, partNumber: 'TW-C0402-6P8' },
        { lineId: lines[1].id, quantity: 15, partNumber: 'TW-C0402-6P2', srfHz: '11GHz' },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ importId: expect.any(Number), created: 1, updated: 1 });
    expect(res.body.list.lines.map((l: { receivedQuantity: number }) => l.receivedQuantity)).toEqual([21, 15]);
    // 15 of the 21 6.2 pF are still to come.
    expect(res.body.list.list.status).toBe('draft');

    expect(await part('TW-C0402-6P8')).toMatchObject({ quantity: 21, value_si: 6.8e-12, tolerance_kind: 'absolute', tolerance_value: 0.25e-12, srf_hz: 10e9, esr_ohm: 0.2 });
    const created = await part('TW-C0402-6P2');
    const line = res.body.list.lines[1];
    expect(created).toMatchObject({ kind: 'capacitor', value_si: 6.2e-12, quantity: 15, location: 'main', package: '0402', series: 'E24', srf_hz: 11e9, tolerance_kind: line.tolerance.mode });
    expect(created.description).toBe(`Received for build ${buildId} (shortfall list ${res.body.list.list.id})`);

    // The import history shows the receipt, by purchasing, with the quantities before and after.
    const history = await request(t.app).get(`/api/stock/imports/${res.body.importId}`).set('Authorization', `Bearer ${stores.token}`);
    expect(history.status).toBe(200);
    expect(history.body).toMatchObject({ status: 'applied', mode: 'merge', user: { id: purchasing.id }, created: 1, updated: 1, unchanged: 0, zeroed: 0 });
    expect(history.body.fileName).toMatch(new RegExp(`^receipt-build-${buildId}-shortfall-\\d+\\.csv$`));
    const changes = Object.fromEntries(history.body.changes.map((c: { partNumber: string }) => [c.partNumber, c]));
    expect(changes['TW-C0402-6P8']).toMatchObject({ change: 'updated', quantityBefore: 0, quantityAfter: 21, fields: [] });
    expect(changes['TW-C0402-6P2']).toMatchObject({ change: 'created', quantityBefore: null, quantityAfter: 15 });

    // And the stock list the designers see.
    const parts = await request(t.app).get('/api/parts?search=TW-C0402-6P').set('Authorization', `Bearer ${designer.token}`);
    expect(parts.body.items.map((p: { partNumber: string; quantity: number; available: number }) => [p.partNumber, p.quantity, p.available])).toEqual([
      ['TW-C0402-6P2', 15, 15],
      ['TW-C0402-6P8', 21, 21],
    ]);
  });

  it('adds the rest to the part just created, marks the list received, and lets stores receive too', async () => {
    const res = await receive(stores, { lines: [{ lineId: lines[1].id, quantity: 6, partNumber: 'TW-C0402-6P2' }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ created: 0, updated: 1 });
    expect(res.body.list.list.status).toBe('received');
    expect(res.body.list.lines.map((l: { receivedQuantity: number }) => l.receivedQuantity)).toEqual([21, 21]);
    // 15 + 6 = 21 on hand; the SRF given with the first receipt stays.
    expect(await part('TW-C0402-6P2')).toMatchObject({ quantity: 21, srf_hz: 11e9 });
    const audit = await t.sequelize.query<{ action: string; actor_id: number }>(`SELECT action, actor_id FROM audit_entries WHERE action = 'shortfall.receive' ORDER BY id`, { type: QueryTypes.SELECT });
    expect(audit).toEqual([
      { action: 'shortfall.receive', actor_id: purchasing.id },
      { action: 'shortfall.receive', actor_id: stores.id },
    ]);
  });
});
