/**
 * The import's bulk path (server/services/stock/import-stock-list.ts): accepted rows are COPYed in
 * binary form into a temporary stage table and applied by one set-based statement. These tests
 * check what that path must keep from stock-csv.md at sizes where it matters: a big file lands
 * whole with every value as written, or not at all; a rolled-back import (dry run, refusal, a
 * conflict in the middle of writing) leaves no part, change row, history entry or stage table;
 * text of any kind arrives byte for byte; the history's before/after lists exactly the fields that
 * differ. Expected values follow from the SI prefixes (BIPM SI Brochure, 9th ed., table 7: p = 1e-12,
 * n = 1e-9, G = 1e9, m = 1e-3) and IEC 60062 (letter C = ±0.25 pF, 4p7 = 4.7 pF), as in
 * stock-columns.test.ts; every outcome is read back from PostgreSQL.
 */
import { Decimal } from 'decimal.js';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { FULL_HEADER, clearStock, csvFile, quantities, storedParts, uploadStock } from '../fixtures/stock/stock-upload.js';

let t: TestApp;
let stores: { id: number; token: string };
beforeAll(async () => {
  t = await startTestApp();
  stores = await t.addUser('stores');
});
afterAll(async () => {
  await t?.close();
});
beforeEach(async () => {
  await clearStock(t.sequelize);
});

async function count(sql: string): Promise<number> {
  const [{ n }] = await t.sequelize.query<{ n: string }>(sql, { type: QueryTypes.SELECT });
  return Number(n);
}

/** Stage tables still there in any session (each import's is dropped with its transaction). */
function stageTables(): Promise<number> {
  return count("SELECT count(*) AS n FROM pg_class WHERE relname = 'stock_import_stage'");
}

const ROWS = 30_000;

/**
 * `ROWS` rows over two locations, alternating three capacitor and inductor forms whose SI values
 * are known from the prefixes and IEC 60062 (listed with each form), with `quantityOf(i)` on hand.
 */
const FORMS = [
  { kind: 'C', value: '4p7', valueSi: 4.7e-12, tolerance: 'C', toleranceKind: 'absolute', toleranceValue: 0.25e-12, srf: '6.2GHz', srfHz: 6.2e9, esr: '300m', esrOhm: 0.3 },
  { kind: 'L', value: '12nH', valueSi: 12e-9, tolerance: '5%', toleranceKind: 'relative', toleranceValue: 0.05, srf: '3.1 G', srfHz: 3.1e9, esr: '', esrOhm: null },
  { kind: 'cap', value: '100p', valueSi: 100e-12, tolerance: 'J', toleranceKind: 'relative', toleranceValue: 0.05, srf: '', srfHz: null, esr: '0.5', esrOhm: 0.5 },
] as const;

function bigFile(quantityOf: (i: number) => number, lastRow?: string): string {
  const rows: string[] = [];
  for (let i = 0; i < ROWS; i += 1) {
    const f = FORMS[i % FORMS.length];
    const cells: Record<string, string> = {
      part_number: `BK-${i}`,
      kind: f.kind,
      value: f.value,
      tolerance: f.tolerance,
      srf: f.srf,
      esr: f.esr,
      quantity: String(quantityOf(i)),
      package: '0402',
      location: i % 2 === 0 ? 'main' : 'lab',
      unit_cost: (i % 7) === 0 ? '' : `0.0${i % 10}5`,
      description: `bulk part ${i}`,
    };
    rows.push(FULL_HEADER.split(',').map((c) => cells[c] ?? '').join(','));
  }
  if (lastRow !== undefined) rows[rows.length - 1] = lastRow;
  return csvFile(FULL_HEADER, ...rows);
}

function near(actual: number | null, expected: number | null): boolean {
  if (actual === null || expected === null) return actual === expected;
  return Math.abs(actual / expected - 1) < 1e-12;
}

