/**
 * Touchstone writers: a two-port file of a network given by its ABCD matrices over frequency, and a
 * one-port file of an impedance over frequency.
 *
 * The two-port file uses version 1 syntax (`# Hz S RI R 50`, one line per frequency,
 * `f S11 S21 S12 S22`). Why not version 2.0: the file is for the designer's circuit simulator, and
 * every tool that reads `.s2p` files reads version 1, while version 2.0 keywords are still refused
 * by some; a single 50 ohm reference and one line per point are all this file needs, and version
 * 2.0 would add nothing it uses. Version 1 has a fixed two-port order, `N11 N21 N12 N22`
 * (Touchstone File Format Specification Version 2.0, IBIS Open Forum, 2009, "1-port and 2-port
 * Networks"); the header says so in a comment, because it surprises people who expect row order.
 *
 * Numbers are written with 12 significant digits (`toExponential(11)`), enough that a reader gets
 * back each value to a relative 5e-13, well inside the 1e-9 the round-trip tests ask for.
 *
 * Only ASCII may appear in a Touchstone file ("General Syntax Rules and Guidelines", rule 2), so
 * comment lines are transliterated (µ to u, Ω to ohm, ± to +/-, ° to deg, ∠ to "angle") and any
 * other non-ASCII character becomes `?`.
 */
import { complex } from '../engine/complex.js';
import { EngineInputError, quoteValue } from '../engine/engine-input-error.js';
import { encodeDataPair } from './data-pair.js';
import { TWO_PORT_MATRIX_LENGTH, abcdToScattering, createTwoPortMatrix, reflectionFromImpedance } from './network-parameters.js';
import {
  type DataFormat,
  type FrequencyUnit,
  HERTZ_PER_UNIT,
  type NetworkParameter,
  formatOptionLine,
} from './touchstone-option-line.js';

/** Significant digits of every number the writers put in a file. */
export const TOUCHSTONE_SIGNIFICANT_DIGITS = 12;

/** Reference resistance of the two-port file unless the caller asks otherwise, ohm. */
export const DEFAULT_REFERENCE_OHM = 50;

/** Product line at the top of every file written here. */
export const PRODUCT_COMMENT = 'Written by Shelfmatch';

/** Input of {@link writeTwoPortTouchstone}. */
export interface TwoPortWriteInput {
  /** Frequencies in Hz, strictly increasing, >= 0. */
  frequencyHz: ArrayLike<number>;
  /**
   * One ABCD matrix per frequency, each `[Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim]` (A, D
   * dimensionless, B ohm, C siemens), the layout of the engine's ABCD cascade.
   */
  abcd: readonly ArrayLike<number>[];
  /** Comment lines for the header (parts, values, match name); written after `! `, one per line. */
  commentLines?: readonly string[];
  /** Reference resistance of both ports, ohm (default 50). */
  referenceOhm?: number;
}

/** Input of {@link writeOnePortTouchstone}. */
export interface OnePortWriteInput {
  /** Frequencies in Hz, strictly increasing, >= 0. */
  frequencyHz: ArrayLike<number>;
  /** `Re Z` per frequency, ohm. */
  resistanceOhm: ArrayLike<number>;
  /** `Im Z` per frequency, ohm. */
  reactanceOhm: ArrayLike<number>;
  /** Parameter to write (default `S`). */
  parameter?: NetworkParameter;
  /** Pair format (default `RI`). */
  format?: DataFormat;
  /** Reference resistance, ohm (default 50); version 1 Y- and Z-data are normalised to it. */
  referenceOhm?: number;
  /** Frequency unit of the file (default `Hz`). */
  frequencyUnit?: FrequencyUnit;
  /** `'1'` for version 1 syntax (default), `'2.0'` for version 2.0 keywords. */
  version?: '1' | '2.0';
  /** Comment lines for the header. */
  commentLines?: readonly string[];
}

/**
 * One number as the writers put it in a file: 12 significant digits in exponent form,
 * e.g. `6.66666666667e-1`.
 */
export function formatTouchstoneNumber(value: number): string {
  return value.toExponential(TOUCHSTONE_SIGNIFICANT_DIGITS - 1);
}

const ASCII_REPLACEMENTS: ReadonlyArray<[RegExp, string]> = [
  [/[\u00b5\u03bc]/g, 'u'], // micro sign, Greek mu
  [/[\u03a9\u2126]/g, 'ohm'], // Greek omega, ohm sign
  [/\u00b1/g, '+/-'],
  [/\u00b0/g, 'deg'],
  [/\u2220/g, ' angle '],
  [/[\u2013\u2014]/g, '-'], // en and em dash
  [/\u00d7/g, 'x'],
];

