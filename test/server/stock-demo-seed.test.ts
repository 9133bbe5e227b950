/**
 * The demo stock (seeds/demo-stock.csv) goes in through the importer cleanly and looks like real
 * 0402/0603 parts. Plausibility bounds are facts of the trade for chip parts: C0G capacitor SRF falls
 * as C grows; 0402 inductors from 1 nH to 120 nH resonate between about 1 GHz and 20 GHz.
 * The demo work (a saved match per radio link, two builds, one of them short) goes in through the
 * same services the API uses, once.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { seedDemoData } from '../../seeds/index.js';
import { DEMO_BUILDS, DEMO_MATCHES } from '../../seeds/demo-work.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
  await seedDemoData(t.sequelize);
});
afterAll(async () => {
  await t?.close();
});

interface Row {
  kind: string;
  package: string;
  value_si: number;
  srf_hz: number | null;
  quantity: number;
  location: string;
  part_number: string;
}

describe('demo stock', () => {
  it('is applied by the importer with no rejected rows and no warnings, as the demo stores account', async () => {
    const [entry] = await t.sequelize.query<{ status: string; rejected_count: number; warning_count: number; created_count: number; email: string }>(
      "SELECT i.status, i.rejected_count, i.warning_count, i.created_count, u.email FROM stock_imports i JOIN users u ON u.id = i.user_id WHERE i.file_name = 'demo-stock.csv'",
      { type: QueryTypes.SELECT },
    );
    expect(entry).toMatchObject({ status: 'applied', rejected_count: 0, warning_count: 0, email: 'stores@tarnwick.example' });
    expect(entry.created_count).toBeGreaterThanOrEqual(200);
  });

  it('has 0402 and 0603 capacitors and inductors in main and lab, some out of stock', async () => {
    const rows = await t.sequelize.query<Row>('SELECT kind, package, value_si, srf_hz, quantity, location, part_number FROM parts', { type: QueryTypes.SELECT });
    expect(new Set(rows.map((r) => `${r.kind} ${r.package}`))).toEqual(new Set(['capacitor 0402', 'capacitor 0603', 'inductor 0402', 'inductor 0603']));
    expect(new Set(rows.map((r) => r.location))).toEqual(new Set(['main', 'lab']));
    expect(rows.filter((r) => r.quantity === 0).length).toBeGreaterThan(5);

    const caps0402 = rows.filter((r) => r.kind === 'capacitor' && r.package === '0402' && r.location === 'main' && r.srf_hz !== null).sort((a, b) => a.value_si - b.value_si);
    for (let i = 1; i < caps0402.length; i += 1) expect(caps0402[i].srf_hz!).toBeLessThan(caps0402[i - 1].srf_hz!);
    const inductors0402 = rows.filter((r) => r.kind === 'inductor' && r.package === '0402' && r.srf_hz !== null);
    for (const r of inductors0402) {
      expect(r.value_si).toBeGreaterThanOrEqual(1e-9);
      expect(r.value_si).toBeLessThanOrEqual(120e-9);
      expect(r.srf_hz!).toBeGreaterThan(0.9e9);
      expect(r.srf_hz!).toBeLessThan(21e9);
    }
  });

  it('is what the stock browser lists', async () => {
    const designer = await t.addUser('designer');
    const res = await request(t.app).get('/api/parts?kind=inductor&search=12nH').set('Authorization', `Bearer ${designer.token}`);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    for (const item of res.body.items) expect(item.value).toBe(12e-9);
  });
});

describe('demo work (seeds/demo-work.ts)', () => {
  it('saves one match per radio link of the scenario, each with a stocked fit, by the demo designer', async () => {
    const rows = await t.sequelize.query<{ name: string; email: string; parts: number }>(
      "SELECT m.name, u.email, jsonb_array_length(m.fit->'elements') AS parts FROM matches m JOIN users u ON u.id = m.created_by ORDER BY m.id",
      { type: QueryTypes.SELECT },
    );
    expect(rows.map((r) => r.name)).toEqual(DEMO_MATCHES.map((m) => m.name));
    for (const row of rows) expect(row).toMatchObject({ email: 'designer@tarnwick.example', parts: 2 });
  });

  it('plans two reserved builds: the first covered by stock, the second with a shortfall list, nothing oversold', async () => {
    const builds = await t.sequelize.query<{ name: string; quantity: number; status: string; list: number | null; lines: number }>(
      `SELECT b.name, b.quantity, b.status, l.id AS list, (SELECT count(*)::int FROM shortfall_lines x WHERE x.list_id = l.id) AS lines
       FROM builds b LEFT JOIN shortfall_lists l ON l.build_id = b.id ORDER BY b.id`,
      { type: QueryTypes.SELECT },
    );
    expect(builds.map((b) => [b.name, b.quantity, b.status])).toEqual(DEMO_BUILDS.map((b) => [b.name, b.quantity, 'reserved']));
    expect(builds[0].list).toBeNull();
    expect(builds[1].list).not.toBeNull();
    expect(builds[1].lines).toBeGreaterThan(0);
    const [{ oversold }] = await t.sequelize.query<{ oversold: number }>('SELECT count(*)::int AS oversold FROM parts WHERE reserved > quantity', { type: QueryTypes.SELECT });
    expect(oversold).toBe(0);
  });

  it('runs once: seeding again adds nothing', async () => {
    expect(await seedDemoData(t.sequelize)).toEqual([]);
    const [{ matches }] = await t.sequelize.query<{ matches: number }>('SELECT count(*)::int AS matches FROM matches', { type: QueryTypes.SELECT });
    expect(matches).toBe(DEMO_MATCHES.length);
  });
});
