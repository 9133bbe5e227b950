/**
 * The snapper's `nominal` search against an exhaustive search over every pair of options (rf-engine.md
 * "Snapping": the best fit must be the exact optimum over all candidate pairs; quality.md: "the
 * snapper's nominal best equals an exhaustive search on random small stock lists"). Random ports,
 * frequencies and stock lists, singles and combinations, every ideal network of each draw. The fast
 * search merges parts of one electrical model (stock-index.ts); the reference does not, so the test
 * also checks that merging and splitting again by the tie rules is exact.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLNetworks } from '../../shared/engine/l-network.js';
import { buildKindCandidates } from '../../shared/snapping/kind-candidates.js';
import { searchNominal } from '../../shared/snapping/nominal-search.js';
import { searchExhaustive } from '../../shared/snapping/exhaustive-search.js';
import { snapProblemFor } from '../../shared/snapping/snap-problem.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';
import { compareFits, LOSS_KEY_DB } from '../../shared/snapping/fit-collector.js';
import { randomMatchArbitrary, stockFor } from './snap-stock-arbitrary.js';
import type { FitCandidate } from '../../shared/snapping/fit-collector.js';
import type { SnapProblem } from '../../shared/snapping/snap-problem.js';
import type { SnapOption } from '../../shared/snapping/snap-option.js';

/** What a fit is electrically: arrangement and part models per element (parts of one model are one choice). */
function choiceSignature(problem: SnapProblem, fit: FitCandidate): string {
  const model = (c: SnapProblem['shunt'], i: number) => {
    const p = c!.parts[i];
    return JSON.stringify([p.value, p.tolerance, p.srfHz, p.esrOhm, p.q, p.qFrequencyHz]);
  };
  const element = (c: SnapProblem['shunt'], o: SnapOption | null) =>
    o ? `${o.arrangement}:${[model(c, o.first), ...(o.second >= 0 ? [model(c, o.second)] : [])].sort().join('+')}` : '-';
  return `${element(problem.shunt, fit.shunt)}|${element(problem.series, fit.series)}`;
}

describe('nominal search equals exhaustive search', () => {
  it('on random small stock lists, singles and combinations, every network and rank', () => {
    let compared = 0;
    let nonEmpty = 0;
    fc.assert(
      fc.property(randomMatchArbitrary(), (draw) => {
        const solution = solveLNetworks(draw.source, draw.load, draw.frequencyHz);
        const parts = stockFor(draw);
        const rules = { frequencyHz: draw.frequencyHz, usableSrfFraction: draw.usableSrfFraction, excludeAboveLimit: draw.excludeAboveLimit, buildQuantity: draw.buildQuantity };
        // The fast search merges parts of one electrical model; the reference sees every part alone.
        const merged = buildStockIndex(parts);
        const separate = buildStockIndex(parts, { merge: false });
        const fastCandidates = { capacitor: buildKindCandidates(merged, 'capacitor', rules), inductor: buildKindCandidates(merged, 'inductor', rules) };
        const slowCandidates = { capacitor: buildKindCandidates(separate, 'capacitor', rules), inductor: buildKindCandidates(separate, 'inductor', rules) };
        for (const network of solution.networks) {
          const fastProblem = snapProblemFor(network, draw.source, draw.load, fastCandidates, draw.combinations);
          const slowProblem = snapProblemFor(network, draw.source, draw.load, slowCandidates, draw.combinations);
          const fast = searchNominal(fastProblem, draw.fits).fits;
          const slowMerged = searchExhaustive(fastProblem, draw.fits);
          const slowSeparate = searchExhaustive(slowProblem, 100_000);
          compared++;
          if (slowMerged.length > 0) nonEmpty++;
          // (a) Every rank equals exhaustive search over the same (merged) candidates.
          expect(fast.length).toBe(slowMerged.length);
          for (let i = 0; i < fast.length; i++) {
            // Same rank key: tier, loss on the 1e-9 dB grid, and every tie rule down to the part numbers.
            expect(compareFits(fast[i], slowMerged[i])).toBe(0);
            expect(Math.abs(-10 * Math.log10(fast[i].tpg) + 10 * Math.log10(slowMerged[i].tpg))).toBeLessThanOrEqual(LOSS_KEY_DB);
            expect(fast[i].shunt).toEqual(slowMerged[i].shunt);
            expect(fast[i].series).toEqual(slowMerged[i].series);
          }
          // (b) The best fit equals exhaustive search over every part on its own, parts included.
          if (slowSeparate.length > 0) {
            expect(compareFits(fast[0], slowSeparate[0])).toBe(0);
            expect(fast[0].partKey).toBe(slowSeparate[0].partKey);
          }
          // (c) The other ranks are the per-part ranking with repeats of one electrical choice dropped.
          const seen = new Set<string>();
          const distinct = slowSeparate.filter((f) => {
            const signature = choiceSignature(slowProblem, f);
            if (seen.has(signature)) return false;
            seen.add(signature);
            return true;
          });
          expect(fast.map((f) => [f.tier, f.lossKey])).toEqual(distinct.slice(0, draw.fits).map((f) => [f.tier, f.lossKey]));
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
    // The draws must exercise the search, not just empty stock.
    expect(nonEmpty).toBeGreaterThan(compared / 2);
  });
});
