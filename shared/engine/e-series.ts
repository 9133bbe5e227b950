/**
 * IEC 60063:2015 preferred number series E3 to E192, as the standard tabulates them: E24 and below
 * keep their historic values (2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2, ...), which are not what the
 * geometric formula `10^(i/N)` rounds to, and E192 has 9.20 where the formula gives 9.19.
 * Used for buy-to values in shortfall lists and for the stock list's `series` column.
 */

/** Names of the series, coarsest first. */
export type ESeriesName = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

/** Every series name, coarsest first. */
export const E_SERIES_NAMES: readonly ESeriesName[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

function values(text: string): readonly number[] {
  return Object.freeze(text.trim().split(/\s+/).map(Number));
}

const E24_AND_BELOW = {
  E3: values('1.0 2.2 4.7'),
  E6: values('1.0 1.5 2.2 3.3 4.7 6.8'),
  E12: values('1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2'),
  E24: values('1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1'),
};

const E192 = values(`
  1.00 1.01 1.02 1.04 1.05 1.06 1.07 1.09 1.10 1.11 1.13 1.14 1.15 1.17 1.18 1.20
  1.21 1.23 1.24 1.26 1.27 1.29 1.30 1.32 1.33 1.35 1.37 1.38 1.40 1.42 1.43 1.45
  1.47 1.49 1.50 1.52 1.54 1.56 1.58 1.60 1.62 1.64 1.65 1.67 1.69 1.72 1.74 1.76
  1.78 1.80 1.82 1.84 1.87 1.89 1.91 1.93 1.96 1.98 2.00 2.03 2.05 2.08 2.10 2.13
  2.15 2.18 2.21 2.23 2.26 2.29 2.32 2.34 2.37 2.40 2.43 2.46 2.49 2.52 2.55 2.58
  2.61 2.64 2.67 2.71 2.74 2.77 2.80 2.84 2.87 2.91 2.94 2.98 3.01 3.05 3.09 3.12
  3.16 3.20 3.24 3.28 3.32 3.36 3.40 3.44 3.48 3.52 3.57 3.61 3.65 3.70 3.74 3.79
  3.83 3.88 3.92 3.97 4.02 4.07 4.12 4.17 4.22 4.27 4.32 4.37 4.42 4.48 4.53 4.59
  4.64 4.70 4.75 4.81 4.87 4.93 4.99 5.05 5.11 5.17 5.23 5.30 5.36 5.42 5.49 5.56
  5.62 5.69 5.76 5.83 5.90 5.97 6.04 6.12 6.19 6.26 6.34 6.42 6.49 6.57 6.65 6.73
  6.81 6.90 6.98 7.06 7.15 7.23 7.32 7.41 7.50 7.59 7.68 7.77 7.87 7.96 8.06 8.16
  8.25 8.35 8.45 8.56 8.66 8.76 8.87 8.98 9.09 9.20 9.31 9.42 9.53 9.65 9.76 9.88
`);

/** E96 and E48 are every second and every fourth E192 value (IEC 60063: the series nest). */
const E96 = Object.freeze(E192.filter((_, i) => i % 2 === 0));
const E48 = Object.freeze(E192.filter((_, i) => i % 4 === 0));

const TABLES: Readonly<Record<ESeriesName, readonly number[]>> = { ...E24_AND_BELOW, E48, E96, E192 };

/** Tolerance each series is associated with (IEC 60063 introduction), as a fraction. */
export const E_SERIES_TOLERANCE: Readonly<Record<ESeriesName, number>> = {
  E3: 0.4,
  E6: 0.2,
  E12: 0.1,
  E24: 0.05,
  E48: 0.02,
  E96: 0.01,
  E192: 0.005,
};

/** Relative tolerance of {@link isStandardValue}: far below any E192 step (about 1.2 %). */
export const MEMBERSHIP_RELATIVE_TOLERANCE = 1e-6;

/** The values of one decade (1 <= v < 10) of a series, ascending, as IEC 60063:2015 lists them. */
export function eSeriesValues(name: ESeriesName): readonly number[] {
  const table = TABLES[name];
  if (!table) throw new Error(`Unknown E-series ${JSON.stringify(name)}; use one of ${E_SERIES_NAMES.join(', ')}`);
  return table;
}

/** Whether `text` names a series (`E6` ... `E192`, case-insensitive): the series or null. */
export function toESeriesName(text: string): ESeriesName | null {
  const upper = text.trim().toUpperCase();
  return (E_SERIES_NAMES as readonly string[]).includes(upper) ? (upper as ESeriesName) : null;
}

/** Splits `v > 0` into `mantissa * 10^exponent` with 1 <= mantissa < 10, robust to log10 rounding. */
function decade(valueSi: number): { mantissa: number; exponent: number } {
  let exponent = Math.floor(Math.log10(valueSi));
  let mantissa = valueSi / 10 ** exponent;
  if (mantissa >= 10) {
    exponent += 1;
    mantissa = valueSi / 10 ** exponent;
  } else if (mantissa < 1) {
    exponent -= 1;
    mantissa = valueSi / 10 ** exponent;
  }
  return { mantissa, exponent };
}

/**
 * Whether `valueSi` is a value of the series in any decade (e.g. 4.7e-12 is in E6), within a
 * relative {@link MEMBERSHIP_RELATIVE_TOLERANCE}. Source: IEC 60063:2015 tables.
 */
export function isStandardValue(valueSi: number, name: ESeriesName, relativeTolerance = MEMBERSHIP_RELATIVE_TOLERANCE): boolean {
  if (!(valueSi > 0) || !Number.isFinite(valueSi)) return false;
  const nearest = nearestStandardValue(valueSi, name);
  return Math.abs(nearest / valueSi - 1) <= relativeTolerance;
}

/**
 * The series value nearest to `valueSi` by log distance `|ln(v / s)|` (so 3.9 between 3.3 and 4.7
 * goes to 3.3 in E6, because 3.9/3.3 < 4.7/3.9), searching the neighbouring decades too
 * (9.7 in E6 gives 10). Source: IEC 60063:2015 tables; log distance because the series is
 * geometric.
 * @param valueSi a value > 0 in any unit (F, H, Ω)
 */
export function nearestStandardValue(valueSi: number, name: ESeriesName): number {
  if (!(valueSi > 0) || !Number.isFinite(valueSi)) {
    throw new RangeError(`nearestStandardValue needs a finite value > 0, got ${valueSi}`);
  }
  const table = eSeriesValues(name);
  const { mantissa, exponent } = decade(valueSi);
  let best = table[0];
  let bestScale = exponent;
  let bestDistance = Infinity;
  // Candidates: this decade, plus 1.0 of the next decade (10) and the top value of the one below.
  for (const candidate of [...table, table[0] * 10, table[table.length - 1] / 10]) {
    const distance = Math.abs(Math.log(mantissa / candidate));
    if (distance < bestDistance) {
      bestDistance = distance;
      best = candidate;
      bestScale = exponent;
    }
  }
  // Rebuild as a decimal string so 4.7 * 1e-12 is exactly the double the parser gives for "4.7p".
  return Number(`${Number(best.toPrecision(3))}e${bestScale}`);
}

/**
 * Every value of the series from `lowSi` to `highSi` inclusive, ascending (e.g. E12 from 1 pF to
 * 100 pF). Source: IEC 60063:2015 tables.
 */
export function standardValuesBetween(lowSi: number, highSi: number, name: ESeriesName): number[] {
  if (!(lowSi > 0) || !(highSi >= lowSi) || !Number.isFinite(highSi)) {
    throw new RangeError(`standardValuesBetween needs 0 < low <= high, got ${lowSi} and ${highSi}`);
  }
  const table = eSeriesValues(name);
  const result: number[] = [];
  const first = decade(lowSi).exponent - 1;
  const last = decade(highSi).exponent;
  for (let exponent = first; exponent <= last; exponent++) {
    for (const mantissa of table) {
      const value = Number(`${mantissa}e${exponent}`);
      if (value >= lowSi * (1 - MEMBERSHIP_RELATIVE_TOLERANCE) && value <= highSi * (1 + MEMBERSHIP_RELATIVE_TOLERANCE)) {
        result.push(value);
      }
    }
  }
  return result;
}
