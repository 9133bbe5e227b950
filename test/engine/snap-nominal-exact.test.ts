/**
 * The snapper's `nominal` search against an exhaustive search over every pair of options (rf-engine.md
 * "Snapping": the best fit must be the exact optimum over all candidate pairs; quality.md: "the
 * snapper's nominal best equals an exhaustive search on random small stock lists"). Random ports,
 * frequencies and stock lists, singles and combinations, every ideal network of each draw.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLNetworks } from '../../shared/engine/l-network.js';
import { buildKindCandidates } from '../../shared/snapping/kind-candidates.js';
import { searchNominal } from '../../shared/snapping/nominal-search.js';
import { searchExhaustive } from '../../shared/snapping/exhaustive-search.js';
import { snapProblemFor } from '../../shared/snapping/snap-problem.js';
import { compareFits, LOSS_KEY_DB } from '../../shared/snapping/fit-collector.js';
import { randomMatchArbitrary, stockFor } from './snap-stock-arbitrary.js';

describe('nominal search equals exhaustive search', () => {
  it('on random small stock lists, singles and combinations, every network and rank', () => {
    let compared = 0;
    let nonEmpty = 0;
    fc.assert(
      fc.property(randomMatchArbitrary(), (draw) => {
        const solution = solveLNetworks(draw.source, draw.load, draw.frequencyHz);
        const parts = stockFor(draw);
        const rules = { frequencyHz: draw.frequencyHz, usableSrfFraction: draw.usableSrfFraction, excludeAboveLimit: draw.excludeAboveLimit, buildQuantity: draw.buildQuantity };
        const candidates = { capacitor: buildKindCandidates(parts, 'capacitor', rules), inductor: buildKindCandidates(parts, 'inductor', rules) };
        for (const network of solution.networks) {
          const problem = snapProblemFor(network, draw.source, draw.load, candidates, draw.combinations);
          const fast = searchNominal(problem, draw.fits).fits;
          const slow = searchExhaustive(problem, draw.fits);
          compared++;
          if (slow.length > 0) nonEmpty++;
          expect(fast.length).toBe(slow.length);
          for (let i = 0; i < slow.length; i++) {
            // Same rank key: tier, loss on the 1e-9 dB grid, and every tie rule down to the part numbers.
            expect(compareFits(fast[i], slow[i])).toBe(0);
            expect(Math.abs(-10 * Math.log10(fast[i].tpg) + 10 * Math.log10(slow[i].tpg))).toBeLessThanOrEqual(LOSS_KEY_DB);
            expect(fast[i].shunt).toEqual(slow[i].shunt);
            expect(fast[i].series).toEqual(slow[i].series);
          }
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
    // The draws must exercise the search, not just empty stock.
    expect(nonEmpty).toBeGreaterThan(compared / 2);
  });
});
