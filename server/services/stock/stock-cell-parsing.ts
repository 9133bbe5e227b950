/**
 * Reads one stock-list cell into what the parts table stores (stock-csv.md, "accepted forms"). Each
 * reader returns the value or throws a {@link CellProblem} whose message quotes the cell and shows an
 * accepted form. Values, tolerances and series names go through the RF engine's readers
 * (shared/engine: value-parse.ts for SI prefixes, units and IEC 60062 codes such as `4p7`;
 * tolerance-codes.ts for IEC 60062 tolerance letters; e-series.ts for IEC 60063), so the stock list
 * and the match form read `4p7` alike.
 */
import { Decimal } from 'decimal.js';
import { parseValue, type Quantity } from '../../../shared/engine/value-parse.js';
import { formatValue } from '../../../shared/engine/value-format.js';
import { isEngineInputError } from '../../../shared/engine/engine-input-error.js';
import { parseTolerance, type Tolerance } from '../../../shared/engine/tolerance-codes.js';
import { toESeriesName, type ESeriesName } from '../../../shared/engine/e-series.js';
import type { PartKind } from '../../../shared/api/stock.js';

/** A cell that cannot be read; the message is one sentence for the person fixing the file. */
export class CellProblem extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CellProblem';
  }
}

/** Most distinct cells remembered per reader before the memory is cleared. */
const MEMO_LIMIT = 20_000;

/**
 * Remembers a pure reader's answer (value or problem) per cell text: stock lists repeat the same
 * value strings thousands of times (`4.7pF`, `J`, `50V`), and reading them is the costly part.
 */
function memoized<T>(read: (cell: string) => T): (cell: string) => T {
  const memory = new Map<string, { value: T } | { problem: string }>();
  return (cell) => {
    let known = memory.get(cell);
    if (!known) {
      try {
        known = { value: read(cell) };
      } catch (error) {
        if (!(error instanceof CellProblem)) throw error;
        known = { problem: error.message };
      }
      if (memory.size >= MEMO_LIMIT) memory.clear();
      memory.set(cell, known);
    }
    if ('problem' in known) throw new CellProblem(known.problem);
    return known.value;
  };
}

/** What each kind's value is. */
export const QUANTITY_OF_KIND: Readonly<Record<PartKind, 'capacitance' | 'inductance'>> = { capacitor: 'capacitance', inductor: 'inductance' };

/**
 * Plausible ranges, in SI units: anything outside is a typing or unit mistake, not a part. The
 * lower ends of ESR and ratings are our judgement from data sheets (from memory, not one source):
 * chip parts have ESRs of milliohms and more and ratings of volts and milliamps, so 10 uOhm,
 * 0.1 V and 0.1 mA leave wide room and still catch a value off by a prefix or two, or 1e-300.
 */
const RANGES = {
  capacitance: { min: 1e-14, max: 0.1 },
  inductance: { min: 1e-11, max: 1 },
  frequency: { min: 1e3, max: 1e12 },
  resistance: { min: 1e-5, max: 1e3 },
  voltage: { min: 0.1, max: 1e5 },
  current: { min: 1e-4, max: 1e3 },
} as const;

/** Largest Q accepted (chip parts reach a few hundred; 1e5 leaves room for any real one). */
const MAX_Q = 1e5;
/** Smallest Q accepted: below 0.1 a part is a resistor, not a reactance (our judgement). */
const MIN_Q = 0.1;
/** Largest quantity on hand accepted (fits a PostgreSQL INTEGER with room). */
const MAX_QUANTITY = 1_000_000_000;
/** DECIMAL(12,4): 8 integer and 4 fraction digits. */
const UNIT_COST_FRACTION_DIGITS = 4;
const UNIT_COST_INTEGER_DIGITS = 8;

const KIND_WORDS: Readonly<Record<string, PartKind>> = {
  capacitor: 'capacitor',
  c: 'capacitor',
  cap: 'capacitor',
  inductor: 'inductor',
  l: 'inductor',
  ind: 'inductor',
};