describe('a big file', () => {
  it('is applied whole, every part as its row says, with one change row per part', async () => {
    const res = await uploadStock(t.app, stores.token, bigFile((i) => i % 500));
    expect(res.status, JSON.stringify(res.body.rejected?.slice(0, 3))).toBe(200);
    expect(res.body).toMatchObject({ applied: true, rowsRead: ROWS, created: ROWS, updated: 0, unchanged: 0, rejectedRows: 0 });
    const parts = await storedParts(t.sequelize);
    expect(parts).toHaveLength(ROWS);
    const byNumber = new Map(parts.map((p) => [p.part_number, p]));
    for (const i of [0, 1, 2, 3, 4999, 12_345, ROWS - 1]) {
      const p = byNumber.get(`BK-${i}`)!;
      const f = FORMS[i % FORMS.length];
      expect(p.location).toBe(i % 2 === 0 ? 'main' : 'lab');
      expect(p.kind).toBe(f.kind === 'L' ? 'inductor' : 'capacitor');
      expect(near(p.value_si, f.valueSi), `value of BK-${i}: ${p.value_si}`).toBe(true);
      expect(p.tolerance_kind).toBe(f.toleranceKind);
      expect(near(p.tolerance_value, f.toleranceValue)).toBe(true);
      expect(near(p.srf_hz, f.srfHz)).toBe(true);
      expect(near(p.esr_ohm, f.esrOhm)).toBe(true);
      expect(p.quantity).toBe(i % 500);
      expect(p.unit_cost === null ? null : new Decimal(p.unit_cost).toFixed()).toBe(i % 7 === 0 ? null : new Decimal(`0.0${i % 10}5`).toFixed());
      expect(p.description).toBe(`bulk part ${i}`);
    }
    expect(await count(`SELECT count(*) AS n FROM stock_import_changes WHERE import_id = ${res.body.importId} AND change = 'created'`)).toBe(ROWS);
    expect(await stageTables()).toBe(0);
  });

  it('with one bad row at its end changes nothing, and a dry run of it writes nothing', async () => {
    await uploadStock(t.app, stores.token, bigFile((i) => i % 500));
    const before = await quantities(t.sequelize);
    const changesBefore = await count('SELECT count(*) AS n FROM stock_import_changes');
    const importsBefore = await count('SELECT count(*) AS n FROM stock_imports');

    const bad = await uploadStock(t.app, stores.token, bigFile((i) => (i % 500) + 1, 'BK-LAST,C,4p7,C,,,,,several,0402,,,main,,,,'));
    expect(bad.status).toBe(422);
    expect(bad.body.rejected).toEqual([{ line: ROWS + 1, column: 'quantity', value: 'several', message: expect.stringMatching(/not a whole number/) }]);
    expect(await quantities(t.sequelize)).toEqual(before);
    expect(await count('SELECT count(*) AS n FROM stock_import_changes')).toBe(changesBefore);

    const dry = await uploadStock(t.app, stores.token, bigFile((i) => (i % 500) + 1), { dryRun: true, mode: 'replace' });
    expect(dry.status).toBe(200);
    expect(dry.body).toMatchObject({ applied: false, dryRun: true, updated: ROWS, unchanged: 0, created: 0, zeroed: 0, importId: null });
    expect(await quantities(t.sequelize)).toEqual(before);
    expect(await count('SELECT count(*) AS n FROM stock_import_changes')).toBe(changesBefore);
    // The refused upload is in the history (as rejected); the dry run is not.
    expect(await count('SELECT count(*) AS n FROM stock_imports')).toBe(importsBefore + 1);
    expect(await stageTables()).toBe(0);
  });
});

describe('a conflict while the rows are written', () => {
  it('fails the import whole with 409 when another transaction creates one of its parts meanwhile', async () => {
    await uploadStock(t.app, stores.token, csvFile('part_number,kind,value,tolerance,quantity', 'OLD1,C,1p0,C,5'));
    const changesBefore = await count('SELECT count(*) AS n FROM stock_import_changes');
    const appliedBefore = await count("SELECT count(*) AS n FROM stock_imports WHERE status = 'applied'");

    // A writer that does not take the stock lock inserts N2 and keeps its transaction open, so the
    // import's insert of N2 must wait on the unique key until that transaction ends.
    const other = await t.sequelize.transaction();
    await t.sequelize.query(
      "INSERT INTO parts (part_number, location, kind, value_si, tolerance_kind, tolerance_value, quantity) VALUES ('N2', 'main', 'capacitor', 2.2e-12, 'absolute', 0.25e-12, 7)",
      { transaction: other },
    );
    const upload = uploadStock(t.app, stores.token, csvFile('part_number,kind,value,tolerance,quantity', 'OLD1,C,1p0,C,6', 'N1,C,1p5,C,1', 'N2,C,2p2,C,2')).then((r) => r);
    let waiting = 0;
    for (let tries = 0; tries < 400 && waiting === 0; tries += 1) {
      await new Promise((resolve) => setTimeout(resolve, 25));
      // This file's database is its own, so a session of it waiting for a transaction is the import.
      waiting = await count(
        "SELECT count(*) AS n FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid() AND wait_event_type = 'Lock' AND wait_event = 'transactionid'",
      );
    }
    await other.commit();
    expect(waiting, 'the import should have been waiting on the other transaction').toBe(1);

    const res = await upload;
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/created by someone else while this import ran; nothing was applied/);
    // Nothing of the import: OLD1 keeps 5, N1 was not created, N2 is the other writer's.
    expect(await quantities(t.sequelize)).toEqual({ 'N2@main': 7, 'OLD1@main': 5 });
    expect(await count('SELECT count(*) AS n FROM stock_import_changes')).toBe(changesBefore);
    expect(await count("SELECT count(*) AS n FROM stock_imports WHERE status = 'applied'")).toBe(appliedBefore);
    expect(await stageTables()).toBe(0);
  });
});

