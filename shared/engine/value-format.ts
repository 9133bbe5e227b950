/**
 * Engineering notation for values leaving the engine (`4.7 pF`, `868 MHz`, `12 - j35 Ω`).
 * Everything written here parses back with value-parse.ts to the same number at the chosen
 * precision (tested as a round trip).
 */
import { type Quantity, UNIT_SYMBOLS } from './value-parse.js';

/** Prefix per engineering exponent, from femto to tera (BIPM SI Brochure, 9th ed., table 7). */
const PREFIX_BY_EXPONENT: ReadonlyMap<number, string> = new Map([
  [-15, 'f'],
  [-12, 'p'],
  [-9, 'n'],
  [-6, 'µ'],
  [-3, 'm'],
  [0, ''],
  [3, 'k'],
  [6, 'M'],
  [9, 'G'],
  [12, 'T'],
]);
const SMALLEST_PREFIX_EXPONENT = -15;
const LARGEST_PREFIX_EXPONENT = 12;
/** Default significant digits: enough for E192 values (3 digits) and a rounding digit. */
export const DEFAULT_SIGNIFICANT_DIGITS = 4;

/** Options of {@link formatValue}. */
export interface FormatValueOptions {
  /** Significant digits, 1 to 17 (default 4); trailing zeros are dropped. */
  significantDigits?: number;
  /** Leave out the unit symbol (`4.7 p`). */
  omitUnit?: boolean;
}

function trimMantissa(text: string): string {
  if (!text.includes('.')) return text;
  return text.replace(/0+$/, '').replace(/\.$/, '');
}

/**
 * Formats an SI value in engineering notation: mantissa in [1, 1000), prefix f..T, unit symbol
 * (`4.7 pF`, `868 MHz`, `50 Ω`). Values outside the prefix range use exponent form (`1e-18 F`).
 * @param valueSi value in F, H, Hz, Ω, V, A or W
 * @returns text that {@link parseValue} reads back to `valueSi` at the chosen precision
 */
export function formatValue(valueSi: number, quantity: Quantity, options: FormatValueOptions = {}): string {
  const digits = Math.min(17, Math.max(1, Math.round(options.significantDigits ?? DEFAULT_SIGNIFICANT_DIGITS)));
  const unit = options.omitUnit ? '' : UNIT_SYMBOLS[quantity];
  const join = (mantissa: string, prefix: string) => (prefix + unit === '' ? mantissa : `${mantissa} ${prefix}${unit}`);
  if (!Number.isFinite(valueSi)) return String(valueSi);
  if (valueSi === 0) return join('0', '');
  // Round once in decimal (toExponential), then move the decimal point by text: no division, so
  // the digits shown are exactly the correctly rounded digits of valueSi.
  const [digitsText, exponentText] = Math.abs(valueSi).toExponential(digits - 1).split('e');
  const exponent = Number(exponentText);
  const engineeringExponent = Math.floor(exponent / 3) * 3;
  const sign = valueSi < 0 ? '-' : '';
  if (engineeringExponent < SMALLEST_PREFIX_EXPONENT || engineeringExponent > LARGEST_PREFIX_EXPONENT) {
    return join(`${sign}${trimMantissa(digitsText)}e${exponent}`, '');
  }
  const allDigits = digitsText.replace('.', '').padEnd(3, '0');
  const integerLength = exponent - engineeringExponent + 1;
  const mantissa = trimMantissa(`${allDigits.slice(0, integerLength)}.${allDigits.slice(integerLength)}`);
  return join(sign + mantissa, PREFIX_BY_EXPONENT.get(engineeringExponent) ?? '');
}

/**
 * Formats an impedance `re + j im` in ohms as `12 - j35 Ω` (the form parseComplex reads back).
 * @param significantDigits per part (default 4)
 */
export function formatImpedance(re: number, im: number, significantDigits = DEFAULT_SIGNIFICANT_DIGITS): string {
  const part = (x: number) => String(Number(x.toPrecision(significantDigits)));
  const real = part(re);
  if (im === 0) return `${real} Ω`;
  return `${real} ${im < 0 ? '-' : '+'} j${part(Math.abs(im))} Ω`;
}