function quote(cell: string): string {
  return JSON.stringify(cell);
}

/** Reads `capacitor`/`inductor`, `C`/`L`, `cap`/`ind` (any case). */
export function readKind(cell: string): PartKind {
  const kind = KIND_WORDS[cell.trim().toLowerCase()];
  if (!kind) throw new CellProblem(`kind ${quote(cell)} is not a part kind; write capacitor, inductor, C, L, cap or ind`);
  return kind;
}

function engineValue(cell: string, quantity: Quantity, column: string): number {
  try {
    return parseValue(cell, quantity, { field: column, sign: 'any' });
  } catch (error) {
    if (isEngineInputError(error)) throw new CellProblem(error.message);
    throw error;
  }
}

function checkRange(valueSi: number, quantity: keyof typeof RANGES, column: string, cell: string): void {
  const { min, max } = RANGES[quantity];
  if (!(valueSi > 0)) throw new CellProblem(`${column} ${quote(cell)} must be greater than zero`);
  if (valueSi < min) {
    throw new CellProblem(`${column} ${quote(cell)} is below ${formatValue(min, quantity)}, the smallest ${quantity} accepted: check the unit`);
  }
  if (valueSi > max) {
    throw new CellProblem(`${column} ${quote(cell)} is above ${formatValue(max, quantity)}, the largest ${quantity} accepted: check the unit`);
  }
}

/**
 * Reads a nominal value (`4.7pF`, `4.7 p`, `4p7`, `4.7e-12`, `12nH`, `12n`, `1u0`) in F or H; a unit,
 * if given, must fit `kind`.
 */
export function readPartValue(cell: string, kind: PartKind): number {
  return PART_VALUE_READERS[kind](cell);
}

const PART_VALUE_READERS: Readonly<Record<PartKind, (cell: string) => number>> = {
  capacitor: memoized((cell) => readPartValueOnce(cell, 'capacitor')),
  inductor: memoized((cell) => readPartValueOnce(cell, 'inductor')),
};

function readPartValueOnce(cell: string, kind: PartKind): number {
  const quantity = QUANTITY_OF_KIND[kind];
  let valueSi: number;
  try {
    valueSi = engineValue(cell, quantity, 'value');
  } catch (error) {
    const other: PartKind = kind === 'capacitor' ? 'inductor' : 'capacitor';
    if (error instanceof CellProblem && readsAs(cell, QUANTITY_OF_KIND[other])) {
      throw new CellProblem(`value ${quote(cell)} is ${other === 'inductor' ? 'an inductance (H)' : 'a capacitance (F)'}, but the row's kind is ${kind}: fix the kind or the unit`);
    }
    throw error;
  }
  checkRange(valueSi, quantity, 'value', cell);
  return valueSi;
}

function readsAs(cell: string, quantity: Quantity): boolean {
  try {
    parseValue(cell, quantity, { sign: 'any' });
    return true;
  } catch {
    return false;
  }
}

/**
 * Reads a tolerance with the engine's IEC 60062 reader (`5%`, `±5 %`, a letter such as J or C,
 * `0.1pF`, `±0.25 pF`, `0.2nH`; B, C and D mean ±0.1/0.25/0.5 pF and fit capacitors only), then
 * checks what a stock list needs beyond the form: more than zero, and an absolute tolerance smaller
 * than the nominal value.
 * @returns relative as a fraction (5 % -> 0.05), absolute in F or H
 */
export function readTolerance(cell: string, kind: PartKind, valueSi: number): Tolerance {
  const tolerance = TOLERANCE_READERS[kind](cell);
  const amount = tolerance.mode === 'relative' ? tolerance.fraction : tolerance.deltaSi;
  if (!(amount > 0)) throw new CellProblem(`tolerance ${quote(cell)} must be greater than zero`);
  if (tolerance.mode === 'absolute' && !(tolerance.deltaSi < valueSi)) {
    const quantity = QUANTITY_OF_KIND[kind];
    throw new CellProblem(`tolerance ${quote(cell)} (±${formatValue(tolerance.deltaSi, quantity)}) is not smaller than the value ${formatValue(valueSi, quantity)}`);
  }
  return tolerance;
}

