/**
 * Shortfall lists as purchasing handles them (issue 6): lines of one part spec merged across the
 * matches of a build, the CSV export (papaparse reads it back; the formula-injection defence of
 * stock-csv.md and OWASP "CSV Injection"), e-mail through the real mail service to this file's
 * fake SMTP server with the CSV attached and a plain and an HTML body, status changes and roles.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
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
let fullBuildId: number;

/** The 868 MHz antenna match at 885 MHz: C = 0.035590 / (2 pi 885 MHz) = 6.4004 pF, L = 56.354 / (2 pi 885 MHz) = 10.134 nH. */
function design885(): PlannedMatchDesign {
  const base = subGhzDesign();
  return { ...base, frequencyHz: 885e6, elements: [{ ...base.elements[0], idealValue: 6.4004e-12 }, { ...base.elements[1], idealValue: 10.134e-9 }] };
}

const INJECTED_NAME = "=cmd|' /C calc'!A0";

beforeAll(async () => {
  t = await startTestApp();
  designer = await t.addUser('designer');
  purchasing = await t.addUser('purchasing');
  stores = await t.addUser('stores');
  // No 6.8 pF on hand and no other capacitor: every board is short of its shunt capacitor.
  const upload = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 0), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 1000)));
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
  buildId = await createBuild(
    t.sequelize,
    {
      name: 'NODE-915 rev B',
      quantity: 10,
      reserve: true,
      plans: [
        { matchId: 21, matchName: '868 MHz main antenna', design: subGhzDesign() },
        { matchId: 22, matchName: INJECTED_NAME, design: design885() },
        { matchId: 23, matchName: '868 MHz diversity antenna', design: subGhzDesign() },
      ],
    },
    designer.id,
  );
  // Then 5 x 6.2 pF arrive, and a one-board build of the 885 MHz match made with them is met in full.
  const more = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P2', 'C', '6.2pF', 'C', '10GHz', '0.2', 5)));
  expect(more.status).toBe(200);
  const met = design885();
  met.elements[0].parts = [{ partNumber: 'TW-C0402-6P2', perBoard: 1 }];
  fullBuildId = await createBuild(t.sequelize, { name: 'met in full', quantity: 1, reserve: true, plans: [{ matchId: 22, matchName: '885 MHz antenna', design: met }] }, designer.id);
});
afterAll(async () => {
  await t?.close();
});

const as = (user: { token: string }) => ({
  get: (url: string) => request(t.app).get(url).set('Authorization', `Bearer ${user.token}`),
  post: (url: string, body: object = {}) => request(t.app).post(url).set('Authorization', `Bearer ${user.token}`).send(body),
  patch: (url: string, body: object) => request(t.app).patch(url).set('Authorization', `Bearer ${user.token}`).send(body),
});

describe('GET /api/builds/:id/shortfall', () => {
  it('merges the two 868 MHz matches into one line and keeps the 885 MHz one apart', async () => {
    const res = await as(purchasing).get(`/api/builds/${buildId}/shortfall`);
    expect(res.status).toBe(200);
    expect(res.body.list).toMatchObject({ buildId, buildName: 'NODE-915 rev B', status: 'draft', attritionPercent: 5, lossBudgetDb: 0.5 });
    const lines = res.body.lines;
    expect(lines).toHaveLength(2);
    // 868 MHz: 6.5257 pF in E24 (6.2, 6.8): ln(6.5257/6.2) = 0.0512 > ln(6.8/6.5257) = 0.0412 -> 6.8 pF.
    // Two matches x 10 boards = 20 short -> 20 x 1.05 = 21. Minimum SRF 868 MHz / 0.5 = 1.736 GHz.
    expect(lines[0]).toMatchObject({ kind: 'capacitor', idealValue: 6.5257e-12, buyValue: 6.8e-12, series: 'E24', quantity: 21, shortQuantity: 20, package: '0402', reason: 'short-stock' });
    expect(lines[0].minSrfHz).toBeCloseTo(1.736e9, 0);
    expect(lines[0].sources.map((s: { matchId: number }) => s.matchId)).toEqual([21, 23]);
    // 885 MHz: 6.4004 pF in E24: ln(6.4004/6.2) = 0.0318 < ln(6.8/6.4004) = 0.0606 -> 6.2 pF; 10 x 1.05 = 10.5 -> 11;
    // minimum SRF 885 MHz / 0.5 = 1.77 GHz.
    expect(lines[1]).toMatchObject({ kind: 'capacitor', buyValue: 6.2e-12, series: 'E24', quantity: 11, shortQuantity: 10 });
    expect(lines[1].minSrfHz).toBeCloseTo(1.77e9, 0);
    // Below 10 pF the tolerance is one of IEC 60062's absolute letters.
    for (const line of lines) {
      expect(['D', 'C', 'B']).toContain(line.toleranceCode);
      expect(line.tolerance.mode).toBe('absolute');
    }
  });

  it('answers an empty list for a build with nothing short, and 404 for no build', async () => {
    const res = await as(designer).get(`/api/builds/${fullBuildId}/shortfall`);
    expect(res.body).toEqual({ lines: [], list: null });
    expect((await as(designer).get('/api/builds/424242/shortfall')).status).toBe(404);
  });
});

