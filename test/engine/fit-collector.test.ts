/**
 * The fit record's contract (fit-collector.ts): the part key, the last tie rule, is built only when
 * read, so a copy must be made with `withLossKey`; a spread copy has no part key and must fail loudly
 * in a comparison, never rank as a tie. The ranking itself is checked against exhaustive search in
 * snap-nominal-exact.test.ts and snap-objective-window.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLNetworks } from '../../shared/engine/l-network.js';
import { buildKindCandidates } from '../../shared/snapping/kind-candidates.js';
import { searchExhaustive } from '../../shared/snapping/exhaustive-search.js';
import { snapProblemFor } from '../../shared/snapping/snap-problem.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';
import { compareFits, type FitCandidate, withLossKey } from '../../shared/snapping/fit-collector.js';
import { randomMatchArbitrary, stockFor } from './snap-stock-arbitrary.js';

/** Fits of the first drawn match that has at least two, with combinations allowed. */
function someFits(): FitCandidate[] {
  for (const draw of fc.sample(randomMatchArbitrary(6, 3), { numRuns: 200, seed: 77 })) {
    const index = buildStockIndex(stockFor(draw));
    const rules = { frequencyHz: draw.frequencyHz, usableSrfFraction: draw.usableSrfFraction, excludeAboveLimit: draw.excludeAboveLimit, buildQuantity: draw.buildQuantity };
    const candidates = { capacitor: buildKindCandidates(index, 'capacitor', rules), inductor: buildKindCandidates(index, 'inductor', rules) };
    for (const network of solveLNetworks(draw.source, draw.load, draw.frequencyHz).networks) {
      const fits = searchExhaustive(snapProblemFor(network, draw.source, draw.load, candidates, true), 50);
      if (fits.length >= 2) return fits;
    }
  }
  throw new Error('no draw gave two fits');
}

describe('fit records', () => {
  const fits = someFits();

  it('name their parts in the part key, element by element, with the arrangements last', () => {
    for (const fit of fits) {
      expect(typeof fit.partKey).toBe('string');
      // Key layout: elements joined by \u0003, then \u0004 and one arrangement code (or '-') per element.
      const [elements, arrangements] = fit.partKey.split('\u0004');
      expect(elements.split('\u0003').length).toBe((fit.shunt ? 1 : 0) + (fit.series ? 1 : 0));
      expect(arrangements).toBe(`${fit.shunt ? fit.shunt.arrangement : '-'}${fit.series ? fit.series.arrangement : '-'}`);
    }
    expect(new Set(fits.map((f) => f.partKey)).size).toBe(fits.length);
  });

  it('copied with withLossKey, keep every field but the loss key, part key included', () => {
    const [first] = fits;
    const copy = withLossKey(first, first.lossKey + 5);
    expect(copy.lossKey).toBe(first.lossKey + 5);
    expect(copy.partKey).toBe(first.partKey);
    expect(copy.shuntMembers).toEqual(first.shuntMembers);
    expect(copy.seriesMembers).toEqual(first.seriesMembers);
    expect([copy.tier, copy.tpg, copy.partCount, copy.cost, copy.stockCover]).toEqual([first.tier, first.tpg, first.partCount, first.cost, first.stockCover]);
    expect(compareFits(withLossKey(first, first.lossKey), first)).toBe(0);
  });

  it('copied with a spread, refuse to be compared on a tie instead of tying on a missing key', () => {
    const [first] = fits;
    const spread = { ...first } as FitCandidate;
    expect(() => compareFits(spread, first)).toThrow(/no part key/);
    // Before the last rule the copy still ranks: a worse loss key decides without the part key.
    expect(compareFits(first, { ...spread, lossKey: first.lossKey + 1 })).toBeLessThan(0);
  });
});
