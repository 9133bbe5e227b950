/**
 * The Touchstone option line, `# <frequency unit> <parameter> <format> R <ohms>` (Touchstone File
 * Format Specification Version 2.0, IBIS Open Forum, 2009, section "Option Line"; the same line
 * as version 1.0). Every field is optional and has a default (GHz, S, MA, R 50); the fields may come
 * in any order, the value follows `R` directly, and the whole file is case-insensitive (section
 * "General Syntax Rules and Guidelines", rule 1).
 *
 * Version 1.1 (defined in the Version 2.1 specification, 2024) lets `R` carry one value per port;
 * we accept that as long as there are no more values than ports.
 */
import { TouchstoneError } from './touchstone-error.js';

/** Frequency units of the option line (the specification defines exactly these four). */
export type FrequencyUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';

/** Network parameters this module reads and writes (H and G exist for 2-ports but are not read here). */
export type NetworkParameter = 'S' | 'Y' | 'Z';

/**
 * How each complex value is written as a pair: `RI` real and imaginary; `MA` magnitude and angle in
 * degrees; `DB` `20 log10(magnitude)` and angle in degrees (section "Option Line").
 */
export type DataFormat = 'RI' | 'MA' | 'DB';

/** Hertz per frequency unit. */
export const HERTZ_PER_UNIT: Readonly<Record<FrequencyUnit, number>> = {
  Hz: 1,
  kHz: 1e3,
  MHz: 1e6,
  GHz: 1e9,
};

/** Option-line defaults when a field is left out (section "Option Line"). */
export const OPTION_LINE_DEFAULTS = {
  frequencyUnit: 'GHz' as FrequencyUnit,
  parameter: 'S' as NetworkParameter,
  format: 'MA' as DataFormat,
  referenceOhm: 50,
} as const;

/** What an option line says, with defaults filled in. */
export interface OptionLine {
  frequencyUnit: FrequencyUnit;
  parameter: NetworkParameter;
  format: DataFormat;
  /** Reference resistance per port in ohms as written after `R` (empty when `R` is absent). */
  referenceOhm: number[];
}

const UNITS_BY_TOKEN: Readonly<Record<string, FrequencyUnit>> = { HZ: 'Hz', KHZ: 'kHz', MHZ: 'MHz', GHZ: 'GHz' };
const PARAMETERS_BY_TOKEN: Readonly<Record<string, NetworkParameter>> = { S: 'S', Y: 'Y', Z: 'Z' };
const FORMATS_BY_TOKEN: Readonly<Record<string, DataFormat>> = { RI: 'RI', MA: 'MA', DB: 'DB' };

/** A decimal number as the specification writes them: sign, digits, optional point and exponent. */
const NUMBER_PATTERN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Reads one number token of a Touchstone file, or `undefined` when the token is not a number.
 * `Number()` alone would also take `0x1f`, `Infinity` and the empty string, which the file format
 * does not allow.
 */
export function parseTouchstoneNumber(token: string): number | undefined {
  return NUMBER_PATTERN.test(token) ? Number(token) : undefined;
}

const OPTION_LINE_FORM = '"# <Hz|kHz|MHz|GHz> <S|Y|Z> <RI|MA|DB> R <ohms>", e.g. "# MHz S MA R 50"';

/**
 * Parses the text after `#` of an option line.
 *
 * @param body the line after `#`, comment removed
 * @param line 1-based line number, for errors
 * @param ports how many ports the file has: at most this many values may follow `R`
 * @throws TouchstoneError on an unknown or repeated field, or a missing or non-positive resistance
 */
export function parseOptionLine(body: string, line: number, ports: number): OptionLine {
  const tokens = body.trim().split(/\s+/).filter((t) => t.length > 0);
  let frequencyUnit: FrequencyUnit | undefined;
  let parameter: NetworkParameter | undefined;
  let format: DataFormat | undefined;
  let referenceOhm: number[] | undefined;
  const fail = (reason: string): never => {
    throw new TouchstoneError(line, `bad option line: ${reason}; write it as ${OPTION_LINE_FORM}`);
  };
  for (let i = 0; i < tokens.length; i++) {
    const token = tokens[i];
    const upper = token.toUpperCase();
    if (upper in UNITS_BY_TOKEN) {
      if (frequencyUnit) fail(`two frequency units ("${frequencyUnit}" and "${token}")`);
      frequencyUnit = UNITS_BY_TOKEN[upper];
    } else if (upper in PARAMETERS_BY_TOKEN) {
      if (parameter) fail(`two parameters ("${parameter}" and "${token}")`);
      parameter = PARAMETERS_BY_TOKEN[upper];
    } else if (upper in FORMATS_BY_TOKEN) {
      if (format) fail(`two data formats ("${format}" and "${token}")`);
      format = FORMATS_BY_TOKEN[upper];
    } else if (upper === 'R') {
      if (referenceOhm) fail('"R" appears twice');
      const values: number[] = [];
      while (i + 1 < tokens.length && parseTouchstoneNumber(tokens[i + 1]) !== undefined) {
        const value = parseTouchstoneNumber(tokens[++i]) as number;
        if (!(value > 0) || !Number.isFinite(value)) fail(`reference resistance "${tokens[i]}" must be a positive number of ohms`);
        values.push(value);
      }
      if (values.length === 0) fail('"R" must be followed by the reference resistance in ohms');
      if (values.length > ports) {
        fail(`"R" has ${values.length} values but the file has ${ports} port${ports === 1 ? '' : 's'}`);
      }
      referenceOhm = values;
    } else if (upper === 'H' || upper === 'G') {
      fail(`"${token}" (hybrid ${upper}-parameters) is not read here; Shelfmatch reads S, Y or Z data`);
    } else if (upper === 'THZ') {
      fail('"THz" is not a Touchstone frequency unit');
    } else {
      fail(`"${token}" is not a frequency unit, parameter, format or "R <ohms>"`);
    }
  }
  return {
    frequencyUnit: frequencyUnit ?? OPTION_LINE_DEFAULTS.frequencyUnit,
    parameter: parameter ?? OPTION_LINE_DEFAULTS.parameter,
    format: format ?? OPTION_LINE_DEFAULTS.format,
    referenceOhm: referenceOhm ?? [],
  };
}

/**
 * Writes an option line, e.g. `# Hz S RI R 50`. The reference is written as the shortest decimal
 * that reads back as the same double (`String(number)`), so a reader recomputes with exactly the
 * reference the writer used.
 */
export function formatOptionLine(frequencyUnit: FrequencyUnit, parameter: NetworkParameter, format: DataFormat, referenceOhm: number): string {
  return `# ${frequencyUnit} ${parameter} ${format} R ${String(referenceOhm)}`;
}
