/**
 * Shortfall calculations checked against values worked by hand (the arithmetic is written beside
 * each check; a pocket calculator's digits, never the code's output):
 * attrition, minimum SRF, buy-to values (IEC 60063 tables, log distance), the tolerance needed to
 * keep the worst case within budget (a one-element match whose loss has a closed form), merging.
 */
import { describe, expect, it } from 'vitest';
import {
  buyToLoss,
  buyToValue,
  mergeShortfallLines,
  minimumSrfHz,
  quantityWithAttrition,
  shortfallLinesForMatch,
  toleranceChoices,
  tolerancesNeeded,
  type MatchDesign,
  type ShortfallSettings,
} from '../../shared/shortfall/index.js';

const TWO_PI = 2 * Math.PI;

describe('quantityWithAttrition: ceil(short x (1 + a/100))', () => {
  it('rounds the allowance up to whole parts', () => {
    // 40 x 1.05 = 42 exactly -> 42; 1 x 1.05 = 1.05 -> 2; 19 x 1.05 = 19.95 -> 20; 20 x 1.05 = 21 -> 21.
    expect(quantityWithAttrition(40, 5)).toBe(42);
    expect(quantityWithAttrition(1, 5)).toBe(2);
    expect(quantityWithAttrition(19, 5)).toBe(20);
    expect(quantityWithAttrition(20, 5)).toBe(21);
    // 7 x 1.025 = 7.175 -> 8; 0 short buys nothing; 0 % buys exactly what is short.
    expect(quantityWithAttrition(7, 2.5)).toBe(8);
    expect(quantityWithAttrition(0, 5)).toBe(0);
    expect(quantityWithAttrition(13, 0)).toBe(13);
  });

  it('does not add a part from float rounding (100 x 1.05 is 105, not 106)', () => {
    // In doubles 100 * 1.05 = 105.00000000000001, whose ceiling would be 106; the allowance is exactly 5 parts.
    expect(quantityWithAttrition(100, 5)).toBe(105);
    // 1000 x 1.07 = 1070 exactly.
    expect(quantityWithAttrition(1000, 7)).toBe(1070);
  });

  it('refuses nonsense with a message that names it', () => {
    expect(() => quantityWithAttrition(-1, 5)).toThrow(/whole number >= 0, got -1/);
    expect(() => quantityWithAttrition(2.5, 5)).toThrow(/got 2.5/);
    expect(() => quantityWithAttrition(3, -5)).toThrow(/0 to 100 %, got -5/);
    expect(() => quantityWithAttrition(3, Number.NaN)).toThrow(/got NaN/);
  });
});

describe('minimumSrfHz: f0 / usable fraction', () => {
  it('gives the SRF a part needs to be within its limit at f0', () => {
    // 868 MHz / 0.5 = 1.736 GHz; 2.45 GHz / 0.4 = 6.125 GHz; 13.56 MHz / 0.5 = 27.12 MHz.
    expect(minimumSrfHz(868e6, 0.5)).toBeCloseTo(1.736e9, 0);
    expect(minimumSrfHz(2.45e9, 0.4)).toBeCloseTo(6.125e9, 0);
    expect(minimumSrfHz(13.56e6, 0.5)).toBeCloseTo(27.12e6, 0);
  });

  it('refuses a fraction outside (0, 1] and a bad frequency', () => {
    expect(() => minimumSrfHz(868e6, 0)).toThrow(/above 0 and at most 1, got 0/);
    expect(() => minimumSrfHz(868e6, 1.5)).toThrow(/got 1.5/);
    expect(() => minimumSrfHz(-1, 0.5)).toThrow(/got -1/);
  });
});

describe('buyToValue: nearest IEC 60063 value by log distance', () => {
  it('picks the neighbour with the smaller |ln(ideal / standard)|', () => {
    // 3.9 nH in E6 (3.3, 4.7): ln(3.9/3.3) = 0.167 < ln(4.7/3.9) = 0.187 -> 3.3 nH (not the linear midpoint rule).
    expect(buyToValue(3.9e-9, 'E6')).toBe(3.3e-9);
    // 2.1 pF in E12 (1.8, 2.2): ln(2.1/1.8) = 0.154 > ln(2.2/2.1) = 0.047 -> 2.2 pF.
    expect(buyToValue(2.1e-12, 'E12')).toBe(2.2e-12);
    // 9.6 nH in E12 (8.2, 10): ln(9.6/8.2) = 0.158 > ln(10/9.6) = 0.041 -> 10 nH, the next decade.
    expect(buyToValue(9.6e-9, 'E12')).toBe(10e-9);
    // 2.9 pF in E24 (2.7, 3.0): ln(2.9/2.7) = 0.0715 > ln(3.0/2.9) = 0.0339 -> 3.0 pF, the historic E24 value.
    expect(buyToValue(2.9e-12, 'E24')).toBe(3e-12);
  });
});

