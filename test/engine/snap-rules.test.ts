/**
 * The snapping rules of rf-engine.md "Snapping ideal networks to stock", one by one, on crafted stock
 * lists: frequency limits, each flag, the tie rules in their order, stock for every use, an empty
 * stock, an infeasible placement and a one-element network.
 *
 * The reference network (fact of the trade, C. Bowick, RF Circuit Design, 2nd ed., ch. 4, from
 * memory): 50 ohm to 12.5 ohm at 100 MHz, Q = sqrt(3), shunt C = Q/(w 50) = 55.13 pF across the
 * source, series L = 12.5 Q / w = 34.46 nH toward the load; the other solution is a shunt L and a
 * series C; shunt-at-load cannot match (Rs GL = 4 > 1).
 */
import { describe, expect, it } from 'vitest';
import { parseSolveRequest } from '../../shared/engine/solve-request.js';
import type { Tolerance } from '../../shared/engine/tolerance-codes.js';
import { DEFAULT_SNAP_SETTINGS, snapMatch } from '../../shared/snapping/snap-match.js';
import type { SnapPart } from '../../shared/snapping/snap-part.js';
import { buildStockIndex } from '../../shared/snapping/stock-index.js';

let nextId = 1;
function part(partNumber: string, kind: 'capacitor' | 'inductor', value: number, more: Partial<SnapPart> = {}): SnapPart {
  return {
    id: nextId++,
    partNumber,
    kind,
    value,
    tolerance: { mode: 'relative', fraction: 0.01 } as Tolerance,
    srfHz: null,
    q: null,
    qFrequencyHz: null,
    esrOhm: null,
    available: 100,
    voltageRating: null,
    currentRating: null,
    location: 'main',
    unitCost: '0.0100',
    ...more,
  };
}

const C_IDEAL = 55.1328895e-12;
const L_IDEAL = 34.4580559e-9;
const BASE = { source: 50, load: 12.5, frequencyHz: 100e6, objective: 'nominal', fitsPerNetwork: 10 };

function solve(parts: SnapPart[], request: object = {}, settings = DEFAULT_SNAP_SETTINGS) {
  const input = parseSolveRequest({ ...BASE, ...request });
  return snapMatch(input, buildStockIndex(parts), settings, { yieldSamples: 200 });
}
const lowPass = (r: ReturnType<typeof solve>) => r.networks.find((n) => n.response === 'low-pass')!;
const partsOf = (fit: ReturnType<typeof lowPass>['fits'][number]) => fit.elements.map((e) => e.parts.map((p) => `${p.partNumber}x${p.quantity}`).join('+'));

describe('frequency limits', () => {
  it('never uses a part at or above its SRF, flags and ranks last those above the usable fraction', () => {
    const r = solve([
      part('AT-SRF', 'capacitor', C_IDEAL, { srfHz: 100e6 }),
      // Below SRF a capacitor with ESL looks like C / (1 - (f/SRF)^2): this one looks exactly ideal.
      part('ABOVE', 'capacitor', C_IDEAL * (1 - (100 / 150) ** 2), { srfHz: 150e6 }),
      part('WITHIN', 'capacitor', 47e-12, { srfHz: 2e9 }),
      part('L', 'inductor', L_IDEAL, { srfHz: 3e9 }),
    ]);
    const fits = lowPass(r).fits;
    expect(fits.map(partsOf)).toEqual([
      ['WITHINx1', 'Lx1'],
      ['ABOVEx1', 'Lx1'],
    ]);
    // ABOVE is the better value (exact), yet ranks after the within-limit fit.
    expect(fits[1].loss.totalDb).toBeLessThan(fits[0].loss.totalDb);
    expect(fits[1].flags).toEqual(['above-limit', 'loss-unknown']);
    expect(fits[1].elements[0].flags).toEqual(['above-limit', 'loss-unknown']);
    expect(fits[1].elements[0].frequencyRatio).toBeCloseTo(100 / 150, 12);
    expect(r.snapping.excluded.capacitor.atOrAboveSrf).toBe(1);
  });

  it('leaves above-limit parts out when asked, and moves the limit with usableSrfFraction', () => {
    const stock = [part('ABOVE', 'capacitor', C_IDEAL, { srfHz: 150e6 }), part('L', 'inductor', L_IDEAL, { srfHz: 3e9 })];
    expect(lowPass(solve(stock, { excludeAboveLimit: true })).fits).toEqual([]);
    expect(lowPass(solve(stock, {}, { ...DEFAULT_SNAP_SETTINGS, excludeAboveLimit: true })).fits).toEqual([]);
    const widened = lowPass(solve(stock, { usableSrfFraction: 0.7, excludeAboveLimit: true })).fits;
    expect(widened.length).toBe(1);
    expect(widened[0].flags).toEqual(['loss-unknown']);
  });

  it('flags an unknown SRF as "limit unknown" with no ratio, and ranks it with the parts within limits', () => {
    const fits = lowPass(solve([part('NOSRF', 'capacitor', C_IDEAL), part('L', 'inductor', L_IDEAL, { srfHz: 3e9, esrOhm: 0.2 })])).fits;
    expect(fits[0].elements[0].flags).toEqual(['limit-unknown', 'loss-unknown']);
    expect(fits[0].elements[0].frequencyRatio).toBeNull();
    expect(fits[0].elements[1].flags).toEqual([]);
    expect(fits[0].flags).toEqual(['limit-unknown', 'loss-unknown']);
  });
});