/** The form of a tolerance cell, read once per distinct text and kind. */
const TOLERANCE_READERS: Readonly<Record<PartKind, (cell: string) => Tolerance>> = {
  capacitor: memoized((cell) => readToleranceForm(cell, 'capacitor')),
  inductor: memoized((cell) => readToleranceForm(cell, 'inductor')),
};

function readToleranceForm(cell: string, kind: PartKind): Tolerance {
  if (/^\s*-/.test(cell)) throw new CellProblem(`tolerance ${quote(cell)} is negative; tolerances are symmetric: write it like ±5 % or ±0.1pF`);
  try {
    return parseTolerance(cell, kind, 'tolerance');
  } catch (error) {
    if (!isEngineInputError(error)) throw error;
    const other: PartKind = kind === 'capacitor' ? 'inductor' : 'capacitor';
    const amount = cell.trim().replace(/^(±|\+\/-|\+-)\s*/, '');
    if (/[a-zA-Zµμ]{2,}/.test(amount) && readsAs(amount, QUANTITY_OF_KIND[other])) {
      throw new CellProblem(`tolerance ${quote(cell)} is ${other === 'inductor' ? 'an inductance (H)' : 'a capacitance (F)'}, but the row's kind is ${kind}: write it like ${kind === 'capacitor' ? '±0.1pF' : '±0.2nH'} or 5%`);
    }
    throw new CellProblem(error.message);
  }
}

/** Reads a frequency (`6GHz`, `6.2 G`, `6.2e9`, `100MHz`) in Hz, for `srf` and `q_freq`. */
export function readFrequency(cell: string, column: 'srf' | 'q_freq'): number {
  return FREQUENCY_READERS[column](cell);
}

const FREQUENCY_READERS = {
  srf: memoized((cell) => readFrequencyOnce(cell, 'srf')),
  q_freq: memoized((cell) => readFrequencyOnce(cell, 'q_freq')),
} as const;

function readFrequencyOnce(cell: string, column: 'srf' | 'q_freq'): number {
  const valueSi = engineValue(cell, 'frequency', column);
  checkRange(valueSi, 'frequency', column, cell);
  return valueSi;
}

/** Reads a quality factor: a plain number > 0. */
export function readQ(cell: string): number {
  const text = cell.trim();
  if (!/^(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text)) {
    throw new CellProblem(`q ${quote(cell)} is not a number; write the quality factor as a plain number like 40 or 55.5`);
  }
  const q = Number(text);
  if (!(q > 0)) throw new CellProblem(`q ${quote(cell)} must be greater than zero; leave it blank when unknown`);
  if (q > MAX_Q) throw new CellProblem(`q ${quote(cell)} is above ${MAX_Q}, more than any real part`);
  if (q < MIN_Q) throw new CellProblem(`q ${quote(cell)} is below ${MIN_Q}: such a part is a resistor, not a capacitor or inductor; check the number`);
  return q;
}

/** Reads a series loss resistance (`0.3`, `0.3ohm`, `300m`) in ohms. */
export const readEsr: (cell: string) => number = memoized(readEsrOnce);

function readEsrOnce(cell: string): number {
  const valueSi = engineValue(cell, 'resistance', 'esr');
  if (!(valueSi > 0)) throw new CellProblem(`esr ${quote(cell)} must be greater than zero; leave it blank when unknown`);
  checkRange(valueSi, 'resistance', 'esr', cell);
  return valueSi;
}

/** Reads a rating: `50V` (capacitors) or `300mA` (inductors). */
export function readRating(cell: string, column: 'voltage_rating' | 'current_rating'): number {
  return RATING_READERS[column](cell);
}

const RATING_READERS = {
  voltage_rating: memoized((cell) => readRatingOnce(cell, 'voltage_rating')),
  current_rating: memoized((cell) => readRatingOnce(cell, 'current_rating')),
} as const;