describe('GET /api/builds/:id/shortfall.csv', () => {
  it('exports the lines as CSV with the formula-injection defence', async () => {
    const res = await as(purchasing).get(`/api/builds/${buildId}/shortfall.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="shortfall-NODE-915-rev-B-${buildId}.csv"`);
    expect(res.text.startsWith('\uFEFF')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(res.text.slice(1), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([
      'line', 'kind', 'buy_value', 'series', 'quantity', 'tolerance', 'tolerance_code', 'min_srf', 'package',
      'ideal_value', 'short_quantity', 'loss_with_buy_value_db', 'reason', 'matches', 'received',
    ]);
    expect(parsed.data).toHaveLength(2);
    expect(parsed.data[0]).toMatchObject({ line: '1', kind: 'capacitor', buy_value: '6.8pF', series: 'E24', quantity: '21', min_srf: '1.736GHz', package: '0402', ideal_value: '6.526pF', short_quantity: '20', received: '0' });
    expect(parsed.data[0].matches).toBe('868 MHz main antenna (shunt); 868 MHz diversity antenna (shunt)');
    expect(parsed.data[1]).toMatchObject({ buy_value: '6.2pF', quantity: '11', min_srf: '1.77GHz' });
    // The match name began with "=": the cell starts with ' so a spreadsheet shows it as text.
    expect(parsed.data[1].matches).toBe(`'${INJECTED_NAME} (shunt)`);
    for (const row of parsed.data) for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });

  it('exports only the header for a build with nothing short', async () => {
    const res = await as(stores).get(`/api/builds/${fullBuildId}/shortfall.csv`);
    expect(res.text.replace('\uFEFF', '').trim().split('\r\n')).toHaveLength(1);
  });
});

describe('POST /api/builds/:id/shortfall/send', () => {
  it('e-mails the list with the CSV attached and marks it sent', async () => {
    const csv = (await as(purchasing).get(`/api/builds/${buildId}/shortfall.csv`)).text;
    const res = await as(purchasing).post(`/api/builds/${buildId}/shortfall/send`, { to: 'orders@parts-supplier.example' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ to: ['orders@parts-supplier.example'], status: 'sent', outboxId: expect.any(Number) });

    const [mail] = t.mail.messagesTo('orders@parts-supplier.example');
    expect(mail.subject).toBe('Shortfall list for build NODE-915 rev B');
    expect(mail.text).toContain('1. 21 x capacitor 6.8 pF E24');
    expect(mail.text).toContain('SRF >= 1.736 GHz, 0402');
    expect(mail.text).toContain('2. 11 x capacitor 6.2 pF E24');
    expect(mail.html).toContain('<strong>NODE-915 rev B</strong>');
    expect(mail.html).toContain('<td>21</td><td>capacitor</td><td>6.8 pF</td><td>E24</td>');
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0].filename).toBe(`shortfall-NODE-915-rev-B-${buildId}.csv`);
    expect(mail.attachments[0].contentType).toBe('text/csv');
    expect(mail.attachments[0].content.toString('utf8')).toBe(csv);

    const list = (await as(designer).get(`/api/builds/${buildId}/shortfall`)).body.list;
    expect(list).toMatchObject({ status: 'sent', sentTo: 'orders@parts-supplier.example' });
    const [outbox] = await t.sequelize.query<{ purpose: string; status: string; actor_id: number }>('SELECT purpose, status, actor_id FROM outbound_mail WHERE id = :id', {
      replacements: { id: res.body.outboxId },
      type: QueryTypes.SELECT,
    });
    expect(outbox).toEqual({ purpose: 'shortfall-list', status: 'sent', actor_id: purchasing.id });
    const audit = await t.sequelize.query<{ action: string }>(`SELECT action FROM audit_entries WHERE action = 'shortfall.send' AND actor_id = :id`, { replacements: { id: purchasing.id }, type: QueryTypes.SELECT });
    expect(audit).toHaveLength(1);
  });

  it('sends to several addresses and refuses a bad one by name', async () => {
    const res = await as(purchasing).post(`/api/builds/${buildId}/shortfall/send`, { to: 'a@supplier.example, b@supplier.example' });
    expect(res.status).toBe(200);
    expect(res.body.to).toEqual(['a@supplier.example', 'b@supplier.example']);
    expect(t.mail.messagesTo('b@supplier.example')).toHaveLength(1);
    const bad = await as(purchasing).post(`/api/builds/${buildId}/shortfall/send`, { to: 'not-an-address' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/name@example.com/);
    expect((await as(purchasing).post(`/api/builds/${buildId}/shortfall/send`, {})).status).toBe(400);
  });

  it('is for purchasing (and admin) only, and says when there is nothing to send', async () => {
    for (const user of [designer, stores]) {
      expect((await as(user).post(`/api/builds/${buildId}/shortfall/send`, { to: 'x@supplier.example' })).status).toBe(403);
    }
    const none = await as(purchasing).post(`/api/builds/${fullBuildId}/shortfall/send`, { to: 'x@supplier.example' });
    expect(none.status).toBe(409);
    expect(none.body.error.message).toMatch(/no shortfall list/);
  });

  it('leaves the list as it was when the mail server cannot be reached', async () => {
    const before = (await as(purchasing).get(`/api/builds/${buildId}/shortfall`)).body.list;
    // A port nothing listens on (the fake server's port + 1 is not ours; pick a closed loopback port).
    const { app } = t.appWith({ SMTP_PORT: '1' });
    const res = await request(app).post(`/api/builds/${buildId}/shortfall/send`).set('Authorization', `Bearer ${purchasing.token}`).send({ to: 'late@supplier.example' });
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('mail_unavailable');
    const after = (await as(purchasing).get(`/api/builds/${buildId}/shortfall`)).body.list;
    expect(after.sentTo).toBe(before.sentTo);
  });
});

describe('status and overview', () => {
  it('lets purchasing move the list on, audited, and lists it in GET /api/shortfall', async () => {
    expect((await as(stores).patch(`/api/builds/${buildId}/shortfall`, { status: 'ordered' })).status).toBe(403);
    const res = await as(purchasing).patch(`/api/builds/${buildId}/shortfall`, { status: 'ordered' });
    expect(res.status).toBe(200);
    expect(res.body.list.status).toBe('ordered');
    expect((await as(purchasing).patch(`/api/builds/${buildId}/shortfall`, { status: 'ordered' })).status).toBe(409);
    const bad = await as(purchasing).patch(`/api/builds/${buildId}/shortfall`, { status: 'lost' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/draft, sent, ordered, received/);

    const overview = await as(designer).get('/api/shortfall');
    expect(overview.status).toBe(200);
    expect(overview.body.items).toEqual([
      expect.objectContaining({ buildId, buildName: 'NODE-915 rev B', status: 'ordered', lineCount: 2, quantity: 21 + 11, receivedQuantity: 0, buildStatus: 'reserved' }),
    ]);
    expect((await as(designer).get('/api/shortfall?status=draft')).body.items).toEqual([]);
  });

  it('finds lists by part of their build\'s name, in any case and with % and _ literal, beside the status filter', async () => {
    const found = async (query: string) => {
      const res = await as(designer).get(`/api/shortfall?${query}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return { builds: (res.body.items as { buildName: string }[]).map((l) => l.buildName), total: res.body.total as number };
    };
    expect(await found('search=node-915')).toEqual({ builds: ['NODE-915 rev B'], total: 1 });
    expect(await found('search=node-915&status=ordered')).toEqual({ builds: ['NODE-915 rev B'], total: 1 });
    expect(await found('search=node-915&status=sent')).toEqual({ builds: [], total: 0 });
    expect(await found(`search=${encodeURIComponent('NODE_915')}`)).toEqual({ builds: [], total: 0 });
    expect(await found('search=gateway')).toEqual({ builds: [], total: 0 });
    const long = await as(designer).get(`/api/shortfall?search=${'x'.repeat(201)}`);
    expect(long.status).toBe(400);
    expect(long.body.error.details[0].field).toBe('search');
  });
});