describe('flags', () => {
  it('"over rating" when a power is given and a part is over its rating', () => {
    const stock = [part('C1V', 'capacitor', C_IDEAL, { voltageRating: 1, esrOhm: 0.1 }), part('L', 'inductor', L_IDEAL, { currentRating: 10, esrOhm: 0.1 })];
    const fit = lowPass(solve(stock, { powerW: 1 })).fits[0];
    expect(fit.elements[0].flags).toContain('over-rating');
    expect(fit.elements[1].flags).not.toContain('over-rating');
    expect(lowPass(solve(stock)).fits[0].flags).not.toContain('over-rating');
  });

  it('"short stock" when one part serves both elements and the stock does not cover both uses', () => {
    // 50 ohm to 10 + j100 ohm: shunt-at-source solution 1 is a shunt C and a series C (both capacitors).
    const request = { load: { re: 10, im: 100 }, fitsPerNetwork: 1 };
    const only = (available: number) => [part('ONLY', 'capacitor', 30e-12, { available, esrOhm: 0.1, srfHz: 5e9 }), part('L', 'inductor', 100e-9, { esrOhm: 0.1, srfHz: 5e9 })];
    const mixed = (r: ReturnType<typeof solve>) => r.networks.find((n) => n.response === 'mixed' && n.elements.every((e) => e.kind === 'capacitor'))!;
    const short = mixed(solve(only(1), request)).fits[0];
    expect(partsOf(short)).toEqual(['ONLYx1', 'ONLYx1']);
    expect(short.flags).toEqual(['short-stock']);
    expect(short.elements.map((e) => e.flags)).toEqual([['short-stock'], ['short-stock']]);
    expect(mixed(solve(only(2), request)).fits[0].flags).toEqual([]);
  });

  it('"loss unknown" without ESR or Q', () => {
    const fit = lowPass(solve([part('C', 'capacitor', C_IDEAL, { q: 500, qFrequencyHz: 100e6 }), part('L', 'inductor', L_IDEAL)])).fits[0];
    expect(fit.elements[0].flags).toEqual(['limit-unknown']);
    expect(fit.elements[1].flags).toEqual(['limit-unknown', 'loss-unknown']);
  });
});