/**
 * A one-element match with a closed form: a 50 ohm source (Norton Gs = 0.02 S) and a load
 * YL = 0.02 - j B0 (a tag coil with its parallel loss), matched by one shunt capacitor of ideal
 * value C0 = B0 / w. With a capacitor C instead, the node sees Gs + GL + j w (C - C0), so
 * TPG = 4 Gs GL / |Gs + GL + j dB|^2 = 1 / (1 + (dB / 0.04)^2) and the loss is
 * 10 log10(1 + (dB / 0.04)^2) with dB = w (C - C0) (rf-engine.md's TPG formula for this network).
 */
function tagCoilDesign(idealCapacitanceF: number): MatchDesign {
  const f0 = 13.56e6;
  const b0 = TWO_PI * f0 * idealCapacitanceF;
  const loadAdmittance = { re: 0.02, im: -b0 };
  const d = loadAdmittance.re ** 2 + loadAdmittance.im ** 2;
  return {
    source: { re: 50, im: 0 },
    load: { re: loadAdmittance.re / d, im: -loadAdmittance.im / d },
    frequencyHz: f0,
    elements: [
      {
        position: 'shunt',
        kind: 'capacitor',
        idealValue: idealCapacitanceF,
        arrangement: 'single',
        parts: [{ kind: 'capacitor', valueSi: idealCapacitanceF }],
      },
    ],
  };
}

describe('tolerancesNeeded: the loosest IEC 60062 letter within the loss budget', () => {
  it('buys ±10 % (K) for an exact 1 nF at 13.56 MHz, because ±20 % (M) loses too much', () => {
    // w = 2 pi 13.56 MHz = 8.5199e7 rad/s; B0 = w x 1 nF = 0.085200 S.
    // M: dB = 0.2 x 0.085200 = 0.017040 S -> 10 log10(1 + (0.017040/0.04)^2) = 10 log10(1.18148) = 0.7242 dB > 0.5.
    // K: dB = 0.008520 S -> 10 log10(1 + 0.045369) = 0.1927 dB <= 0.5.
    const found = tolerancesNeeded(tagCoilDesign(1e-9), new Map([[0, 1e-9]]), 0.5);
    expect(found.choices.map((c) => c.code)).toEqual(['K']);
    expect(found.choices[0].tolerance).toEqual({ mode: 'relative', fraction: 0.1 });
    expect(found.worstCaseDb).toBeCloseTo(0.1927, 3);
    expect(found.withinBudget).toBe(true);
  });

  it('counts the value step: 1.05 nF ideal buys 1.0 nF (E12) at ±10 %, or ±5 % for a 0.4 dB budget', () => {
    // Buy-to: 1.05 nF in E12 (1.0, 1.2): ln(1.05) = 0.049 < ln(1.2/1.05) = 0.134 -> 1.0 nF.
    expect(buyToValue(1.05e-9, 'E12')).toBe(1e-9);
    const design = tagCoilDesign(1.05e-9);
    // Nominal: dB = w (1.0 - 1.05) nF = -0.0042600 S -> 10 log10(1 + (0.10650)^2) = 0.04898 dB.
    expect(buyToLoss(design, new Map([[0, 1e-9]])).totalDb).toBeCloseTo(0.04898, 4);
    // K corners 0.9 nF and 1.1 nF: dB = w (-0.15 nF) = -0.012780 S -> 10 log10(1 + 0.10208) = 0.4221 dB (worst);
    // M corner 0.8 nF: dB = -0.021300 S -> 10 log10(1 + 0.28355) = 1.0841 dB > 0.5.
    const at05 = tolerancesNeeded(design, new Map([[0, 1e-9]]), 0.5);
    expect(at05.choices[0].code).toBe('K');
    expect(at05.worstCaseDb).toBeCloseTo(0.4221, 3);
    // Budget 0.4 dB: K's 0.4221 dB is over; J corner 0.95 nF: dB = -0.008520 S -> 0.1927 dB.
    const at04 = tolerancesNeeded(design, new Map([[0, 1e-9]]), 0.4);
    expect(at04.choices[0].code).toBe('J');
    expect(at04.worstCaseDb).toBeCloseTo(0.1927, 3);
  });

  it('says so when even ±1 % (F) cannot keep the budget', () => {
    // 1.15 nF ideal bought as 1.2 nF (E12: ln(1.2/1.15) = 0.043 < ln(1.15/1.0) = 0.140): the step alone is
    // dB = w x 0.05 nF = 0.004260 S -> 0.049 dB, so with a 0.01 dB budget no letter suffices.
    const found = tolerancesNeeded(tagCoilDesign(1.15e-9), new Map([[0, 1.2e-9]]), 0.01);
    expect(found.withinBudget).toBe(false);
    expect(found.choices[0].code).toBe('F');
  });

  it('offers the absolute letters D, C, B below 10 pF and relative letters for inductors (IEC 60062)', () => {
    expect(toleranceChoices('capacitor', 6.8e-12).map((c) => c.code)).toEqual(['D', 'C', 'B']);
    expect(toleranceChoices('capacitor', 10e-12).map((c) => c.code)).toEqual(['M', 'K', 'J', 'G', 'F']);
    expect(toleranceChoices('inductor', 1e-9).map((c) => c.code)).toEqual(['M', 'K', 'J', 'G', 'F']);
  });
});