/** A header comment as ASCII `! ...` lines (line breaks inside a caller's line start new lines). */
function commentBlock(lines: readonly string[]): string[] {
  const out: string[] = [];
  for (const line of lines) {
    for (const part of String(line).split(/\r\n|\r|\n/)) {
      let text = part;
      for (const [pattern, replacement] of ASCII_REPLACEMENTS) text = text.replace(pattern, replacement);
      // Tabs become spaces; other control characters and non-ASCII become "?".
      text = text.replace(/\t/g, ' ').replace(/[^\x20-\x7e]/g, '?');
      out.push(text.trimEnd() === '' ? '!' : `! ${text.trimEnd()}`);
    }
  }
  return out;
}

function checkReference(referenceOhm: number): void {
  if (!(referenceOhm > 0) || !Number.isFinite(referenceOhm)) {
    throw new EngineInputError('referenceOhm', referenceOhm, `The reference resistance must be a positive number of ohms, e.g. 50; got ${quoteValue(referenceOhm)}.`);
  }
}

function checkFrequencies(frequencyHz: ArrayLike<number>, count: number, what: string): void {
  if (frequencyHz.length === 0) throw new EngineInputError('frequencyHz', frequencyHz, 'A Touchstone file needs at least one frequency.');
  if (count !== frequencyHz.length) {
    throw new EngineInputError(what, count, `${what} has ${count} entries but frequencyHz has ${frequencyHz.length}; give one per frequency.`);
  }
  for (let i = 0; i < frequencyHz.length; i++) {
    const f = frequencyHz[i];
    if (!Number.isFinite(f) || f < 0) {
      throw new EngineInputError(`frequencyHz.${i}`, f, `Frequency ${i} must be a finite number of hertz >= 0; got ${quoteValue(f)}.`);
    }
    if (i > 0 && !(f > frequencyHz[i - 1])) {
      throw new EngineInputError(`frequencyHz.${i}`, f, `Frequencies must increase: frequency ${i} (${f} Hz) is not above frequency ${i - 1} (${frequencyHz[i - 1]} Hz).`);
    }
  }
}

function checkFinite(values: ArrayLike<number>, field: string, what: string): void {
  for (let k = 0; k < values.length; k++) {
    if (!Number.isFinite(values[k])) throw new EngineInputError(field, values[k], `${what} must be finite numbers; entry ${k} is ${quoteValue(values[k])}.`);
  }
}

/**
 * Writes a two-port Touchstone file (version 1 syntax, `# Hz S RI R 50`) of a network given by its
 * ABCD matrix at each frequency. S-parameters at reference Z0 come from
 *
 *     Δ = A + B/Z0 + C Z0 + D,  S11 = (A + B/Z0 - C Z0 - D)/Δ,  S12 = 2(AD - BC)/Δ,
 *     S21 = 2/Δ,                S22 = (-A + B/Z0 - C Z0 + D)/Δ
 *
 * (D. M. Pozar, Microwave Engineering, 4th ed., Table 4.2), and each line is
 * `f ReS11 ImS11 ReS21 ImS21 ReS12 ImS12 ReS22 ImS22` with f in Hz, 12 significant digits.
 * The header is the product line, the caller's lines, then a note of the syntax and data order.
 * Give the file the extension `.s2p`.
 *
 * @throws EngineInputError for empty, non-finite, negative or non-increasing frequencies, a matrix
 *   count that differs from the frequency count, a matrix that is not 8 finite numbers, or a bad
 *   reference
 */
export function writeTwoPortTouchstone(input: TwoPortWriteInput): string {
  const referenceOhm = input.referenceOhm ?? DEFAULT_REFERENCE_OHM;
  checkReference(referenceOhm);
  checkFrequencies(input.frequencyHz, input.abcd.length, 'abcd');
  const lines = commentBlock([PRODUCT_COMMENT, ...(input.commentLines ?? [])]);
  lines.push(
    `! Touchstone version 1 syntax: frequency in Hz, S-parameters as real and imaginary parts, ${String(referenceOhm)} ohm reference at both ports.`,
    '! Data order on each line (the fixed version 1 two-port order): frequency, S11, S21, S12, S22.',
    formatOptionLine('Hz', 'S', 'RI', referenceOhm),
    '! freq ReS11 ImS11 ReS21 ImS21 ReS12 ImS12 ReS22 ImS22',
  );
  const s = createTwoPortMatrix();
  for (let i = 0; i < input.abcd.length; i++) {
    const m = input.abcd[i];
    if (!m || m.length !== TWO_PORT_MATRIX_LENGTH) {
      throw new EngineInputError(`abcd.${i}`, m, `ABCD matrix ${i} must be 8 numbers [Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim].`);
    }
    checkFinite(m, `abcd.${i}`, `ABCD matrix ${i}`);
    abcdToScattering(m, referenceOhm, s);
    checkFinite(s, `abcd.${i}`, `The S-parameters of ABCD matrix ${i}`);
    // Natural order in `s` is 11, 12, 21, 22; the file wants 11, 21, 12, 22.
    const row = [input.frequencyHz[i], s[0], s[1], s[4], s[5], s[2], s[3], s[6], s[7]];
    lines.push(row.map(formatTouchstoneNumber).join(' '));
  }
  return `${lines.join('\n')}\n`;
}