describe('stock', () => {
  it('needs the build quantity for every use, in one element or both', () => {
    const stock = [part('C', 'capacitor', C_IDEAL, { available: 3 }), part('L', 'inductor', L_IDEAL, { available: 10 })];
    expect(lowPass(solve(stock, { buildQuantity: 3 })).fits.length).toBe(1);
    expect(lowPass(solve(stock, { buildQuantity: 4 })).fits).toEqual([]);
    // A pair of one part in one element needs two uses: 27.5 pF twice in parallel.
    const pair = (available: number) => [part('C27', 'capacitor', C_IDEAL / 2, { available }), part('L', 'inductor', L_IDEAL)];
    const used = (available: number) => lowPass(solve(pair(available), { combinations: true, buildQuantity: 2 })).fits.map(partsOf);
    expect(used(4)).toContainEqual(['C27x2', 'Lx1']);
    expect(used(3)).not.toContainEqual(['C27x2', 'Lx1']);
  });

  it('answers an empty stock with networks without fits and a note', () => {
    const r = solve([]);
    expect(r.networks.length).toBe(2);
    expect(r.networks.every((n) => n.fits.length === 0)).toBe(true);
    expect(r.notes!.join(' ')).toMatch(/holds no parts/);
  });

  it('reports an infeasible placement with its reason and no network', () => {
    const r = solve([part('C', 'capacitor', C_IDEAL), part('L', 'inductor', L_IDEAL)]);
    expect(r.infeasible.map((i) => i.placement)).toEqual(['shunt-at-load']);
    expect(r.networks.some((n) => n.placement === 'shunt-at-load')).toBe(false);
  });

  it('fits a one-element network with one element', () => {
    // 50 ohm to 50 + j30 ohm: a series capacitor of reactance -30 ohm alone matches.
    const c = 1 / (2 * Math.PI * 100e6 * 30);
    const r = solve([part('C', 'capacitor', c), part('L', 'inductor', L_IDEAL)], { load: { re: 50, im: 30 } });
    const single = r.networks.find((n) => n.elements.length === 1)!;
    expect(single.elements[0]).toMatchObject({ position: 'series', kind: 'capacitor' });
    expect(single.fits[0].elements.length).toBe(1);
    expect(single.fits[0].loss.totalDb).toBeLessThan(1e-9);
  });
});

describe('tie rules, in their order', () => {
  // In each case the part that should win has the later part number, so the last rule cannot be what picks it.
  const L = () => part('L', 'inductor', L_IDEAL, { srfHz: 1e16 });
  const best = (stock: SnapPart[], request: object = {}) => partsOf(lowPass(solve([...stock, L()], request)).fits[0])[0];

  it('fewer parts: one part before two of equal loss', () => {
    // Lossless, no parasitics: 2 x 27.57 pF in parallel is the same admittance as one 55.13 pF.
    expect(best([part('PAIR', 'capacitor', C_IDEAL / 2), part('Z-ONE', 'capacitor', C_IDEAL)], { combinations: true })).toBe('Z-ONEx1');
  });

  it('larger SRF margin next', () => {
    // SRFs far above f0 change the loss by far less than the 1e-9 dB grid, so only the margin differs.
    expect(best([part('NEAR', 'capacitor', C_IDEAL, { srfHz: 1e14 }), part('Z-FAR', 'capacitor', C_IDEAL, { srfHz: 1e15 })])).toBe('Z-FARx1');
  });

  // Parts of one electrical model are merged and split again by the rules (stock-index.ts); parts
  // that differ only in tolerance are separate candidates with equal nominal loss. Both ways are checked.
  const J = { tolerance: { mode: 'relative', fraction: 0.05 } as Tolerance };

  it('more stock next', () => {
    expect(best([part('FEW', 'capacitor', C_IDEAL, { available: 5, unitCost: '0.0001' }), part('Z-MANY', 'capacitor', C_IDEAL, { available: 50 })])).toBe('Z-MANYx1');
    expect(best([part('FEW', 'capacitor', C_IDEAL, { available: 5, unitCost: '0.0001' }), part('Z-MANY', 'capacitor', C_IDEAL, { available: 50, ...J })])).toBe('Z-MANYx1');
  });

  it('lower cost next, unknown cost last', () => {
    expect(best([part('DEAR', 'capacitor', C_IDEAL, { unitCost: '0.0200' }), part('Z-CHEAP', 'capacitor', C_IDEAL, { unitCost: '0.0150' })])).toBe('Z-CHEAPx1');
    expect(best([part('UNKNOWN', 'capacitor', C_IDEAL, { unitCost: null }), part('Z-PRICED', 'capacitor', C_IDEAL, { unitCost: '9.0000' })])).toBe('Z-PRICEDx1');
    expect(best([part('DEAR', 'capacitor', C_IDEAL, { unitCost: '0.0200' }), part('Z-CHEAP', 'capacitor', C_IDEAL, { unitCost: '0.0150', ...J })])).toBe('Z-CHEAPx1');
    expect(best([part('UNKNOWN', 'capacitor', C_IDEAL, { unitCost: null }), part('Z-PRICED', 'capacitor', C_IDEAL, { unitCost: '9.0000', ...J })])).toBe('Z-PRICEDx1');
  });

  it('part number last', () => {
    expect(best([part('ZETA', 'capacitor', C_IDEAL), part('ALPHA', 'capacitor', C_IDEAL)])).toBe('ALPHAx1');
    expect(best([part('ZETA', 'capacitor', C_IDEAL), part('ALPHA', 'capacitor', C_IDEAL, J)])).toBe('ALPHAx1');
  });

  it('loss before all of them', () => {
    expect(best([part('OFF', 'capacitor', 47e-12, { available: 1000, unitCost: '0.0001' }), part('Z-EXACT', 'capacitor', C_IDEAL, { available: 1, unitCost: '5.0000' })])).toBe('Z-EXACTx1');
  });

  it('counts the stock of a part used twice as half', () => {
    // A twice covers 12/2 = 6 builds; A with B covers min(12, 7) = 7; B twice 3.5; anything with C 3.
    const stock = [part('A', 'capacitor', C_IDEAL / 2, { available: 12 }), part('B', 'capacitor', C_IDEAL / 2, { available: 7 }), part('C', 'capacitor', C_IDEAL / 2, { available: 3 })];
    expect(best(stock, { combinations: true })).toBe('Ax1+Bx1');
  });
});

