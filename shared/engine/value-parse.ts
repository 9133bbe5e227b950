/**
 * Value strings at the edge of the engine (handbook rf-engine.md, "Inputs"): SI prefixes
 * f p n u µ m k M G T with an optional unit that must fit the quantity, the IEC 60062 letter-and-digit
 * code (`4p7`, `2n2`, `1u0`, `4k7`, and for resistance `1R5`, `R47`, `50R`), and exponent forms
 * (`4.7e-12`). Complex impedances: `12-j35`, `12 - 35j`, `12-35i`, `50`, and polar `50∠-30°`.
 *
 * Numbers are rebuilt as one decimal string and read by `Number()`, so `4p7` and `4.7e-12` give the
 * same double (correctly rounded, no `4.7 * 1e-12` rounding step).
 */
import { type Complex, fromPolar } from './complex.js';
import { EngineInputError, quoteValue } from './engine-input-error.js';

/** Physical quantities the parser knows, each with its own unit. */
export type Quantity = 'capacitance' | 'inductance' | 'frequency' | 'resistance' | 'voltage' | 'current' | 'power';

/** Which signs a parsed value may have. */
export type SignRule = 'positive' | 'non-negative' | 'any';

/** Options of {@link parseValue}. */
export interface ParseValueOptions {
  /** Field name used in error messages and `EngineInputError.field` (default: the quantity). */
  field?: string;
  /** Allowed sign (default `positive`). */
  sign?: SignRule;
  /** Smallest accepted value in SI units (inclusive). */
  minSi?: number;
  /** Largest accepted value in SI units (inclusive). */
  maxSi?: number;
}

/** SI prefix letters and their decimal exponents (BIPM SI Brochure, 9th ed., table 7). */
export const SI_PREFIX_EXPONENTS: Readonly<Record<string, number>> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  'µ': -6, // U+00B5 micro sign
  'μ': -6, // U+03BC Greek small mu
  m: -3,
  k: 3,
  K: 3, // common in resistor codes (4K7)
  M: 6,
  G: 9,
  T: 12,
};

/** Unit symbol per quantity, as the formatter writes it. */
export const UNIT_SYMBOLS: Readonly<Record<Quantity, string>> = {
  capacitance: 'F',
  inductance: 'H',
  frequency: 'Hz',
  resistance: 'Ω',
  voltage: 'V',
  current: 'A',
  power: 'W',
};

/** Accepted forms shown in error messages. */
const EXAMPLES: Readonly<Record<Quantity, string>> = {
  capacitance: '"4.7pF", "4.7 p", "4p7" or "4.7e-12"',
  inductance: '"12nH", "12n", "2n2" or "1.2e-8"',
  frequency: '"868MHz", "2.45 GHz" or "8.68e8"',
  resistance: '"50", "0.3ohm", "300m", "1R5", "R47" or "4k7"',
  voltage: '"50V", "6.3 V" or "50"',
  current: '"300mA", "0.3 A" or "0.3"',
  power: '"100mW", "2 W" or "0.1"',
};

const COMPLEX_EXAMPLE = '"12-j35", "12 - 35j", "12-35i", "50" or "50∠-30°"';

const NUMBER = String.raw`(\d+\.?\d*|\.\d+)(?:[eE]([+-]?\d+))?`;
const GENERAL_FORM = new RegExp(String.raw`^([+-]?)${NUMBER}\s*(.*)$`);
/** IEC 60062 code: digits, a prefix letter (or R) as decimal marker, digits, optional unit. */
const CODE_FORM = /^(\d*)([fpnuµμmkKMGTR])(\d*)(.*)$/;

/** Reads a unit suffix (no prefix); `afterPrefix` allows lower-case `f` for farad (`pf`). */
function unitQuantity(unit: string, afterPrefix: boolean): Quantity | null {
  if (unit === 'F' || (afterPrefix && unit === 'f')) return 'capacitance';
  if (unit === 'H' || unit === 'h') return 'inductance';
  if (/^hz$/i.test(unit)) return 'frequency';
  if (/^(ohms?|Ω|Ω)$/i.test(unit)) return 'resistance';
  if (unit === 'V' || unit === 'v') return 'voltage';
  if (unit === 'A' || unit === 'a') return 'current';
  if (unit === 'W' || unit === 'w') return 'power';
  return null;
}

interface Suffix {
  exponent: number;
  unit: Quantity | null;
}

/** Splits `pF`, `MHz`, `k`, `ohm`, `` into prefix exponent and unit; null when it is neither. */
function readSuffix(suffix: string): Suffix | null {
  if (suffix === '') return { exponent: 0, unit: null };
  const whole = unitQuantity(suffix, false);
  if (whole !== null) return { exponent: 0, unit: whole };
  const first = suffix[0];
  const exponent = SI_PREFIX_EXPONENTS[first];
  if (exponent === undefined) return null;
  const rest = suffix.slice(1);
  if (rest === '') return { exponent, unit: null };
  const unit = unitQuantity(rest, true);
  return unit === null ? null : { exponent, unit };
}

