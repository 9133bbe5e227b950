/**
 * Random matches and small random stock lists for the snapper's property tests: ports, frequency,
 * and parts whose values scatter around the ideal element values (so fits compete), with unknown,
 * near and far SRFs, ESR, Q or no loss, relative and absolute tolerances, scarce stock, unknown
 * costs, and copies of one electrical model under other part numbers (exact ties).
 */
import fc from 'fast-check';
import type { Complex } from '../../shared/engine/complex.js';
import { solveLNetworks } from '../../shared/engine/l-network.js';
import { mulberry32 } from '../../shared/engine/seeded-random.js';
import type { SnapPart } from '../../shared/snapping/snap-part.js';

/** One random match with its stock recipe. */
export interface RandomMatch {
  source: Complex;
  load: Complex;
  frequencyHz: number;
  buildQuantity: number;
  combinations: boolean;
  usableSrfFraction: number;
  excludeAboveLimit: boolean;
  fits: number;
  partsPerKind: number;
  stockSeed: number;
}

/** Random ports (R 1..500 ohm, X -300..300 ohm), f0 1 MHz..5 GHz, and stock options. */
export function randomMatchArbitrary(maxPartsPerKind = 6, minPartsPerKind = 0): fc.Arbitrary<RandomMatch> {
  return fc.record({
    source: fc.record({ re: fc.double({ min: 1, max: 500, noNaN: true }), im: fc.double({ min: -300, max: 300, noNaN: true }) }),
    load: fc.record({ re: fc.double({ min: 1, max: 500, noNaN: true }), im: fc.double({ min: -300, max: 300, noNaN: true }) }),
    frequencyHz: fc.double({ min: 6, max: 9.7, noNaN: true }).map((e) => 10 ** e),
    buildQuantity: fc.integer({ min: 1, max: 3 }),
    combinations: fc.boolean(),
    usableSrfFraction: fc.constantFrom(0.5, 0.7, 1),
    excludeAboveLimit: fc.boolean(),
    fits: fc.integer({ min: 1, max: 5 }),
    partsPerKind: fc.integer({ min: minPartsPerKind, max: maxPartsPerKind }),
    stockSeed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
  });
}

/** The stock list of a draw: values within a factor 3 of the ideal values of either kind (or random when none). */
export function stockFor(draw: RandomMatch): SnapPart[] {
  const random = mulberry32(draw.stockSeed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)];
  const omega = 2 * Math.PI * draw.frequencyHz;
  const ideal: Record<'capacitor' | 'inductor', number[]> = { capacitor: [], inductor: [] };
  for (const network of solveLNetworks(draw.source, draw.load, draw.frequencyHz).networks) {
    for (const e of network.elements) ideal[e.kind].push(e.value);
  }
  const parts: SnapPart[] = [];
  let id = 1;
  for (const kind of ['capacitor', 'inductor'] as const) {
    const centres = ideal[kind].length ? ideal[kind] : [kind === 'capacitor' ? 1 / (omega * 50) : 50 / omega];
    for (let k = 0; k < draw.partsPerKind; k++) {
      if (parts.length > 0 && random() < 0.15) {
        // The same electrical model under another part number, stock and cost: an exact tie.
        const twin = pick(parts.filter((p) => p.kind === kind).length ? parts.filter((p) => p.kind === kind) : parts);
        if (twin.kind === kind) {
          parts.push({ ...twin, id: id++, partNumber: `T${id}-${twin.partNumber}`, available: Math.floor(random() * 8), unitCost: random() < 0.3 ? null : (random() * 0.1).toFixed(4) });
          continue;
        }
      }
      // Values split by the factor a pair might need (halves, doubles) as well as near the ideal.
      const value = pick(centres) * Math.exp((random() * 2 - 1) * Math.log(3)) * (random() < 0.3 ? pick([0.5, 2]) : 1);
      const srfChoice = random();
      const srfHz = srfChoice < 0.2 ? null : draw.frequencyHz * (srfChoice < 0.35 ? 0.9 + random() * 0.5 : 1.2 + random() * 8);
      const lossChoice = random();
      const esrOhm = lossChoice < 0.3 ? 0.01 + random() * 2 : null;
      const q = lossChoice >= 0.3 && lossChoice < 0.75 ? 5 + random() * 200 : null;
      const qFrequencyHz = q === null ? null : draw.frequencyHz * (0.2 + random() * 2);
      const tolerance = random() < 0.3 && kind === 'capacitor'
        ? { mode: 'absolute' as const, deltaSi: pick([0.05, 0.1, 0.25]) * value }
        : { mode: 'relative' as const, fraction: pick([0.01, 0.02, 0.05, 0.1]) };
      parts.push({
        id: id++,
        partNumber: `${kind === 'capacitor' ? 'C' : 'L'}${Math.floor(random() * 1000)}-${id}`,
        kind,
        value,
        tolerance,
        srfHz,
        q,
        qFrequencyHz,
        esrOhm,
        available: Math.floor(random() * 8),
        voltageRating: kind === 'capacitor' ? pick([16, 50, null]) : null,
        currentRating: kind === 'inductor' ? pick([0.1, 0.5, null]) : null,
        location: pick(['A', 'B']),
        unitCost: random() < 0.2 ? null : (random() * 0.1).toFixed(4),
      });
    }
  }
  return parts;
}