describe('reported numbers', () => {
  it('report the nominal value of pairs, the effective value at f0, and losses that add up', () => {
    const stock = [
      part('C1', 'capacitor', 22e-12, { srfHz: 2e9, esrOhm: 0.1 }),
      part('C2', 'capacitor', 33e-12, { srfHz: 1.5e9, esrOhm: 0.1 }),
      part('L', 'inductor', L_IDEAL, { srfHz: 3e9, q: 40, qFrequencyHz: 100e6 }),
    ];
    const fits = lowPass(solve(stock, { combinations: true })).fits;
    const parallel = fits.find((f) => f.elements[0].arrangement === 'parallel')!;
    expect(parallel.elements[0].nominalValue).toBeCloseTo(55e-12, 24);
    // With ESL the capacitors look larger below SRF: C_eff = C / (1 - (f/SRF)^2) for one part.
    expect(parallel.elements[0].effectiveValue).toBeGreaterThan(55e-12);
    const series = fits.find((f) => f.elements[0].arrangement === 'series');
    if (series) expect(series.elements[0].nominalValue).toBeCloseTo(1 / (1 / 22e-12 + 1 / 33e-12), 24);
    for (const f of fits) {
      expect(f.loss.dissipativeDb).toBeCloseTo(Math.max(0, f.loss.totalDb - f.loss.valueErrorDb), 12);
      expect(f.loss.worstCaseDb).toBeGreaterThanOrEqual(f.loss.totalDb - 1e-12);
      expect(f.tpg).toBeCloseTo(10 ** (-f.loss.totalDb / 10), 12);
      expect(f.yield).toBeGreaterThanOrEqual(0);
      expect(f.yield).toBeLessThanOrEqual(1);
    }
  });

  it('a single capacitor with ESL looks like C / (1 - (f/SRF)^2) at f0', () => {
    // ESL = 1/((2 pi SRF)^2 C), X = w ESL - 1/(w C) = -(1 - (f/SRF)^2)/(w C) (rf-engine.md "Part models").
    const fit = lowPass(solve([part('C', 'capacitor', 50e-12, { srfHz: 1e9 }), part('L', 'inductor', L_IDEAL)])).fits[0];
    expect(fit.elements[0].effectiveValue / (50e-12 / (1 - 0.01))).toBeCloseTo(1, 12);
  });
});
