/**
 * Receiving is one transaction with the stock lock held from its read of the stock to its write:
 * - a stores upload that holds the stock lock while a receipt arrives is not overwritten by the
 *   receipt (the receipt waits, then adds what arrived to the uploaded count);
 * - a receipt that fails after its import has run (here: the database refuses the update of the
 *   shortfall lines, a fault made with a real trigger in the real database) leaves stock, the
 *   import history, the lines and the list as they were.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes, type Transaction } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { createBuild } from '../../server/services/builds/create-build.js';
import { lockStockQuantities } from '../../server/services/stock/import-stock-list.js';
import { stockFile, stockRow, subGhzDesign } from './builds-scenario.js';

let t: TestApp;
let purchasing: { id: number; token: string };
let stores: { id: number; token: string };
let buildId: number;
let capacitorLine: { id: number; quantity: number };

beforeAll(async () => {
  t = await startTestApp();
  const designer = await t.addUser('designer');
  purchasing = await t.addUser('purchasing');
  stores = await t.addUser('stores');
  const upload = await uploadStock(t.app, stores.token, stockFile(stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 0), stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 500)));
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
  buildId = await createBuild(t.sequelize, { name: 'NODE-868', quantity: 20, reserve: true, plans: [{ matchId: 31, matchName: '868 MHz antenna', design: subGhzDesign() }] }, designer.id);
  const lines = (await request(t.app).get(`/api/builds/${buildId}/shortfall`).set('Authorization', `Bearer ${purchasing.token}`)).body.lines;
  // 20 boards, none of the 6.8 pF on hand: 20 x 1.05 = 21 to buy.
  expect(lines.map((l: { buyValue: number; quantity: number }) => [l.buyValue, l.quantity])).toEqual([[6.8e-12, 21]]);
  capacitorLine = lines[0];
});
afterAll(async () => {
  await t?.close();
});

const receive = (body: object) => request(t.app).post(`/api/builds/${buildId}/shortfall/receive`).set('Authorization', `Bearer ${purchasing.token}`).send(body);

async function onHand(partNumber: string): Promise<number> {
  const [row] = await t.sequelize.query<{ quantity: number }>('SELECT quantity FROM parts WHERE part_number = :partNumber', { replacements: { partNumber }, type: QueryTypes.SELECT });
  return row.quantity;
}

async function count(sql: string): Promise<number> {
  const [{ n }] = await t.sequelize.query<{ n: string }>(sql, { type: QueryTypes.SELECT });
  return Number(n);
}

/** Waits until some session waits for an advisory lock (the receipt, queued behind `holder`). */
async function untilSomeoneWaitsForALock(): Promise<void> {
  for (let i = 0; i < 500; i += 1) {
    if ((await count("SELECT count(*) AS n FROM pg_locks WHERE locktype = 'advisory' AND NOT granted")) > 0) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  throw new Error('the receipt never queued for the stock lock');
}

describe('receiving into stock, one transaction under the stock lock', () => {
  it('waits for an upload that holds the stock lock and adds what arrived to its count', async () => {
    expect(await onHand('TW-C0402-6P8')).toBe(0);
    // What a stores upload does: take the stock lock, set a new count, commit.
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    const upload = t.sequelize.transaction(async (transaction: Transaction) => {
      await lockStockQuantities(t.sequelize, transaction);
      await t.sequelize.query("UPDATE parts SET quantity = 40 WHERE part_number = 'TW-C0402-6P8'", { transaction });
      await released;
    });
    // Let the upload take the lock before the receipt starts.
    for (let i = 0; i < 500 && (await count("SELECT count(*) AS n FROM pg_locks WHERE locktype = 'advisory' AND granted")) === 0; i += 1) {
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    const receipt = receive({ lines: [{ lineId: capacitorLine.id, quantity: 5, partNumber: 'TW-C0402-6P8' }] }).then((res) => res);
    await untilSomeoneWaitsForALock();
    release();
    await upload;
    const res = await receipt;
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 40 counted by the upload + 5 received; a receipt that read 0 before the upload would write 5.
    expect(await onHand('TW-C0402-6P8')).toBe(45);
    const [change] = await t.sequelize.query<{ quantity_before: number; quantity_after: number }>(
      'SELECT quantity_before, quantity_after FROM stock_import_changes WHERE import_id = :importId',
      { replacements: { importId: res.body.importId }, type: QueryTypes.SELECT },
    );
    expect(change).toEqual({ quantity_before: 40, quantity_after: 45 });
  });

  it('leaves stock, history, lines and list as they were when a later step of the receipt fails', async () => {
    const quantityBefore = await onHand('TW-C0402-6P8');
    const importsBefore = await count('SELECT count(*) AS n FROM stock_imports');
    const partsBefore = await count('SELECT count(*) AS n FROM parts');
    const [lineBefore] = await t.sequelize.query<{ received_quantity: number }>('SELECT received_quantity FROM shortfall_lines WHERE id = :id', {
      replacements: { id: capacitorLine.id },
      type: QueryTypes.SELECT,
    });
    // A fault in the step after the import: the database refuses to update any shortfall line.
    await t.sequelize.query(`
      CREATE FUNCTION refuse_line_update() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'shortfall lines are read-only in this test'; END $$;
      CREATE TRIGGER refuse_line_update BEFORE UPDATE ON shortfall_lines FOR EACH ROW EXECUTE FUNCTION refuse_line_update();
    `);
    try {
      const res = await receive({
        lines: [
          { lineId: capacitorLine.id, quantity: 3, partNumber: 'TW-C0402-6P8' },
          { lineId: capacitorLine.id, quantity: 2, partNumber: 'TW-C0402-6P8-NEW' },
        ],
      });
      expect(res.status).toBe(500);
    } finally {
      await t.sequelize.query('DROP TRIGGER refuse_line_update ON shortfall_lines; DROP FUNCTION refuse_line_update();');
    }
    expect(await onHand('TW-C0402-6P8')).toBe(quantityBefore);
    expect(await count('SELECT count(*) AS n FROM parts')).toBe(partsBefore);
    expect(await count('SELECT count(*) AS n FROM stock_imports')).toBe(importsBefore);
    expect(await count("SELECT count(*) AS n FROM pg_class WHERE relname = 'stock_import_stage'")).toBe(0);
    const [lineAfter] = await t.sequelize.query<{ received_quantity: number }>('SELECT received_quantity FROM shortfall_lines WHERE id = :id', {
      replacements: { id: capacitorLine.id },
      type: QueryTypes.SELECT,
    });
    expect(lineAfter).toEqual(lineBefore);

    // With the fault gone the same receipt goes through whole.
    const res = await receive({ lines: [{ lineId: capacitorLine.id, quantity: 3, partNumber: 'TW-C0402-6P8' }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await onHand('TW-C0402-6P8')).toBe(quantityBefore + 3);
    expect(await count("SELECT count(*) AS n FROM pg_class WHERE relname = 'stock_import_stage'")).toBe(0);
  });
});