/** The quantity with its article, for messages ("an inductance"). */
function describe(quantity: Quantity): string {
  return /^[aeiou]/.test(quantity) ? `an ${quantity}` : `a ${quantity}`;
}

function fail(field: string, value: unknown, quantity: Quantity, reason: string): never {
  throw new EngineInputError(
    field,
    value,
    `${field}: ${quoteValue(value)} ${reason}; write it like ${EXAMPLES[quantity]}`,
  );
}

/** Builds `±digits.digits e exponent` and lets `Number()` round it once. */
function decimal(sign: string, integerDigits: string, fractionDigits: string, exponent: number): number {
  const mantissa = `${integerDigits === '' ? '0' : integerDigits}.${fractionDigits === '' ? '0' : fractionDigits}`;
  return Number(`${sign === '-' ? '-' : ''}${mantissa}e${exponent}`);
}

function normalizeSpaces(text: string): string {
  return text.replace(/[\u00a0\u2009\u202f]/g, ' ').replace(/\u2212/g, '-').trim();
}

/**
 * Parses a value string (or a JSON number) into SI base units.
 * Forms: `4.7pF`, `4.7 p`, `4p7`, `4.7e-12`, `868MHz`, `300mA`, `1R5` (resistance only).
 * Sources: SI prefixes from the BIPM SI Brochure (9th ed.); letter-and-digit codes from IEC 60062.
 * `R` is a decimal marker for resistance only: for capacitors and inductors manufacturers use it
 * with different implied units (pF, µH), so there it is refused rather than guessed.
 * @param input the string or number as given
 * @param quantity the quantity the field holds; a unit, if given, must fit it
 * @returns the value in F, H, Hz, Ω, V, A or W
 * @throws EngineInputError quoting the input and showing accepted forms
 */
export function parseValue(input: unknown, quantity: Quantity, options: ParseValueOptions = {}): number {
  const field = options.field ?? quantity;
  let value: number;
  if (typeof input === 'number') {
    value = input;
    if (!Number.isFinite(value)) fail(field, input, quantity, 'is not a finite number');
  } else if (typeof input === 'string') {
    value = parseValueString(input, quantity, field);
  } else {
    fail(field, input, quantity, `is not ${describe(quantity)} (expected a number or a string)`);
  }
  checkRange(value, quantity, field, input, options);
  return value;
}

function parseValueString(input: string, quantity: Quantity, field: string): number {
  const text = normalizeSpaces(input);
  if (text === '') fail(field, input, quantity, 'is empty');
  if (/^[+-]?\d+,\d+/.test(text)) fail(field, input, quantity, 'uses a comma; use a point as the decimal mark');

  const code = CODE_FORM.exec(text);
  if (code && (code[1] !== '' || code[3] !== '') && !(code[2] !== 'R' && code[3] === '')) {
    // A letter between (or before) digits: IEC 60062 code such as 4p7, 1u0, R47, 1R5, p68, 50R.
    return parseCode(code, quantity, field, input);
  }

  const general = GENERAL_FORM.exec(text);
  if (!general) fail(field, input, quantity, `is not ${describe(quantity)}`);
  const [, sign, mantissa, exponentText, suffixText] = general;
  const suffix = readSuffix(suffixText.trim());
  if (suffix === null) fail(field, input, quantity, `has an unknown prefix or unit ${quoteValue(suffixText.trim())}`);
  checkUnit(suffix, suffixText.trim(), quantity, field, input);
  const [integerDigits, fractionDigits = ''] = mantissa.split('.');
  const exponent = (exponentText === undefined ? 0 : Number(exponentText)) + suffix.exponent;
  const value = decimal(sign, integerDigits, fractionDigits, exponent);
  if (!Number.isFinite(value)) fail(field, input, quantity, 'is too large to be a number');
  return value;
}

function parseCode(code: RegExpExecArray, quantity: Quantity, field: string, input: string): number {
  const [, integerDigits, letter, fractionDigits, unitText] = code;
  if (letter === 'R' && quantity !== 'resistance') {
    fail(field, input, quantity, `uses the resistor code letter R, which does not say ${describe(quantity)} unit`);
  }
  const exponent = letter === 'R' ? 0 : SI_PREFIX_EXPONENTS[letter];
  const unit = unitText.trim() === '' ? null : unitQuantity(unitText.trim(), true);
  if (unitText.trim() !== '' && unit === null) fail(field, input, quantity, `has an unknown unit ${quoteValue(unitText.trim())}`);
  checkUnit({ exponent, unit }, `${letter}${unitText.trim()}`, quantity, field, input);
  return decimal('+', integerDigits, fractionDigits, exponent);
}

