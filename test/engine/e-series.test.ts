/**
 * Reference check: IEC 60063:2015 preferred number series and IEC 60062 tolerance letters.
 * The tables below are typed into this test from IEC 60063:2015, tables 1 to 3 (typed from memory of
 * the standard, then cross-checked against the standard's own rule that E48, E96 and E192 are the
 * geometric series rounded to three figures, with the one historic exception 9.20 in E192; see
 * the "formula" tests). They are not read from the engine's tables.
 */
import { describe, expect, it } from 'vitest';
import {
  E_SERIES_NAMES,
  eSeriesValues,
  isStandardValue,
  nearestStandardValue,
  standardValuesBetween,
  TOLERANCE_LETTERS,
  toleranceDeltaSi,
} from '../../shared/engine/index.js';

// IEC 60063:2015, table 1 (E3 to E24): the historic values.
const IEC_60063_E3 = [1.0, 2.2, 4.7];
const IEC_60063_E6 = [1.0, 1.5, 2.2, 3.3, 4.7, 6.8];
const IEC_60063_E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
const IEC_60063_E24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
  3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
];
// IEC 60063:2015, table 2 (E48, E96).
const IEC_60063_E48 = [
  1.00, 1.05, 1.10, 1.15, 1.21, 1.27, 1.33, 1.40, 1.47, 1.54, 1.62, 1.69,
  1.78, 1.87, 1.96, 2.05, 2.15, 2.26, 2.37, 2.49, 2.61, 2.74, 2.87, 3.01,
  3.16, 3.32, 3.48, 3.65, 3.83, 4.02, 4.22, 4.42, 4.64, 4.87, 5.11, 5.36,
  5.62, 5.90, 6.19, 6.49, 6.81, 7.15, 7.50, 7.87, 8.25, 8.66, 9.09, 9.53,
];
const IEC_60063_E96 = [
  1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30,
  1.33, 1.37, 1.40, 1.43, 1.47, 1.50, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74,
  1.78, 1.82, 1.87, 1.91, 1.96, 2.00, 2.05, 2.10, 2.15, 2.21, 2.26, 2.32,
  2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.80, 2.87, 2.94, 3.01, 3.09,
  3.16, 3.24, 3.32, 3.40, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12,
  4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49,
  5.62, 5.76, 5.90, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32,
  7.50, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
];
// IEC 60063:2015, table 3 (E192), with 9.20 where the formula gives 9.19.
const IEC_60063_E192 = [
  1.00, 1.01, 1.02, 1.04, 1.05, 1.06, 1.07, 1.09, 1.10, 1.11, 1.13, 1.14,
  1.15, 1.17, 1.18, 1.20, 1.21, 1.23, 1.24, 1.26, 1.27, 1.29, 1.30, 1.32,
  1.33, 1.35, 1.37, 1.38, 1.40, 1.42, 1.43, 1.45, 1.47, 1.49, 1.50, 1.52,
  1.54, 1.56, 1.58, 1.60, 1.62, 1.64, 1.65, 1.67, 1.69, 1.72, 1.74, 1.76,
  1.78, 1.80, 1.82, 1.84, 1.87, 1.89, 1.91, 1.93, 1.96, 1.98, 2.00, 2.03,
  2.05, 2.08, 2.10, 2.13, 2.15, 2.18, 2.21, 2.23, 2.26, 2.29, 2.32, 2.34,
  2.37, 2.40, 2.43, 2.46, 2.49, 2.52, 2.55, 2.58, 2.61, 2.64, 2.67, 2.71,
  2.74, 2.77, 2.80, 2.84, 2.87, 2.91, 2.94, 2.98, 3.01, 3.05, 3.09, 3.12,
  3.16, 3.20, 3.24, 3.28, 3.32, 3.36, 3.40, 3.44, 3.48, 3.52, 3.57, 3.61,
  3.65, 3.70, 3.74, 3.79, 3.83, 3.88, 3.92, 3.97, 4.02, 4.07, 4.12, 4.17,
  4.22, 4.27, 4.32, 4.37, 4.42, 4.48, 4.53, 4.59, 4.64, 4.70, 4.75, 4.81,
  4.87, 4.93, 4.99, 5.05, 5.11, 5.17, 5.23, 5.30, 5.36, 5.42, 5.49, 5.56,
  5.62, 5.69, 5.76, 5.83, 5.90, 5.97, 6.04, 6.12, 6.19, 6.26, 6.34, 6.42,
  6.49, 6.57, 6.65, 6.73, 6.81, 6.90, 6.98, 7.06, 7.15, 7.23, 7.32, 7.41,
  7.50, 7.59, 7.68, 7.77, 7.87, 7.96, 8.06, 8.16, 8.25, 8.35, 8.45, 8.56,
  8.66, 8.76, 8.87, 8.98, 9.09, 9.20, 9.31, 9.42, 9.53, 9.65, 9.76, 9.88,
];

const TABLES = {
  E3: IEC_60063_E3,
  E6: IEC_60063_E6,
  E12: IEC_60063_E12,
  E24: IEC_60063_E24,
  E48: IEC_60063_E48,
  E96: IEC_60063_E96,
  E192: IEC_60063_E192,
} as const;

