/**
 * The solve route keeps the stock index while the stock is unchanged (server/services/matches/
 * load-stock-index.ts) and must never answer from a stale one: every change to a part a solve reads
 * (an import, a reservation, a direct SQL update, a new part, another location's part left alone,
 * a part moved between locations, a truncate) is seen by the next solve, in the real database; and
 * the stock version it is kept under follows commit order when two transactions write at once.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { loadDemoStock } from '../../seeds/load-demo-stock.js';
import { loadSolveStock, stockIndexCacheStats } from '../../server/services/matches/load-stock-index.js';
import { setTimeout as sleep } from 'node:timers/promises';

let t: TestApp;
let token = '';
const BODY = { source: 50, load: '12-j35', frequencyHz: '868MHz', objective: 'nominal', fitsPerNetwork: 5 };

beforeAll(async () => {
  t = await startTestApp();
  token = (await t.addUser('designer')).token;
  await loadDemoStock(t.sequelize);
});
afterAll(async () => {
  await t?.close();
});

async function solve(body: object = BODY) {
  const res = await request(t.app).post('/api/matches/solve').set('Authorization', `Bearer ${token}`).send(body);
  expect(res.status).toBe(200);
  return res.body as { networks: { fits: { elements: { parts: { partNumber: string }[] }[] }[] }[]; snapping: { stockParts: number; candidates: { capacitor: number; inductor: number } } };
}
const firstPart = (answer: Awaited<ReturnType<typeof solve>>) => answer.networks.find((n) => n.fits.length > 0)!.fits[0].elements[0].parts[0].partNumber;
const stats = () => ({ ...stockIndexCacheStats });

describe('the stock index kept between solves', () => {
  it('answers a repeated solve from the kept index, with the same answer', async () => {
    const a = await solve();
    const before = stats();
    const b = await solve();
    expect(stockIndexCacheStats.hits).toBe(before.hits + 1);
    expect(b).toEqual(a);
  });

  it('sees a direct SQL change to the part a fit uses (its stock drops to nothing)', async () => {
    const used = firstPart(await solve());
    await t.sequelize.query('UPDATE parts SET quantity = 0 WHERE part_number = :pn', { replacements: { pn: used } });
    const before = stats();
    const after = await solve();
    expect(stockIndexCacheStats.misses).toBe(before.misses + 1);
    expect(firstPart(after)).not.toBe(used);
  });

  it('sees a reservation (reserved rises, quantity unchanged)', async () => {
    const used = firstPart(await solve());
    await t.sequelize.query('UPDATE parts SET reserved = quantity WHERE part_number = :pn', { replacements: { pn: used } });
    expect(firstPart(await solve())).not.toBe(used);
  });

  it('sees a new part from a stock import, and keeps one index per location', async () => {
    const all = await solve();
    const main = await solve({ ...BODY, location: 'main' });
    const csv = [
      'part_number,kind,value,tolerance,srf,q,q_freq,esr,quantity,package,voltage_rating,current_rating,location,series,unit_cost,manufacturer_part,description',
      'CACHE-C-1P,C,1pF,±0.1pF,20GHz,,,0.2,100,0402,50V,,cache-test,,0.0100,,',
    ].join('\n');
    const stores = (await t.addUser('stores')).token;
    const imported = await request(t.app).post('/api/stock/imports').set('Authorization', `Bearer ${stores}`).attach('file', Buffer.from(csv), 'extra.csv').field('mode', 'merge');
    expect(imported.status).toBe(200);
    const allAfter = await solve();
    expect(allAfter.snapping.stockParts).toBe(all.snapping.stockParts + 1);
    // The import touched no part at "main": its index is still good and is used again.
    const before = stats();
    const mainAfter = await solve({ ...BODY, location: 'main' });
    expect(stockIndexCacheStats.hits).toBe(before.hits + 1);
    expect(mainAfter).toEqual(main);
  });

  it('sees a part moved to another location, at both locations', async () => {
    const main = await solve({ ...BODY, location: 'main' });
    const lab = await solve({ ...BODY, location: 'lab' });
    const [[moved]] = (await t.sequelize.query("SELECT part_number FROM parts WHERE location = 'main' AND part_number NOT IN (SELECT part_number FROM parts WHERE location = 'lab') ORDER BY id LIMIT 1")) as [{ part_number: string }[], unknown];
    await t.sequelize.query("UPDATE parts SET location = 'lab' WHERE location = 'main' AND part_number = :pn", { replacements: { pn: moved.part_number } });
    expect((await solve({ ...BODY, location: 'main' })).snapping.stockParts).toBe(main.snapping.stockParts - 1);
    expect((await solve({ ...BODY, location: 'lab' })).snapping.stockParts).toBe(lab.snapping.stockParts + 1);
  });

  it('keeps versions in commit order when two transactions change parts at once', async () => {
    const [[a], [b]] = [
      (await t.sequelize.query("SELECT id FROM parts WHERE location = 'main' ORDER BY id LIMIT 1"))[0] as { id: number }[],
      (await t.sequelize.query("SELECT id FROM parts WHERE location = 'main' ORDER BY id DESC LIMIT 1"))[0] as { id: number }[],
    ];
    const quantities = async () => {
      const { parts, fingerprint } = await loadSolveStock(t.sequelize, { location: null });
      return { fingerprint, a: parts.find((p) => p.id === a.id)!.quantity ?? -1, b: parts.find((p) => p.id === b.id)!.quantity ?? -1 };
    };
    const start = await quantities();
    const first = await t.sequelize.transaction();
    const second = await t.sequelize.transaction();
    try {
      await t.sequelize.query('UPDATE parts SET quantity = quantity + 1 WHERE id = :id', { replacements: { id: a.id }, transaction: first });
      const secondWrite = t.sequelize.query('UPDATE parts SET quantity = quantity + 1 WHERE id = :id', { replacements: { id: b.id }, transaction: second });
      // The second writer waits (at the version row the first holds) until the first commits.
      for (let waited = 0; ; waited += 10) {
        const [[{ waiting }]] = (await t.sequelize.query('SELECT count(*)::int AS waiting FROM pg_locks WHERE NOT granted')) as [{ waiting: number }[], unknown];
        if (waiting > 0) break;
        if (waited > 10_000) throw new Error('the second writer never waited');
        await sleep(10);
      }
      // Neither is committed: the stock as it was, under the same version.
      expect(await quantities()).toEqual(start);
      await first.commit();
      await secondWrite;
      const afterFirst = await quantities();
      expect(afterFirst).toMatchObject({ a: start.a + 1, b: start.b });
      expect(afterFirst.fingerprint).not.toBe(start.fingerprint);
      await second.commit();
      const afterBoth = await quantities();
      expect(afterBoth).toMatchObject({ a: start.a + 1, b: start.b + 1 });
      expect(new Set([start.fingerprint, afterFirst.fingerprint, afterBoth.fingerprint]).size).toBe(3);
    } finally {
      await first.rollback().catch(() => undefined);
      await second.rollback().catch(() => undefined);
    }
  });

  it('sees the whole stock emptied by a truncate', async () => {
    expect((await solve()).snapping.stockParts).toBeGreaterThan(0);
    await t.sequelize.query('TRUNCATE parts CASCADE');
    expect((await solve()).snapping.stockParts).toBe(0);
    expect((await solve({ ...BODY, location: 'main' })).snapping.stockParts).toBe(0);
  });
});
