/**
 * How a build shares scarce stock (issue 6): matches of one build that compete for a part, or a new
 * build against what earlier builds hold, move the element that loses least to its next-best
 * stocked part and say so; a chosen fit over the loss budget has the element to blame snapped
 * again or bought; with no other part within budget, the matches listed first keep the part.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { uploadStock } from '../fixtures/stock/stock-upload.js';
import { createBuild } from '../../server/services/builds/create-build.js';
import { readBuild } from '../../server/services/builds/read-builds.js';
import type { PlannedMatchDesign } from '../../server/models/build-match.js';
import { stockFile, stockRow, subGhzDesign } from './builds-scenario.js';

let t: TestApp;
let designer: { id: number };

/**
 * A second sub-GHz match: the same antenna (12 - j35 ohm) at 885 MHz. By the hand working in
 * builds-scenario.ts B = 0.035590 S and X = 56.354 ohm do not depend on f, so
 * C = 0.035590 / (2 pi 885 MHz) = 6.4004 pF and L = 56.354 / (2 pi 885 MHz) = 10.134 nH.
 * Its ideal 6.40 pF is nearer 6.2 pF (ln(6.40/6.2) = 0.032) than the 868 MHz match's 6.53 pF is
 * (ln(6.53/6.2) = 0.051), so moving it to 6.2 pF costs it less.
 */
function design885(): PlannedMatchDesign {
  const base = subGhzDesign();
  return {
    ...base,
    frequencyHz: 885e6,
    elements: [
      { ...base.elements[0], idealValue: 6.4004e-12 },
      { ...base.elements[1], idealValue: 10.134e-9 },
    ],
  };
}

