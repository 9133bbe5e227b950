/**
 * Network evaluation: ABCD cascade, TPG and the port quantities, the losses of a fit, tolerance
 * corners, bandwidth, Monte Carlo and the power check. Each check names what it rests on.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  bandEdges,
  bandLoss,
  constantPort,
  cornerCount,
  cornerValues,
  createLadder,
  drawToleranceValues,
  type ElementModel,
  elementImpedance,
  elementModel,
  fitLosses,
  idealLadder,
  type Ladder,
  ladderResponse,
  ladderTpg,
  linearFrequencies,
  logFrequencies,
  mismatchLossDb,
  monteCarloYield,
  mulberry32,
  normalSource,
  partModel,
  type PartModel,
  powerCheck,
  returnLossDb,
  seriesEquivalentPort,
  seriesSearchTerms,
  solveLNetworks,
  sweepTpg,
  twoElementTpg,
  vswr,
} from '../../shared/engine/index.js';

const w = (f: number) => 2 * Math.PI * f;
const logUniform = (lo: number, hi: number) => fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map(Math.exp);
const port = fc
  .record({ r: logUniform(0.5, 2000), ratio: fc.double({ min: -3, max: 3, noNaN: true }) })
  .map(({ r, ratio }) => ({ re: r, im: r * ratio }));

/** A random real part: kind, value, optional SRF, optional loss, a tolerance. */
const part = fc
  .record({
    kind: fc.constantFrom<'capacitor' | 'inductor'>('capacitor', 'inductor'),
    c: logUniform(0.1e-12, 1e-9),
    l: logUniform(0.5e-9, 1e-6),
    srf: fc.option(logUniform(1e8, 3e10), { nil: null }),
    esr: fc.option(logUniform(1e-3, 5), { nil: null }),
    tolerance: fc.double({ min: 0, max: 0.2, noNaN: true }),
  })
  .map((p) =>
    partModel({
      kind: p.kind,
      valueSi: p.kind === 'capacitor' ? p.c : p.l,
      srfHz: p.srf,
      esrOhm: p.esr,
      tolerance: { mode: 'relative', fraction: p.tolerance },
    }),
  );

/** A random ladder of 1 to 4 elements, each one part or two of a kind in series or parallel. */
const ladder = fc
  .array(
    fc.record({
      position: fc.constantFrom<'series' | 'shunt'>('series', 'shunt'),
      arrangement: fc.constantFrom<'single' | 'series' | 'parallel'>('single', 'series', 'parallel'),
      first: part,
      second: part,
    }),
    { minLength: 1, maxLength: 4 },
  )
  .map((elements) =>
    createLadder(
      elements.map(({ position, arrangement, first, second }): ElementModel => {
        if (arrangement === 'single') return elementModel(position, 'single', [first]);
        const twin = partModel({ kind: first.kind, valueSi: second.kind === first.kind ? second.nominalSi : first.nominalSi * 1.7, esrOhm: second.lossOhm });
        return elementModel(position, arrangement, [first, twin]);
      }),
    ),
  );