function readRatingOnce(cell: string, column: 'voltage_rating' | 'current_rating'): number {
  const quantity = column === 'voltage_rating' ? 'voltage' : 'current';
  const valueSi = engineValue(cell, quantity, column);
  checkRange(valueSi, quantity, column, cell);
  return valueSi;
}

/** Reads a quantity on hand: a whole number >= 0, digits only. */
export function readQuantity(cell: string): number {
  const text = cell.trim();
  if (/^\d{1,3}([,.' ]\d{3})+$/.test(text)) {
    throw new CellProblem(`quantity ${quote(cell)} has a thousands separator; write digits only, like 4000`);
  }
  if (/^-\d+$/.test(text)) throw new CellProblem(`quantity ${quote(cell)} is negative; the quantity on hand is 0 or more`);
  if (!/^\d+$/.test(text)) throw new CellProblem(`quantity ${quote(cell)} is not a whole number; write it like 0, 25 or 4000`);
  const quantity = Number(text);
  if (quantity > MAX_QUANTITY) throw new CellProblem(`quantity ${quote(cell)} is above ${MAX_QUANTITY.toLocaleString('en')}, the largest accepted`);
  return quantity;
}

/** Reads an E-series name (`E6` ... `E192`, any case). */
export function readSeries(cell: string): ESeriesName {
  const series = toESeriesName(cell);
  if (!series) throw new CellProblem(`series ${quote(cell)} is not an IEC 60063 series; write E3, E6, E12, E24, E48, E96 or E192`);
  return series;
}

/**
 * Reads a unit cost: a decimal >= 0 with at most 4 decimal places and 8 integer digits, point as the
 * decimal mark (DECIMAL(12,4), exact with decimal.js).
 * @returns the canonical decimal string (`"0.0120"` -> `"0.012"`)
 */
export const readUnitCost: (cell: string) => string = memoized(readUnitCostOnce);

function readUnitCostOnce(cell: string): string {
  const text = cell.trim();
  if (/^\d+,\d+$/.test(text)) throw new CellProblem(`unit_cost ${quote(cell)} uses a comma; use a point as the decimal mark, like 0.012`);
  if (/^-/.test(text)) throw new CellProblem(`unit_cost ${quote(cell)} is negative; a unit cost is 0 or more`);
  const match = /^(\d+)(?:\.(\d*))?$|^\.(\d+)$/.exec(text);
  if (!match) throw new CellProblem(`unit_cost ${quote(cell)} is not a decimal number; write it like 0.012 or 1.25 (no currency sign)`);
  const integerDigits = (match[1] ?? '0').replace(/^0+(?=\d)/, '');
  const fraction = match[2] ?? match[3] ?? '';
  if (fraction.replace(/0+$/, '').length > UNIT_COST_FRACTION_DIGITS) {
    throw new CellProblem(`unit_cost ${quote(cell)} has more than ${UNIT_COST_FRACTION_DIGITS} decimal places`);
  }
  if (integerDigits.length > UNIT_COST_INTEGER_DIGITS) throw new CellProblem(`unit_cost ${quote(cell)} is too large (at most 99999999.9999)`);
  return new Decimal(text.startsWith('.') ? `0${text}` : text).toFixed();
}

/**
 * Reads a text cell: trimmed, at most `maxLength` characters, no control characters (a line break
 * is allowed in `description` only).
 */
export function readText(cell: string, column: string, maxLength: number): string {
  const text = cell.trim();
  // UTF-16 length bounds the character count from above, so most cells skip the exact count.
  if (text.length > maxLength && [...text].length > maxLength) throw new CellProblem(`${column} is ${[...text].length} characters long; at most ${maxLength} are allowed`);
  const control = column === 'description' ? /[\u0000-\u0009\u000b-\u001f\u007f]/ : /[\u0000-\u001f\u007f]/;
  if (control.test(text)) throw new CellProblem(`${column} ${quote(cell)} contains a control character${column === 'description' ? '' : ' or a line break'}`);
  return text;
}