describe('text', () => {
  it('arrives exactly as written: non-ASCII letters, backslashes, quotes, line breaks and semicolons', async () => {
    const header = 'part_number,kind,value,tolerance,quantity,manufacturer_part,description,location';
    const res = await uploadStock(
      t.app,
      stores.token,
      csvFile(
        header,
        'Kühl-µ1,C,4p7,C,1,GRM\\0402\\N,"±0.25 pF; ""C0G"", 50 V",Lager Süd',
        'TAB\\t,L,12n,5%,2,LQW15AN,"first line\nsecond line",main',
        '日本-7,C,1p0,C,3,\\,"emoji 🙂 and ümlaut",main',
      ),
    );
    expect(res.status, JSON.stringify(res.body.rejected)).toBe(200);
    const parts = new Map((await storedParts(t.sequelize)).map((p) => [p.part_number, p]));
    expect(parts.get('Kühl-µ1')).toMatchObject({ location: 'Lager Süd', manufacturer_part: 'GRM\\0402\\N', description: '±0.25 pF; "C0G", 50 V' });
    expect(parts.get('TAB\\t')).toMatchObject({ manufacturer_part: 'LQW15AN', description: 'first line\nsecond line' });
    expect(parts.get('日本-7')).toMatchObject({ manufacturer_part: '\\', description: 'emoji 🙂 and ümlaut' });
  });
});

describe('the history of an update', () => {
  it('lists exactly the fields that differ, before and after, and none when only the count changed', async () => {
    const header = 'part_number,kind,value,tolerance,srf,q,q_freq,esr,quantity,package,unit_cost,description';
    await uploadStock(t.app, stores.token, csvFile(header, 'A1,L,12n,5%,3.1GHz,40,500MHz,,10,0402,0.02,wirewound', 'A2,C,4p7,C,6GHz,,,0.3,20,0402,0.5,chip'));
    const res = await uploadStock(t.app, stores.token, csvFile(header, 'A1,L,12n,5%,2.9GHz,45,500MHz,,10,0603,0.0200,wirewound 2%', 'A2,C,4p7,C,6GHz,,,0.3,19,0402,0.50,chip'));
    expect(res.body).toMatchObject({ updated: 2, unchanged: 0 });
    const detail = await request(t.app).get(`/api/stock/imports/${res.body.importId}`).set('Authorization', `Bearer ${stores.token}`);
    const byPart = new Map(detail.body.changes.map((c: { partNumber: string }) => [c.partNumber, c]));
    const a1 = byPart.get('A1') as { quantityBefore: number; quantityAfter: number; fields: { field: string; before: unknown; after: unknown }[] };
    expect([a1.quantityBefore, a1.quantityAfter]).toEqual([10, 10]);
    // 0.02 and 0.0200 are the same cost, so unitCost is not listed.
    expect(Object.fromEntries(a1.fields.map((f) => [f.field, [f.before, f.after]]))).toEqual({
      srfHz: [3.1e9, 2.9e9],
      q: [40, 45],
      package: ['0402', '0603'],
      description: ['wirewound', 'wirewound 2%'],
    });
    expect(byPart.get('A2')).toMatchObject({ quantityBefore: 20, quantityAfter: 19, fields: [] });
  });

  it('shows a changed cost as the stored decimal and the file decimal', async () => {
    const header = 'part_number,kind,value,tolerance,quantity,unit_cost';
    await uploadStock(t.app, stores.token, csvFile(header, 'A1,C,1p0,C,1,0.02'));
    const res = await uploadStock(t.app, stores.token, csvFile(header, 'A1,C,1p0,C,1,0.0305'));
    const detail = await request(t.app).get(`/api/stock/imports/${res.body.importId}`).set('Authorization', `Bearer ${stores.token}`);
    const [field] = detail.body.changes[0].fields;
    expect(field.field).toBe('unitCost');
    expect(new Decimal(field.before).equals('0.02')).toBe(true);
    expect(new Decimal(field.after).equals('0.0305')).toBe(true);
  });
});

describe('replace mode with skipped rows', () => {
  it('zeroes only what no row names, and says how many parts on skipped rows keep their counts', async () => {
    const header = 'part_number,kind,value,tolerance,quantity,location';
    await uploadStock(t.app, stores.token, csvFile(header, 'A1,C,1p0,C,5,main', 'A2,C,2p2,C,6,main', 'A3,C,3p3,C,7,main', 'B1,C,1p0,C,8,lab'));
    const res = await uploadStock(t.app, stores.token, csvFile(header, 'A1,C,1p0,C,9,main', 'A2,C,2p2,C,lots,main', 'NEW,C,1p5,C,1,main'), { mode: 'replace', skipInvalid: true });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ created: 1, updated: 1, zeroed: 1, rejectedRows: 1 });
    expect(await quantities(t.sequelize)).toEqual({ 'A1@main': 9, 'A2@main': 6, 'A3@main': 0, 'NEW@main': 1, 'B1@lab': 8 });
    expect(res.body.warnings).toContainEqual({
      line: 0,
      column: 'part_number',
      value: '',
      message: '1 part(s) on skipped rows keep their quantities: replace mode does not zero a part whose row was rejected',
    });
  });
});