function checkUnit(suffix: Suffix, suffixText: string, quantity: Quantity, field: string, input: string): void {
  if (suffix.unit !== null && suffix.unit !== quantity) {
    fail(field, input, quantity, `is ${describe(suffix.unit)}, not ${describe(quantity)}`);
  }
  if (quantity === 'frequency' && suffixText.startsWith('m') && /^mhz$/.test(suffixText)) {
    fail(field, input, quantity, 'is ambiguous: "mhz" reads as millihertz; write "MHz" for megahertz or "mHz" for millihertz');
  }
}

function checkRange(value: number, quantity: Quantity, field: string, input: unknown, options: ParseValueOptions): void {
  const sign = options.sign ?? 'positive';
  if (sign === 'positive' && !(value > 0)) fail(field, input, quantity, 'must be greater than zero');
  if (sign === 'non-negative' && !(value >= 0)) fail(field, input, quantity, 'must not be negative');
  if (options.minSi !== undefined && value < options.minSi) {
    fail(field, input, quantity, `is below the smallest accepted ${quantity} (${options.minSi} ${UNIT_SYMBOLS[quantity]})`);
  }
  if (options.maxSi !== undefined && value > options.maxSi) {
    fail(field, input, quantity, `is above the largest accepted ${quantity} (${options.maxSi} ${UNIT_SYMBOLS[quantity]})`);
  }
}

const COMPLEX_TERM = /([+-]?)(?:([ij])(\d+\.?\d*|\.\d+)((?:[eE][+-]?\d+)?)|(\d+\.?\d*|\.\d+)((?:[eE][+-]?\d+)?)([ij]?))/y;

function failComplex(field: string, input: unknown, reason: string): never {
  throw new EngineInputError(field, input, `${field}: ${quoteValue(input)} ${reason}; write it like ${COMPLEX_EXAMPLE}`);
}

/**
 * Parses a complex impedance in ohms: `12-j35`, `12 - j35`, `12 - 35j`, `12-35i`, `j35`, `50`,
 * polar `50∠-30°` (`deg` or `rad` also accepted, degrees by default), an optional trailing `ohm`/`Ω`,
 * a JSON number (real) or `{re, im}`.
 * @returns `{re, im}` in ohms (finite; signs are not checked here: a port's `R > 0` is checked by
 *   the solver that needs it)
 * @throws EngineInputError quoting the input and showing accepted forms
 */
export function parseComplex(input: unknown, field = 'impedance'): Complex {
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) failComplex(field, input, 'is not a finite number');
    return { re: input, im: 0 };
  }
  if (typeof input === 'object' && input !== null && 're' in input) {
    const { re, im = 0 } = input as { re: unknown; im?: unknown };
    if (typeof re !== 'number' || typeof im !== 'number' || !Number.isFinite(re) || !Number.isFinite(im)) {
      failComplex(field, input, 'needs finite numbers in re and im');
    }
    return { re, im };
  }
  if (typeof input !== 'string') failComplex(field, input, 'is not an impedance (expected a string, a number or {re, im})');
  let text = normalizeSpaces(input).replace(/\s+/g, '');
  if (text === '') failComplex(field, input, 'is empty');
  text = text.replace(/(ohms?|Ω|Ω)$/i, '');
  const result = text.includes('∠') ? parsePolar(text, field, input) : parseRectangular(text, field, input);
  if (!Number.isFinite(result.re) || !Number.isFinite(result.im)) failComplex(field, input, 'is too large to be a number');
  return result;
}

function parsePolar(text: string, field: string, input: string): Complex {
  const match = /^(\d+\.?\d*|\.\d+)((?:[eE][+-]?\d+)?)∠([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(°|deg|rad)?$/.exec(text);
  if (!match) failComplex(field, input, 'is not a polar impedance');
  const magnitude = Number(match[1] + match[2]);
  const angle = Number(match[3]);
  const angleRad = match[4] === 'rad' ? angle : (angle * Math.PI) / 180;
  return fromPolar(magnitude, angleRad, { re: 0, im: 0 });
}

function parseRectangular(text: string, field: string, input: string): Complex {
  let re: number | null = null;
  let im: number | null = null;
  let position = 0;
  while (position < text.length) {
    COMPLEX_TERM.lastIndex = position;
    const term = COMPLEX_TERM.exec(text);
    if (!term || term[0] === '' || (position > 0 && term[1] === '')) {
      failComplex(field, input, `is not an impedance (cannot read ${quoteValue(text.slice(position))})`);
    }
    const sign = term[1] === '-' ? -1 : 1;
    const imaginary = term[2] !== undefined || (term[7] !== undefined && term[7] !== '');
    const magnitude = term[2] !== undefined ? Number(term[3] + term[4]) : Number(term[5] + term[6]);
    if (imaginary) {
      if (im !== null) failComplex(field, input, 'has two imaginary parts');
      im = sign * magnitude;
    } else {
      if (re !== null) failComplex(field, input, 'has two real parts');
      re = sign * magnitude;
    }
    position = COMPLEX_TERM.lastIndex;
  }
  return { re: re ?? 0, im: im ?? 0 };
}