const SETTINGS: ShortfallSettings = {
  preferredSeries: { capacitor: 'E12', inductor: 'E12' },
  usableSrfFraction: 0.5,
  lossBudgetDb: 0.5,
  attritionPercent: 5,
};

describe('shortfallLinesForMatch and mergeShortfallLines', () => {
  it('writes the buy-to spec of a short element', () => {
    const [line] = shortfallLinesForMatch(
      { matchId: 7, matchName: 'tag coil', design: tagCoilDesign(1.05e-9) },
      [{ elementIndex: 0, shortQuantity: 40, reason: 'short-stock', reasonText: 'only 10 available', package: '0603' }],
      SETTINGS,
    );
    // Buy 1.0 nF (above), 40 x 1.05 = 42 parts, min SRF 13.56 MHz / 0.5 = 27.12 MHz, K (above), package kept.
    expect(line).toMatchObject({ kind: 'capacitor', idealValue: 1.05e-9, buyValue: 1e-9, series: 'E12', quantity: 42, shortQuantity: 40, toleranceCode: 'K', package: '0603', reason: 'short-stock' });
    expect(line.minSrfHz).toBeCloseTo(27.12e6, 0);
    expect(line.buyLossDb).toBeCloseTo(0.04898, 4);
    expect(line.sources).toEqual([expect.objectContaining({ matchId: 7, matchName: 'tag coil', position: 'shunt', shortQuantity: 40 })]);
  });

  it('merges lines of one spec: shortfalls add, the allowance is applied once, the strictest spec wins', () => {
    const a = shortfallLinesForMatch(
      { matchId: 1, matchName: 'reader A', design: tagCoilDesign(1.05e-9) },
      [{ elementIndex: 0, shortQuantity: 25, reason: 'short-stock', reasonText: 'A short', package: '0603' }],
      SETTINGS,
    );
    // An exact 1 nF ideal: the same buy-to value (1.0 nF), series and package, so the same spec.
    const b = shortfallLinesForMatch(
      { matchId: 2, matchName: 'reader B', design: tagCoilDesign(1e-9) },
      [{ elementIndex: 0, shortQuantity: 15, reason: 'short-stock', reasonText: 'B short', package: '0603' }],
      SETTINGS,
    );
    const other = shortfallLinesForMatch(
      { matchId: 3, matchName: 'reader C', design: tagCoilDesign(1e-9) },
      [{ elementIndex: 0, shortQuantity: 5, reason: 'short-stock', reasonText: 'C short', package: '0402' }],
      SETTINGS,
    );
    const merged = mergeShortfallLines([...a, ...other, ...b], 5);
    expect(merged).toHaveLength(2);
    // 25 + 15 = 40 short -> ceil(40 x 1.05) = 42 (two separate allowances would have bought 27 + 16 = 43).
    expect(merged[0]).toMatchObject({ buyValue: 1e-9, package: '0603', shortQuantity: 40, quantity: 42, reasonText: 'A short; B short' });
    expect(merged[0].sources.map((s) => s.matchId)).toEqual([1, 2]);
    // The 0402 line is another spec: 5 x 1.05 = 5.25 -> 6.
    expect(merged[1]).toMatchObject({ package: '0402', shortQuantity: 5, quantity: 6 });
  });

  it('takes the tightest tolerance and the highest minimum SRF of merged lines', () => {
    const loose = shortfallLinesForMatch(
      { matchId: 1, matchName: 'loose', design: tagCoilDesign(1e-9) },
      [{ elementIndex: 0, shortQuantity: 3, reason: 'short-stock', reasonText: 'x', package: null }],
      SETTINGS,
    );
    const tight = shortfallLinesForMatch(
      { matchId: 2, matchName: 'tight', design: tagCoilDesign(1.05e-9) },
      [{ elementIndex: 0, shortQuantity: 4, reason: 'short-stock', reasonText: 'x', package: null }],
      { ...SETTINGS, lossBudgetDb: 0.4, usableSrfFraction: 0.25 },
    );
    // loose: K (0.1927 dB at 0.5); tight: J (0.4 dB budget, above); min SRF 27.12 MHz vs 13.56 MHz / 0.25 = 54.24 MHz.
    expect(loose[0].toleranceCode).toBe('K');
    expect(tight[0].toleranceCode).toBe('J');
    const [merged] = mergeShortfallLines([...loose, ...tight], 5);
    expect(merged.toleranceCode).toBe('J');
    expect(merged.tolerance).toEqual({ mode: 'relative', fraction: 0.05 });
    expect(merged.minSrfHz).toBeCloseTo(54.24e6, 0);
    // 3 + 4 = 7 -> ceil(7.35) = 8.
    expect(merged.quantity).toBe(8);
  });
});
