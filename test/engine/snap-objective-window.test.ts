/**
 * The worst-case and band rankings (objective-window.ts) against exhaustive search by the same
 * objective on random small stock lists: every fit scored, ranked by tier, objective loss and the
 * tie rules, and compared rank by rank. Small `fitsPerNetwork` and lists of up to 7 parts per kind
 * make the window's limit step run (more fits than the first nominal batch of max(4k, 12)).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLNetworks } from '../../shared/engine/l-network.js';
import { bandAround } from '../../shared/engine/losses.js';
import { seriesEquivalentPort } from '../../shared/engine/port-model.js';
import { buildKindCandidates } from '../../shared/snapping/kind-candidates.js';
import { searchExhaustive } from '../../shared/snapping/exhaustive-search.js';
import { compareFits, lossKeyOfDb, withLossKey } from '../../shared/snapping/fit-collector.js';
import { objectiveLossDb, rankByObjective } from '../../shared/snapping/objective-window.js';
import { snapProblemFor } from '../../shared/snapping/snap-problem.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';
import { randomMatchArbitrary, stockFor } from './snap-stock-arbitrary.js';

describe('objective windows equal exhaustive ranking by the objective', () => {
  for (const objective of ['worst-case', 'band'] as const) {
    it(`${objective}: every rank, on random small stock lists`, () => {
      let windowed = 0;
      fc.assert(
        fc.property(randomMatchArbitrary(8, 4), fc.double({ min: 0.005, max: 0.3, noNaN: true }), (draw, relativeBand) => {
          const k = Math.min(draw.fits, 2);
          const parts = stockFor(draw);
          const index = buildStockIndex(parts);
          const rules = { frequencyHz: draw.frequencyHz, usableSrfFraction: draw.usableSrfFraction, excludeAboveLimit: draw.excludeAboveLimit, buildQuantity: draw.buildQuantity };
          const candidates = { capacitor: buildKindCandidates(index, 'capacitor', rules), inductor: buildKindCandidates(index, 'inductor', rules) };
          const context = {
            objective,
            source: seriesEquivalentPort(draw.source, draw.frequencyHz),
            load: seriesEquivalentPort(draw.load, draw.frequencyHz),
            frequencyHz: draw.frequencyHz,
            band: objective === 'band' ? bandAround(draw.frequencyHz, relativeBand * draw.frequencyHz) : null,
          };
          for (const network of solveLNetworks(draw.source, draw.load, draw.frequencyHz).networks) {
            const problem = snapProblemFor(network, draw.source, draw.load, candidates, draw.combinations);
            const ranked = rankByObjective(problem, k, context);
            if (ranked.windowSize >= Math.max(4 * k, 12)) windowed++;
            const every = searchExhaustive(problem, 1_000_000)
              .map((fit) => withLossKey(fit, lossKeyOfDb(objectiveLossDb(problem, fit, context))))
              .sort(compareFits)
              .slice(0, k);
            expect(ranked.windowTruncated).toBe(false);
            expect(ranked.fits.length).toBe(every.length);
            ranked.fits.forEach((scored, i) => {
              expect(compareFits(scored.fit, every[i])).toBe(0);
              expect(scored.fit.partKey).toBe(every[i].partKey);
            });
          }
        }),
        { numRuns: 400, seed: 4242 },
      );
      // The limit step (not only the "fewer fits than the first batch" path) must have been tested.
      expect(windowed).toBeGreaterThan(50);
    });
  }
});
