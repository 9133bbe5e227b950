/**
 * What an upload does (handbook stock-csv.md): all or nothing, skip-invalid, dry run, merge and
 * replace, duplicates, encodings, limits, line numbers as a spreadsheet shows them, history with
 * per-part before/after, audit, concurrency and roles. Every outcome is checked in PostgreSQL.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { clearStock, csvFile, quantities, storedParts, uploadStock } from '../fixtures/stock/stock-upload.js';

const FIXTURES = join(import.meta.dirname, '..', 'fixtures', 'stock');
const HEADER = 'part_number,kind,value,tolerance,quantity,location';

let t: TestApp;
let stores: { id: number; token: string };
let admin: { id: number; token: string };
let designer: { id: number; token: string };
let purchasing: { id: number; token: string };
beforeAll(async () => {
  t = await startTestApp();
  stores = await t.addUser('stores');
  admin = await t.addUser('admin');
  designer = await t.addUser('designer');
  purchasing = await t.addUser('purchasing');
});
afterAll(async () => {
  await t?.close();
});
beforeEach(async () => {
  await clearStock(t.sequelize);
});

async function count(table: string): Promise<number> {
  const [{ n }] = await t.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT });
  return Number(n);
}

const BASE = csvFile(HEADER, 'C1,C,1p0,B,100,main', 'C2,C,2p2,C,50,main', 'L1,L,12n,5%,30,main', 'L9,L,3n3,5%,8,lab');

describe('applying a file', () => {
  it('creates parts, then updates only what changed, and records both imports with per-part before/after', async () => {
    const first = await uploadStock(t.app, stores.token, BASE, { fileName: 'tarnwick-week-48.csv' });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ applied: true, dryRun: false, mode: 'merge', rowsRead: 4, created: 4, updated: 0, unchanged: 0, zeroed: 0, rejected: [] });
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 100, 'C2@main': 50, 'L1@main': 30, 'L9@lab': 8 });

    const second = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,100,main', 'C2,C,2p2,D,45,main', 'L1,L,12n,5%,30,main'));
    expect(second.body).toMatchObject({ applied: true, created: 0, updated: 1, unchanged: 2, zeroed: 0 });
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 100, 'C2@main': 45, 'L1@main': 30, 'L9@lab': 8 });

    const detail = await request(t.app).get(`/api/stock/imports/${second.body.importId}`).set('Authorization', `Bearer ${designer.token}`);
    expect(detail.status).toBe(200);
    expect(detail.body).toMatchObject({ id: second.body.importId, status: 'applied', previousImportId: first.body.importId, updated: 1, unchanged: 2, changesTotal: 1 });
    expect(detail.body.user).toMatchObject({ id: stores.id });
    expect(detail.body.changes).toEqual([
      {
        partId: expect.any(Number),
        partNumber: 'C2',
        location: 'main',
        kind: 'capacitor',
        change: 'updated',
        quantityBefore: 50,
        quantityAfter: 45,
        // IEC 60062: C is ±0.25 pF, D is ±0.5 pF.
        fields: [{ field: 'tolerance', before: { mode: 'absolute', deltaSi: 0.25e-12 }, after: { mode: 'absolute', deltaSi: 0.5e-12 } }],
      },
    ]);

    const list = await request(t.app).get('/api/stock/imports').set('Authorization', `Bearer ${purchasing.token}`);
    expect(list.body.total).toBe(2);
    const [newest, oldest] = list.body.items;
    expect(newest.id).toBe(second.body.importId);
    expect(oldest).toMatchObject({ fileName: 'tarnwick-week-48.csv', mode: 'merge', created: 4, rowsRead: 4, locations: ['lab', 'main'] });
    // SHA-256 of the uploaded bytes (FIPS 180-4), computed here independently of the server.
    const { createHash } = await import('node:crypto');
    expect(oldest.sha256).toBe(createHash('sha256').update(Buffer.from(BASE)).digest('hex'));
    expect(oldest.sizeBytes).toBe(Buffer.byteLength(BASE));

    const created = await request(t.app).get(`/api/stock/imports/${first.body.importId}?change=created&pageSize=2&page=2`).set('Authorization', `Bearer ${stores.token}`);
    expect(created.body.changesTotal).toBe(4);
    // By location, then part number: lab L9; main C1, C2, L1. Page 2 of 2 per page is C2, L1.
    expect(created.body.changes.map((c: { partNumber: string; quantityBefore: null }) => [c.partNumber, c.quantityBefore])).toEqual([
      ['C2', null],
      ['L1', null],
    ]);
  });

  it('writes an audit entry for each applied import, by the uploader', async () => {
    const res = await uploadStock(t.app, admin.token, BASE);
    const entries = await t.sequelize.query<{ actor_id: number; action: string; entity_id: string; after: { created: number; fileName: string } }>(
      "SELECT actor_id, action, entity_id, after FROM audit_entries WHERE entity_type = 'stock_import'",
      { type: QueryTypes.SELECT },
    );
    expect(entries).toEqual([{ actor_id: admin.id, action: 'stock.import', entity_id: String(res.body.importId), after: expect.objectContaining({ created: 4, fileName: 'stock.csv' }) }]);
  });

  it('leaves fields alone whose columns the file does not have', async () => {
    await uploadStock(t.app, stores.token, csvFile('part_number,kind,value,tolerance,srf,quantity,unit_cost', 'C1,C,1p0,B,18GHz,100,0.02'));
    const res = await uploadStock(t.app, stores.token, csvFile('part_number,kind,value,tolerance,quantity', 'C1,C,1p0,B,80'));
    expect(res.body).toMatchObject({ updated: 1 });
    const [part] = await storedParts(t.sequelize);
    expect([part.quantity, part.srf_hz, part.unit_cost]).toEqual([80, 18e9, '0.0200']);
  });

  it('reads a semicolon file with a byte-order mark and CRLF line ends', async () => {
    const res = await uploadStock(t.app, stores.token, readFileSync(join(FIXTURES, 'semicolon-bom-crlf.csv')), { fileName: 'semicolon-bom-crlf.csv' });
    expect(res.status).toBe(200);
    expect(res.body.created).toBe(3);
    const parts = await storedParts(t.sequelize);
    expect(parts.map((p) => [p.part_number, p.location, p.value_si, p.srf_hz, p.quantity, p.description])).toEqual([
      ['TW-L0402-12N', 'lab', 12e-9, 3.1e9, 40, 'Wirewound'],
      ['TW-C0402-10P', 'main', 10e-12, 6.1e9, 120, 'Kondensator; C0G'],
      ['TW-C0402-1P0', 'main', 1e-12, 18e9, 250, 'C0G 50 V'],
    ]);
  });
});

describe('all or nothing', () => {
  it('changes nothing when one row is bad, and says which line, column and why', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const before = await storedParts(t.sequelize);
    const changesBefore = await count('stock_import_changes');
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,1,main', 'C3,C,3p3,B,7,main', 'C4,C,4p7,B,lots,main', 'C5,C,5p6,B,9,main'));
    expect(res.status).toBe(422);
    expect(res.body).toMatchObject({ applied: false, rowsRead: 4, created: 0, updated: 0, rejectedRows: 1 });
    expect(res.body.rejected).toEqual([{ line: 4, column: 'quantity', value: 'lots', message: expect.stringMatching(/not a whole number/) }]);
    expect(res.body.error).toMatchObject({ code: 'rejected', message: expect.stringMatching(/1 row\(s\) were rejected, so nothing was applied/) });
    expect(await storedParts(t.sequelize)).toEqual(before);
    expect(await count('stock_import_changes')).toBe(changesBefore);
    const [entry] = await t.sequelize.query<{ status: string; rejected_count: number }>('SELECT status, rejected_count FROM stock_imports WHERE id = :id', {
      replacements: { id: res.body.importId },
      type: QueryTypes.SELECT,
    });
    expect(entry).toEqual({ status: 'rejected', rejected_count: 1 });
  });

  it('applies the valid rows and lists the skipped ones when asked to skip invalid rows', async () => {
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,1,main', 'C4,C,4p7,Z,2,main', 'C5,C,5p6,B,9,main'), { skipInvalid: true });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ applied: true, created: 2, rejectedRows: 1 });
    expect(res.body.rejected).toEqual([expect.objectContaining({ line: 3, column: 'tolerance', value: 'Z' })]);
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 1, 'C5@main': 9 });
  });

  it('reports a dry run with its counts and applies nothing, keeping no history', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const importsBefore = await count('stock_imports');
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,99,main', 'C7,C,6p8,B,5,main'), { dryRun: true, mode: 'replace' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ applied: false, dryRun: true, mode: 'replace', created: 1, updated: 1, zeroed: 2, importId: null });
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 100, 'C2@main': 50, 'L1@main': 30, 'L9@lab': 8 });
    expect(await count('stock_imports')).toBe(importsBefore);
  });

  it('refuses a file with an unclosed quote whole, even with skip-invalid, since later rows cannot be read', async () => {
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER + ',description', 'C1,C,1p0,B,1,main,"open', 'C2,C,2p2,B,2,main,x'), { skipInvalid: true });
    expect(res.status).toBe(422);
    expect(res.body.rejected[0]).toMatchObject({ line: 2, message: expect.stringMatching(/never closed/) });
    expect(await count('parts')).toBe(0);
  });
});

describe('line numbers as a spreadsheet shows them', () => {
  it('counts the header as line 1, a quoted cell with line breaks as one row, and blank rows', async () => {
    const file = [
      'part_number,kind,value,tolerance,quantity,description',
      'C1,C,1p0,B,1,"first line',
      'second line',
      'third line"',
      '',
      'C2,C,2p2,B,-4,plain',
      '"C3",C,3p3,B,3,"a ""quoted"" word"',
      'C4,X,3p3,B,3,',
    ].join('\n');
    const res = await uploadStock(t.app, stores.token, file);
    expect(res.status).toBe(422);
    // Spreadsheet rows: 1 header, 2 C1 (three text lines), 3 blank, 4 C2, 5 C3, 6 C4.
    expect(res.body.rejected.map((p: { line: number; column: string }) => [p.line, p.column])).toEqual([
      [4, 'quantity'],
      [6, 'kind'],
    ]);
    expect(res.body.rowsRead).toBe(4);
  });
});

describe('merge and replace', () => {
  it('replace zeroes the parts of the named locations that the file leaves out, keeps other locations, deletes nothing', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,90,main', 'C8,C,8p2,B,4,main'), { mode: 'replace' });
    expect(res.body).toMatchObject({ applied: true, created: 1, updated: 1, zeroed: 2 });
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 90, 'C2@main': 0, 'C8@main': 4, 'L1@main': 0, 'L9@lab': 8 });
    const detail = await request(t.app).get(`/api/stock/imports/${res.body.importId}?change=zeroed`).set('Authorization', `Bearer ${stores.token}`);
    expect(detail.body.changes.map((c: { partNumber: string; quantityBefore: number; quantityAfter: number }) => [c.partNumber, c.quantityBefore, c.quantityAfter])).toEqual([
      ['C2', 50, 0],
      ['L1', 30, 0],
    ]);
  });

  it('merge leaves parts that are not in the file alone', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,90,main'), { mode: 'merge' });
    expect(res.body).toMatchObject({ updated: 1, zeroed: 0 });
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 90, 'C2@main': 50, 'L1@main': 30, 'L9@lab': 8 });
  });

  it('replace with skip-invalid does not zero a part whose row was rejected', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,90,main', 'C2,C,2p2,B,many,main'), { mode: 'replace', skipInvalid: true });
    expect(res.status).toBe(200);
    expect(res.body.zeroed).toBe(1);
    expect(await quantities(t.sequelize)).toEqual({ 'C1@main': 90, 'C2@main': 50, 'L1@main': 0, 'L9@lab': 8 });
  });
});

describe('duplicates', () => {
  it('refuses the second row with the same part_number and location, and allows the same part number elsewhere', async () => {
    const res = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,1,main', 'C1,C,1p0,B,2,lab', 'C1,C,1p0,B,3,main'));
    expect(res.status).toBe(422);
    expect(res.body.rejected).toEqual([
      { line: 4, column: 'part_number', value: 'C1', message: 'part_number "C1" at location "main" is already on line 2; each part may appear once per location' },
    ]);
    const skipped = await uploadStock(t.app, stores.token, csvFile(HEADER, 'C1,C,1p0,B,1,main', 'C1,C,1p0,B,2,lab', 'C1,C,1p0,B,3,main'), { skipInvalid: true });
    expect(skipped.body.created).toBe(2);
    expect(await quantities(t.sequelize)).toEqual({ 'C1@lab': 2, 'C1@main': 1 });
  });
});

describe('encodings and limits', () => {
  it('refuses a file that is not UTF-8, naming the byte and its line', async () => {
    const res = await uploadStock(t.app, stores.token, readFileSync(join(FIXTURES, 'latin1-description.csv')));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('not_utf8');
    // "é" in ISO-8859-1 is the single byte 0xE9, which cannot stand alone in UTF-8 (RFC 3629).
    expect(res.body.error.message).toMatch(/not UTF-8 text: byte 0xE9 on line 2/);
    const utf16 = await uploadStock(t.app, stores.token, readFileSync(join(FIXTURES, 'utf16-export.csv')));
    expect(utf16.status).toBe(400);
    expect(utf16.body.error.message).toMatch(/UTF-16/);
    expect(await count('parts')).toBe(0);
  });

  it('refuses a file with a NUL byte (in a cell or a header name, real or dry run), naming line and column, applying nothing', async () => {
    const importsBefore = await count('stock_imports');
    for (const [text, line, column] of [
      ['part_number,kind,value,tolerance,quantity,location\nX\u00001,C,1p,B,5,main\n', 2, 2],
      ['part_number,kind,value,tolerance,quantity,location,no\u0000te\nX1,C,1p,B,5,main,a\n', 1, 54],
    ] as const) {
      // Columns count characters from 1: "X" then NUL is column 2; the header's NUL follows 53 characters.
      for (const dryRun of [false, true]) {
        const res = await uploadStock(t.app, stores.token, Buffer.from(text, 'utf8'), { dryRun });
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.error.code).toBe('not_utf8');
        expect(res.body.error.message).toContain(`NUL character (byte 0x00) on line ${line}, column ${column}`);
      }
    }
    expect(await count('parts')).toBe(0);
    expect(await count('stock_imports')).toBe(importsBefore);
  });

  it('answers 413 for a file over 20 MB and applies nothing', async () => {
    const row = 'C1,C,1p0,B,1,main,' + 'x'.repeat(90) + '\n';
    const big = Buffer.from(HEADER + ',description\n' + row.repeat(Math.ceil((20 * 1024 * 1024) / row.length) + 10));
    expect(big.length).toBeGreaterThan(20 * 1024 * 1024);
    const res = await uploadStock(t.app, stores.token, big);
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/larger than 20 MB/) });
    expect(await count('parts')).toBe(0);
    expect(await count('stock_imports')).toBe(0);
  });

  it('answers 413 for more than 200,000 rows and applies nothing', async () => {
    const rows: string[] = ['part_number,kind,value,tolerance,quantity'];
    for (let i = 0; i <= 200_000; i += 1) rows.push(`P${i},C,1p0,B,1`);
    const res = await uploadStock(t.app, stores.token, rows.join('\n'));
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/more than 200,000 rows/);
    expect(await count('parts')).toBe(0);
  });

  it('refuses an upload without a file, with a bad mode, or with the file in another field', async () => {
    const none = await request(t.app).post('/api/stock/imports').set('Authorization', `Bearer ${stores.token}`).field('mode', 'merge');
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/No file was uploaded/);
    const mode = await uploadStock(t.app, stores.token, BASE, { mode: 'overwrite' });
    expect(mode.status).toBe(400);
    expect(mode.body.error.details[0]).toMatchObject({ field: 'mode' });
    const field = await request(t.app).post('/api/stock/imports').set('Authorization', `Bearer ${stores.token}`).attach('csv', Buffer.from(BASE), 'a.csv');
    expect(field.status).toBe(400);
    expect(field.body.error.message).toMatch(/field "file"/);
  });
});

describe('two imports at once', () => {
  it('end in the stock of one order or the other, with a history that chains', async () => {
    await uploadStock(t.app, stores.token, BASE);
    const a = csvFile(HEADER, 'C1,C,1p0,B,11,main', 'C2,C,2p2,C,12,main', 'N1,C,10p,J,13,main');
    const b = csvFile(HEADER, 'C1,C,1p0,B,21,main', 'L1,L,12n,5%,22,main', 'N1,C,10p,J,23,main');
    const [ra, rb] = await Promise.all([
      uploadStock(t.app, stores.token, a, { mode: 'replace' }),
      uploadStock(t.app, admin.token, b, { mode: 'replace' }),
    ]);
    expect([ra.status, rb.status]).toEqual([200, 200]);
    // Exactly one import created N1; the other found it.
    expect([ra.body.created, rb.body.created].sort()).toEqual([0, 1]);
    const aThenB = { 'C1@main': 21, 'C2@main': 0, 'L1@main': 22, 'N1@main': 23, 'L9@lab': 8 };
    const bThenA = { 'C1@main': 11, 'C2@main': 12, 'L1@main': 0, 'N1@main': 13, 'L9@lab': 8 };
    const final = await quantities(t.sequelize);
    expect([aThenB, bThenA]).toContainEqual(final);
    const [firstId, secondId] = [ra.body.importId, rb.body.importId].sort((x, y) => x - y);
    const first = await request(t.app).get(`/api/stock/imports/${firstId}`).set('Authorization', `Bearer ${stores.token}`);
    const second = await request(t.app).get(`/api/stock/imports/${secondId}`).set('Authorization', `Bearer ${stores.token}`);
    const after = new Map(first.body.changes.map((c: { partNumber: string; quantityAfter: number }) => [c.partNumber, c.quantityAfter]));
    for (const change of second.body.changes as { partNumber: string; quantityBefore: number | null }[]) {
      if (after.has(change.partNumber)) expect(change.quantityBefore).toBe(after.get(change.partNumber));
    }
    expect(second.body.changes.find((c: { partNumber: string }) => c.partNumber === 'N1')).toMatchObject({ change: 'updated' });
  });
});

describe('roles', () => {
  it('lets stores and admin upload; designer and purchasing get 403; no token gets 401', async () => {
    expect((await uploadStock(t.app, stores.token, BASE, { dryRun: true })).status).toBe(200);
    expect((await uploadStock(t.app, admin.token, BASE, { dryRun: true })).status).toBe(200);
    for (const user of [designer, purchasing]) {
      const res = await uploadStock(t.app, user.token, BASE);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect((await request(t.app).post('/api/stock/imports').attach('file', Buffer.from(BASE), 'a.csv')).status).toBe(401);
    expect(await count('parts')).toBe(0);
  });

  it('lets every signed-in role read the history, and nobody without a token', async () => {
    for (const user of [stores, admin, designer, purchasing]) {
      expect((await request(t.app).get('/api/stock/imports').set('Authorization', `Bearer ${user.token}`)).status).toBe(200);
    }
    expect((await request(t.app).get('/api/stock/imports')).status).toBe(401);
    expect((await request(t.app).get('/api/stock/imports/999999').set('Authorization', `Bearer ${designer.token}`)).status).toBe(404);
    expect((await request(t.app).get('/api/stock/imports/abc').set('Authorization', `Bearer ${designer.token}`)).status).toBe(400);
  });
});