/** The geometric value `10^(i/N)` rounded to `digits` significant figures. */
const formula = (i: number, n: number, digits: number) => Number((10 ** (i / n)).toPrecision(digits));

describe('IEC 60063:2015 E-series (reference tables typed into this test)', () => {
  for (const name of E_SERIES_NAMES) {
    it(`${name} matches the standard value for value`, () => {
      expect(TABLES[name]).toHaveLength(Number(name.slice(1)));
      expect([...eSeriesValues(name)]).toEqual(TABLES[name]);
    });
  }

  it('the typed E48, E96, E192 tables follow the three-figure rounding rule, E192 except 9.20 (formula 9.19)', () => {
    for (const [table, n] of [[IEC_60063_E48, 48], [IEC_60063_E96, 96]] as const) {
      table.forEach((value, i) => expect(value).toBe(formula(i, n, 3)));
    }
    const departures = IEC_60063_E192.map((value, i) => [i, value, formula(i, 192, 3)]).filter(([, v, f]) => v !== f);
    expect(departures).toEqual([[185, 9.2, 9.19]]);
  });

  it('E24 and below keep the historic values, not the rounded formula', () => {
    // IEC 60063:2015: 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2 are where E24 departs from 10^(i/24).
    const departures = IEC_60063_E24.map((value, i) => [value, formula(i, 24, 2)]).filter(([v, f]) => v !== f);
    expect(departures).toEqual([[2.7, 2.6], [3.0, 2.9], [3.3, 3.2], [3.6, 3.5], [3.9, 3.8], [4.3, 4.2], [4.7, 4.6], [8.2, 8.3]]);
    expect(eSeriesValues('E12')).toContain(8.2);
    expect(eSeriesValues('E6')).toContain(4.7);
  });

  it('membership in any decade, and none for in-between values', () => {
    expect(isStandardValue(4.7e-12, 'E6')).toBe(true);
    expect(isStandardValue(3.9e-9, 'E12')).toBe(true);
    expect(isStandardValue(3.9e-9, 'E6')).toBe(false);
    expect(isStandardValue(9.2e3, 'E192')).toBe(true);
    expect(isStandardValue(9.19e3, 'E192')).toBe(false);
    expect(isStandardValue(1.02e-10, 'E96')).toBe(true);
    expect(isStandardValue(1.02e-10, 'E48')).toBe(false);
    expect(isStandardValue(0, 'E6')).toBe(false);
    expect(isStandardValue(Number.NaN, 'E6')).toBe(false);
  });

  it('nearest value by log distance, across decade edges', () => {
    // 4.0 lies between 3.3 and 4.7: ln(4.0/3.3) = 0.192, ln(4.7/4.0) = 0.161, so 4.7.
    expect(nearestStandardValue(4.0e-12, 'E6')).toBe(4.7e-12);
    // 3.9 in E6: ln(3.9/3.3) = 0.167, ln(4.7/3.9) = 0.187, so 3.3.
    expect(nearestStandardValue(3.9e-12, 'E6')).toBe(3.3e-12);
    // 9.0 in E6: ln(9/6.8) = 0.280, ln(10/9) = 0.105, so 10.
    expect(nearestStandardValue(9.0e-9, 'E6')).toBe(1.0e-8);
    // 1.04 in E6: ln(1.04/1.0) = 0.039 against ln(1.04/0.68) = 0.425, so 1.0.
    expect(nearestStandardValue(1.04e-6, 'E6')).toBe(1.0e-6);
    expect(nearestStandardValue(9.195, 'E192')).toBe(9.2);
    expect(() => nearestStandardValue(-1, 'E12')).toThrow(/finite value > 0/);
  });

  it('values between two bounds', () => {
    expect(standardValuesBetween(1e-12, 1e-11, 'E6')).toEqual([1e-12, 1.5e-12, 2.2e-12, 3.3e-12, 4.7e-12, 6.8e-12, 1e-11]);
  });
});

describe('IEC 60062 tolerance letters', () => {
  it('B, C, D are absolute (pF); F, G, J, K, M relative', () => {
    // IEC 60062: B ±0.1 pF, C ±0.25 pF, D ±0.5 pF, F ±1 %, G ±2 %, J ±5 %, K ±10 %, M ±20 %.
    const expected = { B: 0.1e-12, C: 0.25e-12, D: 0.5e-12 };
    for (const [letter, delta] of Object.entries(expected)) {
      expect(TOLERANCE_LETTERS[letter as 'B']).toEqual({ mode: 'absolute', deltaSi: delta });
      expect(toleranceDeltaSi(TOLERANCE_LETTERS[letter as 'B'], 4.7e-12)).toBe(delta);
    }
    const percent = { F: 1, G: 2, J: 5, K: 10, M: 20 };
    for (const [letter, p] of Object.entries(percent)) {
      expect(TOLERANCE_LETTERS[letter as 'F']).toEqual({ mode: 'relative', fraction: p / 100 });
    }
    expect(toleranceDeltaSi(TOLERANCE_LETTERS.J, 100e-12)).toBeCloseTo(5e-12, 20);
    expect(Object.keys(TOLERANCE_LETTERS).sort()).toEqual(['B', 'C', 'D', 'F', 'G', 'J', 'K', 'M']);
  });
});