describe('TPG and the port quantities', () => {
  it('a passive network never has TPG above 1 (fact of the trade), at any frequency', () => {
    fc.assert(
      fc.property(ladder, port, port, logUniform(1e5, 3e10), (network, zs, zl, f) => {
        const tpg = ladderTpg(network, constantPort(zs), constantPort(zl), f);
        expect(tpg).toBeGreaterThanOrEqual(0);
        expect(tpg).toBeLessThanOrEqual(1 + 1e-12);
      }),
      { numRuns: 2000 },
    );
  });

  it('lossless networks: TPG = 1 - |G|^2 (power-wave reflection, Kurokawa 1965), mismatch loss = -10 log10 TPG', () => {
    fc.assert(
      fc.property(ladder, port, port, logUniform(1e6, 1e10), (network, zs, zl, f) => {
        const point = ladderResponse(network, constantPort(zs), constantPort(zl), f, undefined, null, true);
        expect(Math.abs(point.tpg - (1 - point.gammaMagnitude ** 2))).toBeLessThan(1e-9);
        if (point.tpg > 1e-6) expect(mismatchLossDb(point.gammaMagnitude)).toBeCloseTo(-10 * Math.log10(point.tpg), 6);
      }),
      { numRuns: 1000 },
    );
  });

  it('return loss and VSWR at |G| = 1/3 (fact of the trade: VSWR 2, return loss 9.54 dB)', () => {
    expect(vswr(1 / 3)).toBeCloseTo(2, 12);
    expect(returnLossDb(1 / 3)).toBeCloseTo(9.542, 3);
    expect(mismatchLossDb(1 / 3)).toBeCloseTo(0.512, 3);
  });

  it('Zin of a series element into a load is Z + ZL (circuit fact)', () => {
    const inductor = partModel({ kind: 'inductor', valueSi: 10e-9, esrOhm: 0.5 });
    const network = createLadder([elementModel('series', 'single', [inductor])]);
    const point = ladderResponse(network, constantPort({ re: 50, im: 0 }), constantPort({ re: 30, im: -20 }), 1e9);
    expect(point.zinRe).toBeCloseTo(30.5, 12);
    expect(point.zinIm).toBeCloseTo(-20 + w(1e9) * 10e-9, 10);
  });

  it('at DC a low-pass real-to-real network passes 4 Rs RL / (Rs + RL)^2; a high-pass one passes nothing (fact of the trade)', () => {
    for (const [rs, rl] of [[50, 200], [50, 10], [75, 1000]]) {
      const solution = solveLNetworks({ re: rs, im: 0 }, { re: rl, im: 0 }, 100e6);
      const low = solution.networks.find((n) => n.response === 'low-pass')!;
      const high = solution.networks.find((n) => n.response === 'high-pass')!;
      const near0 = 1; // 1 Hz: 1e-8 of f0, where the reactances are 1e8 times from their f0 values.
      const source = constantPort({ re: rs, im: 0 });
      const load = constantPort({ re: rl, im: 0 });
      expect(ladderTpg(idealLadder(low.elements), source, load, near0)).toBeCloseTo((4 * rs * rl) / (rs + rl) ** 2, 9);
      expect(ladderTpg(idealLadder(high.elements), source, load, near0)).toBeLessThan(1e-12);
    }
  });
});

