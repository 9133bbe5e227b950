/**
 * The stock list as the API shows it (api.md "Stock"): `GET /api/parts` with server-side paging,
 * sorting and filtering and api.md's exact item fields; `GET /api/parts/export.csv` in the import
 * schema, which re-imports with no changes, with the formula-injection defence (OWASP "CSV
 * Injection": a cell starting with = + - @ tab or CR gets a leading ').
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, csvFile, storedParts, uploadStock } from '../fixtures/stock/stock-upload.js';

let t: TestApp;
let stores: { token: string };
let designer: { token: string };
let purchasing: { token: string };

const STOCK = csvFile(
  FULL_HEADER,
  'TW-C0402-1P0,C,1p0,B,18GHz,,,,250,0402,50V,,main,E24,0.0125,TW-GRM-1P0,C0G chip capacitor',
  'TW-C0402-4P7,C,4.7pF,C,9.5GHz,,,0.35,0,0402,50V,,main,E12,0.0125,,C0G',
  'TW-C0603-100P,C,100p,J,1.2 G,,,,40,0603,100V,,lab,E12,0.03,,"=HYPERLINK(""http://evil.example"")"',
  'TW-L0402-12N,L,12nH,J,3.2GHz,38,500MHz,,75,0402,,300mA,main,E12,0.021,TW-LQW-12N,+wirewound',
  'TW-L0402-4N7,L,4n7,±0.2nH,6.1GHz,30,250 MHz,,10,0402,,500mA,lab,E12,0.021,@wire,-multilayer',
  'TW-L0603-120N,L,120nH,2%,1.1GHz,45,800MHz,,5,0603,,120mA,main,E12,0.05,,"\ttab start"',
);

beforeAll(async () => {
  t = await startTestApp();
  stores = await t.addUser('stores');
  designer = await t.addUser('designer');
  purchasing = await t.addUser('purchasing');
  const res = await uploadStock(t.app, stores.token, STOCK);
  expect(res.status, JSON.stringify(res.body.rejected)).toBe(200);
});
afterAll(async () => {
  await t?.close();
});

const get = (url: string, token = designer.token) => request(t.app).get(url).set('Authorization', `Bearer ${token}`);

describe('GET /api/parts', () => {
  it("returns api.md's item fields, in SI units, with available = quantity - reserved", async () => {
    const res = await get('/api/parts?search=TW-L0402-12N');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    expect(res.body.items[0]).toEqual({
      id: expect.any(Number),
      partNumber: 'TW-L0402-12N',
      kind: 'inductor',
      value: 12e-9,
      tolerance: { mode: 'relative', fraction: 0.05 },
      srfHz: 3.2e9,
      q: 38,
      qFrequencyHz: 500e6,
      esrOhm: null,
      quantity: 75,
      reserved: 0,
      available: 75,
      package: '0402',
      voltageRating: null,
      currentRating: 0.3,
      location: 'main',
      series: 'E12',
      unitCost: '0.021',
      manufacturerPart: 'TW-LQW-12N',
      description: '+wirewound',
    });
  });

  it('never shows available below zero when more are reserved than on hand', async () => {
    await t.sequelize.query("UPDATE parts SET reserved = 8 WHERE part_number = 'TW-L0603-120N'");
    try {
      const [item] = (await get('/api/parts?search=TW-L0603-120N')).body.items;
      expect([item.quantity, item.reserved, item.available]).toEqual([5, 8, 0]);
    } finally {
      await t.sequelize.query("UPDATE parts SET reserved = 0 WHERE part_number = 'TW-L0603-120N'");
    }
  });

  it('pages and sorts on the server', async () => {
    const page1 = await get('/api/parts?sort=value&order=desc&pageSize=2&page=1&kind=capacitor');
    const page2 = await get('/api/parts?sort=value&order=desc&pageSize=2&page=2&kind=capacitor');
    expect(page1.body.total).toBe(3);
    expect(page1.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual(['TW-C0603-100P', 'TW-C0402-4P7']);
    expect(page2.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual(['TW-C0402-1P0']);
    const byQuantity = await get('/api/parts?sort=quantity&order=asc&pageSize=3');
    expect(byQuantity.body.items.map((p: { quantity: number }) => p.quantity)).toEqual([0, 5, 10]);
  });

  it('filters by kind, location and a search text, which also matches a value such as 4p7', async () => {
    const lab = await get('/api/parts?location=lab');
    expect(lab.body.items.map((p: { partNumber: string }) => p.partNumber).sort()).toEqual(['TW-C0603-100P', 'TW-L0402-4N7']);
    const labInductors = await get('/api/parts?location=lab&kind=L');
    expect(labInductors.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual(['TW-L0402-4N7']);
    const text = await get('/api/parts?search=c0g');
    expect(text.body.total).toBe(2);
    const value = await get('/api/parts?search=4p7');
    // "4p7" reads as 4.7 pF (IEC 60062 code); no inductor is 4.7e-12 H, and "TW-L0402-4N7" does not contain "4p7".
    expect(value.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual(['TW-C0402-4P7']);
    const nano = await get('/api/parts?search=4.7nH');
    expect(nano.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual(['TW-L0402-4N7']);
    const percent = await get('/api/parts?search=100%25_');
    expect(percent.body.total).toBe(0);
  });

  it('refuses bad paging, sorting and kinds with 400 naming the field', async () => {
    for (const [query, field] of [
      ['sort=price', 'sort'],
      ['order=up', 'order'],
      ['page=0', 'page'],
      ['pageSize=501', 'pageSize'],
      ['kind=resistor', 'kind'],
    ]) {
      const res = await get(`/api/parts?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
    }
  });

  it('is readable by every signed-in role and nobody else', async () => {
    for (const token of [stores.token, designer.token, purchasing.token]) expect((await get('/api/parts', token)).status).toBe(200);
    expect((await request(t.app).get('/api/parts')).status).toBe(401);
    expect((await request(t.app).get('/api/parts/export.csv')).status).toBe(401);
    const locations = await get('/api/parts/locations');
    expect(locations.body.items).toEqual(['lab', 'main']);
  });

  it('shows one part by id, 404 for none', async () => {
    const [first] = (await get('/api/parts?sort=partNumber&pageSize=1')).body.items;
    expect((await get(`/api/parts/${first.id}`)).body).toEqual(first);
    expect((await get('/api/parts/99999999')).status).toBe(404);
  });
});

describe('GET /api/parts/export.csv', () => {
  it('writes the import schema, with formula-like text cells prefixed by an apostrophe', async () => {
    const res = await get('/api/parts/export.csv', purchasing.token);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="shelfmatch-stock-\d{4}-\d{2}-\d{2}\.csv"/);
    const text = res.text.replace(/^\uFEFF/, '');
    const rows = Papa.parse<Record<string, string>>(text.trim(), { header: true }).data;
    expect(Object.keys(rows[0])).toEqual(FULL_HEADER.split(','));
    const byPart = new Map(rows.map((r) => [r.part_number, r]));
    expect(byPart.get('TW-C0603-100P')!.description).toBe(`'=HYPERLINK("http://evil.example")`);
    expect(byPart.get('TW-L0402-12N')!.description).toBe("'+wirewound");
    expect(byPart.get('TW-L0402-4N7')!.description).toBe("'-multilayer");
    expect(byPart.get('TW-L0402-4N7')!.manufacturer_part).toBe("'@wire");
    // The import trims cells, so a tab at the start is gone before it could be exported.
    expect(byPart.get('TW-L0603-120N')!.description).toBe('tab start');
    expect(byPart.get('TW-C0402-1P0')).toMatchObject({ value: '1pF', tolerance: '0.1pF', srf: '18GHz', voltage_rating: '50V', unit_cost: '0.0125' });
    expect(byPart.get('TW-L0402-4N7')).toMatchObject({ value: '4.7nH', tolerance: '0.2nH', q_freq: '250MHz', current_rating: '500mA' });
    expect(byPart.get('TW-C0402-4P7')).toMatchObject({ esr: '0.35ohm', quantity: '0' });
  });

  it('re-imports with no changes, in merge and in replace mode', async () => {
    const before = await storedParts(t.sequelize);
    const exported = (await get('/api/parts/export.csv')).text;
    for (const mode of ['merge', 'replace']) {
      const res = await uploadStock(t.app, stores.token, exported, { mode });
      expect(res.status, JSON.stringify(res.body.rejected)).toBe(200);
      expect(res.body).toMatchObject({ rowsRead: 6, created: 0, updated: 0, unchanged: 6, zeroed: 0, rejected: [] });
    }
    expect(await storedParts(t.sequelize)).toEqual(before);
  });

  it('exports one location when asked', async () => {
    const res = await get('/api/parts/export.csv?location=lab');
    const rows = Papa.parse<Record<string, string>>(res.text.replace(/^\uFEFF/, '').trim(), { header: true }).data;
    expect(rows.map((r) => r.part_number).sort()).toEqual(['TW-C0603-100P', 'TW-L0402-4N7']);
  });
});