/**
 * Writes a one-port Touchstone file of impedance Z (ohm) over frequency, as S, Y or Z data in RI, MA
 * or DB format, in version 1 or version 2.0 syntax. What is written per point, with R the reference:
 * - S: `S = (Z - R) / (Z + R)` (Pozar 4th ed., eq. 2.35);
 * - Z: version 1 `z = Z / R` (normalised), version 2.0 `Z` in ohm;
 * - Y: version 1 `y = R / Z` (normalised), version 2.0 `Y = 1 / Z` in siemens
 * (normalisation rules: Touchstone File Format Specification Version 2.0, "[Reference]" and
 * "Compatibility Notes"). Pairs per {@link encodeDataPair}; 12 significant digits.
 *
 * @throws EngineInputError for bad frequencies (as the two-port writer), non-finite impedances,
 *   Y-data of Z = 0 (a short has no finite admittance), or DB data of a value with magnitude 0
 */
export function writeOnePortTouchstone(input: OnePortWriteInput): string {
  const parameter = input.parameter ?? 'S';
  const format = input.format ?? 'RI';
  const referenceOhm = input.referenceOhm ?? DEFAULT_REFERENCE_OHM;
  const unit = input.frequencyUnit ?? 'Hz';
  const version = input.version ?? '1';
  checkReference(referenceOhm);
  checkFrequencies(input.frequencyHz, input.resistanceOhm.length, 'resistanceOhm');
  checkFrequencies(input.frequencyHz, input.reactanceOhm.length, 'reactanceOhm');
  checkFinite(input.resistanceOhm, 'resistanceOhm', 'Resistances');
  checkFinite(input.reactanceOhm, 'reactanceOhm', 'Reactances');
  const count = input.frequencyHz.length;
  const lines = commentBlock([PRODUCT_COMMENT, ...(input.commentLines ?? [])]);
  if (version === '2.0') lines.push('[Version] 2.0');
  lines.push(formatOptionLine(unit, parameter, format, referenceOhm));
  if (version === '2.0') lines.push('[Number of Ports] 1', `[Number of Frequencies] ${count}`, '[Network Data]');
  const z = complex();
  const value = complex();
  const normalised = version === '1';
  for (let i = 0; i < count; i++) {
    z.re = input.resistanceOhm[i];
    z.im = input.reactanceOhm[i];
    if (parameter === 'S') {
      reflectionFromImpedance(z, referenceOhm, value);
    } else if (parameter === 'Z') {
      value.re = normalised ? z.re / referenceOhm : z.re;
      value.im = normalised ? z.im / referenceOhm : z.im;
    } else {
      if (z.re === 0 && z.im === 0) {
        throw new EngineInputError(`resistanceOhm.${i}`, 0, `Point ${i} is a short circuit (Z = 0), which has no finite admittance: write it as S or Z data.`);
      }
      // y = R / Z (version 1) or Y = 1 / Z (version 2.0).
      const scale = normalised ? referenceOhm : 1;
      const d = z.re * z.re + z.im * z.im;
      value.re = (scale * z.re) / d;
      value.im = (-scale * z.im) / d;
    }
    if (!Number.isFinite(value.re) || !Number.isFinite(value.im)) {
      throw new EngineInputError(`resistanceOhm.${i}`, z.re, `Point ${i} gives a value out of range (${value.re} + j${value.im}).`);
    }
    if (format === 'DB' && value.re === 0 && value.im === 0) {
      throw new EngineInputError(`resistanceOhm.${i}`, z.re, `Point ${i} has magnitude 0, which has no dB form: write it in RI or MA format.`);
    }
    const [first, second] = encodeDataPair(format, value.re, value.im);
    const frequency = input.frequencyHz[i] / HERTZ_PER_UNIT[unit];
    lines.push([frequency, first, second].map(formatTouchstoneNumber).join(' '));
  }
  if (version === '2.0') lines.push('[End]');
  return `${lines.join('\n')}\n`;
}