describe('the fast two-element evaluation for the snapper', () => {
  it('twoElementTpg equals the ladder cascade, both placements', () => {
    fc.assert(
      fc.property(part, part, port, port, logUniform(1e6, 1e10), (s, h, zs, zl, f) => {
        const zSeries = elementImpedance(elementModel('series', 'single', [s]), w(f), { re: 0, im: 0 });
        const zShunt = elementImpedance(elementModel('shunt', 'single', [h]), w(f), { re: 0, im: 0 });
        const d = zShunt.re ** 2 + zShunt.im ** 2;
        for (const placement of ['shunt-at-load', 'shunt-at-source'] as const) {
          const elements = [elementModel('series', 'single', [s]), elementModel('shunt', 'single', [h])];
          const network = createLadder(placement === 'shunt-at-load' ? elements : elements.reverse());
          const expected = ladderTpg(network, constantPort(zs), constantPort(zl), f);
          const fast = twoElementTpg(placement, zs.re, zs.im, zl.re, zl.im, zSeries.re, zSeries.im, zShunt.re / d, -zShunt.im / d);
          expect(Math.abs(fast - expected)).toBeLessThanOrEqual(1e-12 + 1e-9 * expected);
        }
      }),
      { numRuns: 1000 },
    );
  });

  it('seriesSearchTerms: TPG = numerator / ((Rfixed + Rser)^2 + (Xser - X*)^2) for any series impedance', () => {
    fc.assert(
      fc.property(
        port,
        port,
        fc.double({ min: 0, max: 0.05, noNaN: true }),
        fc.double({ min: -0.1, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        (zs, zl, g, b, rSeries, xSeries) => {
          for (const placement of ['shunt-at-load', 'shunt-at-source'] as const) {
            const terms = seriesSearchTerms(placement, zs.re, zs.im, zl.re, zl.im, g, b, { targetReactanceOhm: 0, fixedResistanceOhm: 0, numerator: 0 });
            const expected = twoElementTpg(placement, zs.re, zs.im, zl.re, zl.im, rSeries, xSeries, g, b);
            const formula = terms.numerator / ((terms.fixedResistanceOhm + rSeries) ** 2 + (xSeries - terms.targetReactanceOhm) ** 2);
            expect(Math.abs(formula - expected)).toBeLessThanOrEqual(1e-12 + 1e-9 * expected);
          }
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('the target reactance of an ideal network\'s shunt element is its series reactance', () => {
    const zs = { re: 50, im: 15 };
    const zl = { re: 20, im: -40 };
    for (const n of solveLNetworks(zs, zl, 868e6).networks) {
      if (n.elements.length < 2) continue;
      const terms = seriesSearchTerms(n.placement, zs.re, zs.im, zl.re, zl.im, 0, n.shuntSusceptanceS, { targetReactanceOhm: 0, fixedResistanceOhm: 0, numerator: 0 });
      expect(terms.targetReactanceOhm).toBeCloseTo(n.seriesReactanceOhm, 9);
    }
  });
});

describe('tolerance corners', () => {
  it('k parts give 2^k distinct corners, each part at nominal ± tolerance', () => {
    fc.assert(
      fc.property(fc.array(part, { minLength: 0, maxLength: 8 }), (parts) => {
        const network = createLadder(parts.map((p: PartModel) => elementModel('series', 'single', [p])));
        const count = cornerCount(parts.length);
        expect(count).toBe(2 ** parts.length);
        const seen = new Set<string>();
        for (let corner = 0; corner < count; corner++) {
          const values = cornerValues(network, corner);
          const signs = parts.map((p, i) => {
            const plus = Math.max(p.nominalSi * 0.01, p.nominalSi + p.toleranceSi);
            const minus = Math.max(p.nominalSi * 0.01, p.nominalSi - p.toleranceSi);
            expect([plus, minus]).toContain(values[i]);
            return (corner >>> i) & 1 ? '+' : '-';
          });
          seen.add(signs.join(''));
        }
        expect(seen.size).toBe(count);
      }),
      { numRuns: 200 },
    );
  });

  it('an absolute tolerance applies as is (±0.1 pF on 1 pF and on 10 pF)', () => {
    for (const c of [1e-12, 10e-12]) {
      const p = partModel({ kind: 'capacitor', valueSi: c, tolerance: { mode: 'absolute', deltaSi: 0.1e-12 } });
      const network = createLadder([elementModel('shunt', 'single', [p])]);
      expect([...cornerValues(network, 0)]).toEqual([c - 0.1e-12]);
      expect([...cornerValues(network, 1)]).toEqual([c + 0.1e-12]);
    }
  });
});

/** The ideal values of 50 Ω to 20 - j40 Ω at 868 MHz, snapped to nearby real parts with models. */
function snappedFit(): { network: Ladder; source: ReturnType<typeof seriesEquivalentPort>; load: ReturnType<typeof seriesEquivalentPort>; f0: number } {
  const f0 = 868e6;
  const source = seriesEquivalentPort({ re: 50, im: 0 }, f0);
  const load = seriesEquivalentPort({ re: 20, im: -40 }, f0);
  const l = partModel({ kind: 'inductor', valueSi: 10e-9, srfHz: 3.2e9, q: 35, qFrequencyHz: 500e6, tolerance: { mode: 'relative', fraction: 0.05 }, currentRatingA: 0.3 });
  const c = partModel({ kind: 'capacitor', valueSi: 3.3e-12, srfHz: 7e9, esrOhm: 0.25, tolerance: { mode: 'absolute', deltaSi: 0.1e-12 }, voltageRatingV: 50 });
  return { network: createLadder([elementModel('shunt', 'single', [c]), elementModel('series', 'single', [l])]), source, load, f0 };
}

describe('losses of a fit', () => {
  it('ideal network with exact parts: no value error, no dissipation; worst case and band loss > 0 once tolerances and a band exist', () => {
    const f0 = 915e6;
    const zs = { re: 50, im: 0 };
    const zl = { re: 12, im: -35 };
    const network = solveLNetworks(zs, zl, f0).networks[0];
    const exact = idealLadder(network.elements);
    const losses = fitLosses(exact, seriesEquivalentPort(zs, f0), seriesEquivalentPort(zl, f0), f0, { lowHz: 900e6, highHz: 930e6 });
    expect(losses.valueErrorDb).toBeLessThan(1e-9);
    expect(losses.dissipativeDb).toBeLessThan(1e-9);
    expect(losses.worstCaseDb).toBeLessThan(1e-9); // exact parts: every corner is nominal
    expect(losses.bandDb!).toBeGreaterThan(0);
  });

  it('parts with loss only: value error ~ 0 and dissipative = total; with parasitics only: dissipative ~ 0', () => {
    const f0 = 868e6;
    const zs = { re: 50, im: 0 };
    const zl = { re: 20, im: -40 };
    const ideal = solveLNetworks(zs, zl, f0).networks.find((n) => n.elements.length === 2)!;
    const source = seriesEquivalentPort(zs, f0);
    const load = seriesEquivalentPort(zl, f0);
    const lossy = createLadder(ideal.elements.map((e) => elementModel(e.position, 'single', [partModel({ kind: e.kind, valueSi: e.value, esrOhm: 0.4 })])));
    const a = fitLosses(lossy, source, load, f0);
    expect(a.valueErrorDb).toBeLessThan(1e-9);
    expect(a.dissipativeDb).toBeGreaterThan(0.01);
    expect(a.dissipativeDb).toBeCloseTo(a.totalDb, 9);
    const parasitic = createLadder(ideal.elements.map((e) => elementModel(e.position, 'single', [partModel({ kind: e.kind, valueSi: e.value, srfHz: 4e9 })])));
    const b = fitLosses(parasitic, source, load, f0);
    expect(b.valueErrorDb).toBeGreaterThan(0.001);
    expect(b.dissipativeDb).toBe(0);
    expect(b.totalDb).toBeCloseTo(b.valueErrorDb, 12);
  });

  it('worst case is the largest total over all corners; band loss the largest over the band', () => {
    const { network, source, load, f0 } = snappedFit();
    const losses = fitLosses(network, source, load, f0, { lowHz: 860e6, highHz: 876e6 });
    let worst = 0;
    for (let corner = 0; corner < 4; corner++) worst = Math.max(worst, -10 * Math.log10(ladderTpg(network, source, load, f0, cornerValues(network, corner))));
    expect(losses.worstCaseDb).toBe(worst);
    const dense = linearFrequencies(860e6, 876e6, 2001);
    const tpg = sweepTpg(network, source, load, dense);
    const denseWorst = -10 * Math.log10(Math.min(...tpg));
    expect(losses.bandDb!).toBeLessThanOrEqual(denseWorst + 1e-12);
    expect(losses.bandDb!).toBeGreaterThan(denseWorst - 1e-3);
    expect(bandLoss(network, source, load, { lowHz: f0, highHz: f0 }, 1)).toBeCloseTo(losses.totalDb, 12);
    expect(losses.totalDb).toBeCloseTo(losses.valueErrorDb + losses.dissipativeDb, 12);
  });
});

describe('bandwidth', () => {
  it('a series L between 50 Ω and 50 Ω: an edge where (w L)^2 = (10^(drop/10) - 1)(Rs + RL)^2 (circuit analysis)', () => {
    // TPG = 4 Rs RL / ((Rs + RL)^2 + (w L)^2), so the edges are exact.
    const l = 50e-9;
    const network = createLadder([elementModel('series', 'single', [partModel({ kind: 'inductor', valueSi: l })])]);
    const source = constantPort({ re: 50, im: 0 });
    const load = constantPort({ re: 50, im: 0 });
    const f = logFrequencies(1e3, 1e10, 401);
    const tpg = sweepTpg(network, source, load, f);
    const three = bandEdges(network, source, load, f, tpg, 3);
    const one = bandEdges(network, source, load, f, tpg, 1);
    // Peak is 1 at the lowest frequency, so "3 dB" means TPG = 10^-0.3: (w L)^2 = (10^0.3 - 1) 100^2.
    expect(three.lowHz).toBeNull();
    expect(Math.abs(three.highHz! / (Math.sqrt(10 ** 0.3 - 1) * 100 / (2 * Math.PI * l)) - 1)).toBeLessThan(1e-9);
    expect(Math.abs(one.highHz! / (Math.sqrt(10 ** 0.1 - 1) * 100 / (2 * Math.PI * l)) - 1)).toBeLessThan(1e-9);
    expect(three.widthHz).toBeNull();
  });

  it('an ideal L network: both edges found, TPG there is 1 dB and 3 dB under the peak', () => {
    const f0 = 868e6;
    const zs = { re: 50, im: 0 };
    const zl = { re: 10, im: -30 };
    const source = seriesEquivalentPort(zs, f0);
    const load = seriesEquivalentPort(zl, f0);
    for (const n of solveLNetworks(zs, zl, f0).networks) {
      const network = idealLadder(n.elements);
      const f = linearFrequencies(0.2 * f0, 3 * f0, 1001);
      const tpg = sweepTpg(network, source, load, f);
      for (const drop of [1, 3]) {
        const edges = bandEdges(network, source, load, f, tpg, drop);
        const peak = Math.max(...tpg);
        for (const edge of [edges.lowHz, edges.highHz]) {
          if (edge === null) continue;
          expect(10 * Math.log10(peak / ladderTpg(network, source, load, edge))).toBeCloseTo(drop, 8);
        }
        expect(edges.lowHz === null || edges.lowHz < f0).toBe(true);
        expect(edges.highHz === null || edges.highHz > f0).toBe(true);
      }
    }
  });
});

describe('Monte Carlo yield', () => {
  it('is reproducible for one seed and differs for another', () => {
    const { network, source, load, f0 } = snappedFit();
    const budget = fitLosses(network, source, load, f0).totalDb + 0.05;
    const a = monteCarloYield(network, source, load, f0, { budgetDb: budget, samples: 5000, seed: 7 });
    const b = monteCarloYield(network, source, load, f0, { budgetDb: budget, samples: 5000, seed: 7 });
    const c = monteCarloYield(network, source, load, f0, { budgetDb: budget, samples: 5000, seed: 8 });
    expect(b).toEqual(a);
    expect(c.medianLossDb).not.toBe(a.medianLossDb);
    expect(a.yieldFraction).toBeGreaterThan(0);
    expect(a.yieldFraction).toBeLessThan(1);
    expect(a.worstLossDb).toBeLessThanOrEqual(fitLosses(network, source, load, f0).worstCaseDb + 1e-12);
    expect(monteCarloYield(network, source, load, f0, { budgetDb: 100, samples: 100 }).yieldFraction).toBe(1);
    expect(monteCarloYield(network, source, load, f0, { budgetDb: 0, samples: 100 }).yieldFraction).toBe(0);
  });

  it('draws normal with sigma = tol/3, clipped at ± tol (the stated assumption)', () => {
    const p = partModel({ kind: 'inductor', valueSi: 100e-9, tolerance: { mode: 'relative', fraction: 0.05 } });
    const network = createLadder([elementModel('series', 'single', [p])]);
    const normal = normalSource(mulberry32(12345));
    const n = 200_000;
    const out = new Float64Array(1);
    let sum = 0;
    let sumSquares = 0;
    let clipped = 0;
    const tol = 5e-9;
    for (let i = 0; i < n; i++) {
      const offset = drawToleranceValues(network, normal, out)[0] - 100e-9;
      expect(Math.abs(offset)).toBeLessThanOrEqual(tol * (1 + 1e-12));
      if (Math.abs(offset) >= tol * (1 - 1e-12)) clipped++;
      sum += offset;
      sumSquares += offset * offset;
    }
    const sigma = tol / 3;
    expect(Math.abs(sum / n)).toBeLessThan((5 * sigma) / Math.sqrt(n));
    // A normal clipped at 3 sigma keeps 98.6 % of its variance; allow sampling error.
    expect(Math.sqrt(sumSquares / n) / sigma).toBeGreaterThan(0.98);
    expect(Math.sqrt(sumSquares / n) / sigma).toBeLessThan(1.0);
    // P(|z| > 3) = 0.0027 (normal table): about 540 of 200,000, binomial sd about 23.
    expect(clipped).toBeGreaterThan(540 - 5 * 23);
    expect(clipped).toBeLessThan(540 + 5 * 23);
  });

  it('refuses a bad budget or sample count', () => {
    const { network, source, load, f0 } = snappedFit();
    expect(() => monteCarloYield(network, source, load, f0, { budgetDb: Number.NaN })).toThrow(/budgetDb/);
    expect(() => monteCarloYield(network, source, load, f0, { budgetDb: 1, samples: 0 })).toThrow(/samples/);
  });
});

describe('power check', () => {
  it('50 Ω to 200 Ω at 1 W, hand calculation: 20 V peak on the shunt C, 0.1414 A RMS in the series L', () => {
    // Vs = sqrt(8 P Rs) = sqrt(400) = 20 V peak. Matched: all 1 W reaches RL = 200 Ω, so the load
    // (and the shunt C across it) sees V = sqrt(2 P RL) = 20 V peak. The series L carries the source
    // current sqrt(2 P / Rs) = 0.2 A peak = 0.1414 A RMS.
    const f0 = 100e6;
    const network = solveLNetworks({ re: 50, im: 0 }, { re: 200, im: 0 }, f0).networks.find((n) => n.response === 'low-pass')!;
    const ladderOf = createLadder(
      network.elements.map((e) =>
        elementModel(e.position, 'single', [partModel({ kind: e.kind, valueSi: e.value, voltageRatingV: 16, currentRatingA: 0.5 })]),
      ),
    );
    const check = powerCheck(ladderOf, constantPort({ re: 50, im: 0 }), constantPort({ re: 200, im: 0 }), f0, 1);
    expect(check.sourcePeakVoltageV).toBeCloseTo(20, 12);
    const c = check.parts.find((p) => p.kind === 'capacitor')!;
    const l = check.parts.find((p) => p.kind === 'inductor')!;
    expect(c.peakVoltageV).toBeCloseTo(20, 9);
    expect(l.rmsCurrentA).toBeCloseTo(0.2 / Math.SQRT2, 9);
    expect(c.overRating).toBe(true); // 20 V on a 16 V part
    expect(l.overRating).toBe(false);
    expect(check.anyOverRating).toBe(true);
    expect(() => powerCheck(ladderOf, constantPort({ re: 50, im: 0 }), constantPort({ re: 200, im: 0 }), f0, -1)).toThrow(/powerW/);
  });
});

describe('bad input to evaluation helpers', () => {
  const { network, source, load } = snappedFit();
  it.each<[string, () => unknown, RegExp]>([
    ['sweep from 0 Hz', () => linearFrequencies(0, 1e9, 11), /outside 1 Hz/],
    ['sweep to 1e13 Hz', () => logFrequencies(1e6, 1e13, 11), /outside 1 Hz/],
    ['sweep that runs backwards', () => linearFrequencies(2e9, 1e9, 11), /below startHz/],
    ['sweep of one point', () => linearFrequencies(1e9, 2e9, 1), /whole number from 2/],
    ['sweep of NaN points', () => linearFrequencies(1e9, 2e9, Number.NaN), /whole number from 2/],
    ['band upside down', () => bandLoss(network, source, load, { lowHz: 2e9, highHz: 1e9 }), /below the lower edge/],
    ['band at infinity', () => bandLoss(network, source, load, { lowHz: 1e9, highHz: Number.POSITIVE_INFINITY }), /not a finite frequency/],
    ['power NaN', () => powerCheck(network, source, load, 868e6, Number.NaN), /powerW/],
    ['power 1e300 W', () => powerCheck(network, source, load, 868e6, 1e300), /at most/],
    ['corners of -1 parts', () => cornerCount(-1), /outside 0/],
    ['series-equivalent port with R = 0', () => seriesEquivalentPort({ re: 0, im: 5 }, 1e9), /greater than 0 Ω/],
    ['constant port with R = -50', () => constantPort({ re: -50, im: 0 }), /greater than 0 Ω/],
  ])('%s', (_label, run, reason) => {
    expect(run).toThrow(reason);
  });
});