beforeAll(async () => {
  t = await startTestApp();
  const stores = await t.addUser('stores');
  designer = await t.addUser('designer');
  const upload = await uploadStock(
    t.app,
    stores.token,
    stockFile(
      stockRow('TW-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 3),
      stockRow('TW-C0402-6P2', 'C', '6.2pF', 'C', '10GHz', '0.2', 50),
      stockRow('TW-L0402-10N', 'L', '10nH', 'J', '6GHz', '0.5', 200),
      // The lab holds its own 6.8 pF and a lossy 10 nH (ESR 3 ohm), and nothing else.
      stockRow('LB-C0402-6P8', 'C', '6.8pF', 'C', '10GHz', '0.2', 100).replace(',main,', ',lab,'),
      stockRow('LB-L0402-10N-LOSSY', 'L', '10nH', 'J', '6GHz', '3', 100).replace(',main,', ',lab,'),
    ),
  );
  expect(upload.status, JSON.stringify(upload.body)).toBe(200);
});
afterAll(async () => {
  await t?.close();
});

const build = async (name: string, quantity: number, plans: { matchId: number; matchName: string; design: PlannedMatchDesign }[]) =>
  readBuild(await createBuild(t.sequelize, { name, quantity, reserve: true, plans }, designer.id));

describe('competing matches of one build', () => {
  it('moves the match that loses least to its next-best part, and says so', async () => {
    // Both matches want 3 x 6.8 pF; 3 are on hand.
    const b = await build('two radios', 3, [
      { matchId: 1, matchName: '868 MHz antenna', design: subGhzDesign() },
      { matchId: 2, matchName: '885 MHz antenna', design: design885() },
    ]);
    const shunt = (matchId: number) => b.lines.find((l) => l.matchId === matchId && l.position === 'shunt');
    expect(shunt(1)).toMatchObject({ partNumber: 'TW-C0402-6P8', needed: 3, reserved: 3, movedFrom: null });
    expect(shunt(2)).toMatchObject({ partNumber: 'TW-C0402-6P2', needed: 3, reserved: 3, movedFrom: ['TW-C0402-6P8'] });
    expect(b.moves).toHaveLength(1);
    expect(b.moves[0]).toMatchObject({ matchId: 2, position: 'shunt', from: ['TW-C0402-6P8'], to: 'TW-C0402-6P2' });
    expect(b.moves[0].message).toMatch(/TW-C0402-6P8 has 3 available for 6 wanted; moved 885 MHz antenna shunt TW-C0402-6P8 to TW-C0402-6P2/);
    expect(b.moves[0].toWorstCaseDb).toBeLessThanOrEqual(0.5);
    expect(b.shortfall.lines).toEqual([]);
  });

  it('moves a new build off what earlier builds hold', async () => {
    // The first build holds every 6.8 pF; this one takes the 6.2 pF (within the 0.5 dB budget) instead.
    const b = await build('later radio', 2, [{ matchId: 1, matchName: '868 MHz antenna', design: subGhzDesign() }]);
    expect(b.lines.find((l) => l.position === 'shunt')).toMatchObject({ partNumber: 'TW-C0402-6P2', reserved: 2, movedFrom: ['TW-C0402-6P8'] });
    expect(b.moves.map((m) => [m.matchId, m.from, m.to])).toEqual([[1, ['TW-C0402-6P8'], 'TW-C0402-6P2']]);
    expect(b.moves[0].message).toMatch(/TW-C0402-6P8 has 0 available for 2 wanted/);
  });
});

describe('a chosen fit over the loss budget', () => {
  it('puts the element to blame on the shortfall list when no stocked part brings the match back', async () => {
    // In the lab, with the lossy inductor, the 868 MHz match's worst case is well over 0.5 dB;
    // an ideal 10 nH in its place would cure it, an ideal 6.8 pF in the capacitor's place would not.
    const lab = { ...subGhzDesign('LB-C0402-6P8', 'LB-L0402-10N-LOSSY'), location: 'lab' };
    const b = await build('lab radio', 4, [{ matchId: 5, matchName: 'lab antenna', design: lab }]);
    expect(b.lines.map((l) => [l.position, l.partNumber, l.needed, l.reserved])).toEqual([
      ['shunt', 'LB-C0402-6P8', 4, 4],
      ['series', 'LB-L0402-10N-LOSSY', 4, 0],
    ]);
    expect(b.shortfall.lines).toHaveLength(1);
    const [line] = b.shortfall.lines;
    // Buy-to: 10.333 nH in E12 (10, 12): ln(10.333/10) = 0.033 < ln(12/10.333) = 0.150 -> 10 nH.
    // Quantity: 4 boards x 1.05 = 4.2 -> 5. Minimum SRF: 868 MHz / 0.5 = 1.736 GHz.
    expect(line).toMatchObject({ kind: 'inductor', buyValue: 10e-9, series: 'E12', quantity: 5, shortQuantity: 4, reason: 'over-budget', package: '0402' });
    expect(line.minSrfHz).toBeCloseTo(1.736e9, 0);
    expect(line.reasonText).toMatch(/over the 0.50 dB budget/);
    expect(line.toleranceWithinBudget).toBe(true);
  });
});

describe('a scarce part with nothing else within budget', () => {
  it('goes to the matches in the order the build lists them; the rest is short', async () => {
    const lab = (matchId: number) => ({ matchId, matchName: `lab ${matchId}`, design: { ...subGhzDesign('LB-C0402-6P8', 'TW-L0402-10N'), location: null } });
    // Of the lab's 100 x 6.8 pF the lab radio holds 4, so 96 are available; the 6.2 pF that stood in
    // above has 50 - 3 - 2 = 45 left, too few for 60 boards. Both matches need 60.
    const b = await build('big lab run', 60, [lab(7), lab(8)]);
    const shunt = (matchId: number) => b.lines.find((l) => l.matchId === matchId && l.position === 'shunt')!;
    expect([shunt(7).reserved, shunt(8).reserved]).toEqual([60, 36]);
    expect(b.moves).toEqual([]);
    expect(b.shortfall.lines).toHaveLength(1);
    // 60 - 36 = 24 boards short of the capacitor: 24 x 1.05 = 25.2 -> 26.
    expect(b.shortfall.lines[0]).toMatchObject({ kind: 'capacitor', buyValue: 6.8e-12, shortQuantity: 24, quantity: 26, reason: 'short-stock' });
    expect(b.shortfall.lines[0].sources.map((s) => s.matchId)).toEqual([8]);
  });
});
