/**
 * Touchstone reader for one-port and two-port files, version 1 syntax (an option line and data)
 * and version 2.0 syntax (keywords), after the Touchstone File Format Specification Version 2.0,
 * IBIS Open Forum, ratified 24 April 2009 (called "the specification" below; section names are its
 * own). `[Version] 2.1` files are read by the same 2.0 rules (not checked against the 2.1
 * document beyond its per-port `R` on the option line, which is accepted).
 *
 * What the reader does, and where the rule comes from:
 * - Case-insensitive; `!` starts a comment anywhere on a line ("General Syntax Rules and
 *   Guidelines", rules 1 and 3). Comments are kept, in order, without the `!`.
 * - Option line defaults GHz, S, MA, R 50; fields in any order ("Option Line"). One option line per
 *   file: a second one is refused (a lenient reader might skip it, but two headers in one measured
 *   file are more likely two files pasted together than intent).
 * - Version 1: comments, the option line, then one data line per frequency: `f N11` for one-ports,
 *   `f N11 N21 N12 N22` for two-ports ("Network Data", 1-port and 2-port networks: "Network data
 *   for 1-port and 2-port networks is contained on one data line"). In a version 1 two-port file,
 *   noise parameters follow the network data and start at the first frequency not above the last
 *   network frequency; they are skipped ("Noise Parameter Data").
 * - Version 2.0: `[Version] 2.0` first, then the option line, then `[Number of Ports]`; then in any
 *   order `[Two-Port Data Order]` (required for, and only allowed in, two-port files),
 *   `[Number of Frequencies]` (required), `[Number of Noise Frequencies]` (two-ports only),
 *   `[Reference]` (one value per port, may continue on the next lines), `[Matrix Format]`
 *   (`Full`, `Lower`, `Upper`), `[Begin Information]`...`[End Information]` (skipped); then
 *   `[Network Data]`, the data, `[Noise Data]` (skipped) and `[End]` (required).
 *   `[Mixed-Mode Order]` is refused (no mixed-mode data for one- and two-ports here).
 * - Frequencies must increase strictly from point to point ("Network Data": data sets are in
 *   increasing order of frequency); a negative frequency is refused.
 * - Normalisation: version 1 Y- and Z-data are normalised to the option-line reference R, so
 *   `Z = z R` and `Y = y / R`; version 2.0 Y- and Z-data are in ohms and siemens, not normalised,
 *   whatever `[Reference]` says (specification sections "[Reference]" and "Compatibility Notes";
 *   the specification's own version 1.0 and version 2.0 one-port Z examples show it: `R 75` with
 *   `0.99 -4` in version 1 and `74.25 -4` in version 2.0 are the same impedance). S-data are always
 *   relative to the reference: `[Reference]` overrides `R` in version 2.0 files.
 */
import { type Complex, complex, invertComplex } from '../engine/complex.js';
import { decodeDataPair } from './data-pair.js';
import { type TwoPortMatrix, createTwoPortMatrix, impedanceFromReflection } from './network-parameters.js';
import { TouchstoneError } from './touchstone-error.js';
import {
  type DataFormat,
  type FrequencyUnit,
  HERTZ_PER_UNIT,
  type NetworkParameter,
  OPTION_LINE_DEFAULTS,
  type OptionLine,
  parseOptionLine,
  parseTouchstoneNumber,
} from './touchstone-option-line.js';

/** Which syntax a file used: `'1'` for version 1.x (no `[Version]` line), else the `[Version]` value. */
export type TouchstoneVersion = '1' | '2.0' | '2.1';

/** `[Two-Port Data Order]`: `21_12` is the version 1 order `N11 N21 N12 N22`. */
export type TwoPortDataOrder = '12_21' | '21_12';

/** `[Matrix Format]`. */
export type MatrixFormat = 'Full' | 'Lower' | 'Upper';

/** How a file described its data (what the upload form may show next to the trace). */
export interface TouchstoneHeader {
  version: TouchstoneVersion;
  frequencyUnit: FrequencyUnit;
  parameter: NetworkParameter;
  format: DataFormat;
  /** Comment texts in file order, without `!` and surrounding blanks (empty comments kept). */
  comments: string[];
}

/** A one-port file read as impedance over frequency (SI units). */
export interface OnePortImpedance extends TouchstoneHeader {
  /** Frequencies in Hz, strictly increasing. */
  frequencyHz: Float64Array;
  /** `Re Z` per frequency, ohm. */
  resistanceOhm: Float64Array;
  /** `Im Z` per frequency, ohm. */
  reactanceOhm: Float64Array;
  /** The reference resistance in effect (ohm): `[Reference]`, else `R`, else 50. */
  referenceOhm: number;
  /** 1-based line number of each frequency's data line (for messages that point into the file). */
  dataLine: Int32Array;
}

/** A two-port file read as matrices over frequency. */
export interface TwoPortNetworkData extends TouchstoneHeader {
  /** Frequencies in Hz, strictly increasing. */
  frequencyHz: Float64Array;
  /**
   * One matrix per frequency in natural order (row by row, whatever the file's data order):
   * S dimensionless; Z in ohm and Y in siemens, with version 1 normalisation already undone.
   */
  matrices: TwoPortMatrix[];
  /** Reference resistance per port (ohm) in effect for S-data. */
  referenceOhm: [number, number];
  /** Noise-parameter lines found and skipped. */
  noiseLinesSkipped: number;
  /** 1-based line number of each frequency's data line. */
  dataLine: Int32Array;
}

/** Network data before conversion: complex values in natural matrix order, as the file wrote them. */
interface RawNetwork {
  version: TouchstoneVersion;
  options: OptionLine;
  referenceOhm: number[];
  frequencyHz: number[];
  /** `ports^2` complex values per frequency, re/im interleaved, natural order. */
  values: number[];
  dataLine: number[];
  comments: string[];
  noiseLinesSkipped: number;
  optionLineNumber: number;
}

type Stage =
  | 'start'
  | 'v1-data'
  | 'v1-noise'
  | 'v2-option'
  | 'v2-ports'
  | 'v2-header'
  | 'v2-information'
  | 'v2-network'
  | 'v2-noise'
  | 'v2-ended';

type Keyword =
  | 'version'
  | 'number of ports'
  | 'two-port data order'
  | 'number of frequencies'
  | 'number of noise frequencies'
  | 'reference'
  | 'matrix format'
  | 'mixed-mode order'
  | 'begin information'
  | 'end information'
  | 'network data'
  | 'noise data'
  | 'end';

const KEYWORDS: ReadonlySet<string> = new Set<Keyword>([
  'version',
  'number of ports',
  'two-port data order',
  'number of frequencies',
  'number of noise frequencies',
  'reference',
  'matrix format',
  'mixed-mode order',
  'begin information',
  'end information',
  'network data',
  'noise data',
  'end',
]);

/** Values on a noise-parameter line: frequency, NFmin, |Γopt|, ∠Γopt, Rn ("Noise Parameter Data"). */
const NOISE_VALUES_PER_LINE = 5;
const INTEGER_PATTERN = /^\d+$/;
const OPTION_LINE_FORM = '"# MHz S MA R 50"';

/** Expected ports of the file being read: the reader is chosen by what the caller needs. */
type Ports = 1 | 2;

function portsWord(ports: number): string {
  return ports === 1 ? 'one-port' : `${ports}-port`;
}

/** Values on one data line for the given ports and matrix format. */
function valuesPerLine(ports: Ports, matrixFormat: MatrixFormat): number {
  if (ports === 1) return 3;
  return matrixFormat === 'Full' ? 9 : 7;
}

function parseRaw(text: string, ports: Ports): RawNetwork {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const comments: string[] = [];
  // Widened on purpose: helper closures below also move the stage on.
  let stage = 'start' as Stage;
  let version: TouchstoneVersion = '1';
  let options: OptionLine | undefined;
  let optionLineNumber = 0;
  let keywordReference: number[] | undefined;
  let referencePending = false;
  let referenceLine = 0;
  let declaredFrequencies: number | undefined;
  let declaredFrequenciesLine = 0;
  let declaredNoise: number | undefined;
  let twoPortOrder: TwoPortDataOrder | undefined;
  let matrixFormat: MatrixFormat = 'Full';
  const seen = new Map<Keyword, number>();
  const frequencyHz: number[] = [];
  const values: number[] = [];
  const dataLine: number[] = [];
  let lastRawFrequency = Number.NaN;
  let noiseLines = 0;
  /** Where problems found at the end of the file are reported: its last line that is not blank. */
  let lastNonBlankLine = 0;
  const pair = complex();

  const numbersOf = (content: string, line: number, what: string): number[] =>
    content.split(/\s+/).map((token, index) => {
      const value = parseTouchstoneNumber(token);
      if (value === undefined) {
        throw new TouchstoneError(line, `non-numeric value "${token}" (value ${index + 1} of the ${what})`);
      }
      if (!Number.isFinite(value)) throw new TouchstoneError(line, `value "${token}" (value ${index + 1} of the ${what}) is out of range`);
      return value;
    });

  const readDataLine = (content: string, line: number): void => {
    const opts = options as OptionLine;
    const numbers = numbersOf(content, line, 'data line');
    const expected = valuesPerLine(ports, matrixFormat);
    if (ports === 2 && stage === 'v1-data' && numbers.length === NOISE_VALUES_PER_LINE && frequencyHz.length > 0 && numbers[0] <= lastRawFrequency) {
      stage = 'v1-noise';
      noiseLines++;
      return;
    }
    if (numbers.length !== expected) {
      const pairs = ports === 1 ? 'one pair' : matrixFormat === 'Full' ? 'four pairs' : 'three pairs';
      let reason = `wrong column count: expected ${expected} values (frequency and ${pairs}), found ${numbers.length}`;
      if (ports === 1 && numbers.length === 9) {
        reason = `more than one port: 9 values is a 2-port data line (frequency and four pairs), but a one-port file (.s1p) was expected with 3 values per line`;
      } else if (ports === 1 && numbers.length > 3 && numbers.length % 2 === 1) {
        reason += '; data for more than one port is not read here, a one-port file (.s1p) is expected';
      }
      throw new TouchstoneError(line, reason);
    }
    if (declaredFrequencies !== undefined && frequencyHz.length >= declaredFrequencies) {
      throw new TouchstoneError(
        line,
        `more data lines than [Number of Frequencies] ${declaredFrequencies} (line ${declaredFrequenciesLine}) declares`,
      );
    }
    const rawFrequency = numbers[0];
    if (rawFrequency < 0) throw new TouchstoneError(line, `negative frequency ${content.split(/\s+/)[0]}`);
    if (frequencyHz.length > 0 && !(rawFrequency > lastRawFrequency)) {
      throw new TouchstoneError(
        line,
        `non-increasing frequency: ${content.split(/\s+/)[0]} ${opts.frequencyUnit} is not above the previous point ` +
          `${lastRawFrequency} ${opts.frequencyUnit} (line ${dataLine[dataLine.length - 1]}); frequencies must increase from line to line`,
      );
    }
    lastRawFrequency = rawFrequency;
    frequencyHz.push(rawFrequency * HERTZ_PER_UNIT[opts.frequencyUnit]);
    dataLine.push(line);
    const decoded: number[] = [];
    for (let k = 1; k < numbers.length; k += 2) {
      decodeDataPair(opts.format, numbers[k], numbers[k + 1], pair);
      decoded.push(pair.re, pair.im);
    }
    if (ports === 1) {
      values.push(decoded[0], decoded[1]);
      return;
    }
    // Natural order 11, 12, 21, 22 from the file's order.
    const at = (i: number): [number, number] => [decoded[2 * i], decoded[2 * i + 1]];
    let ordered: [number, number][];
    if (matrixFormat !== 'Full') ordered = [at(0), at(1), at(1), at(2)]; // N11 N21 N22 (Lower) or N11 N12 N22 (Upper)
    else if (version === '1' || twoPortOrder === '21_12') ordered = [at(0), at(2), at(1), at(3)]; // N11 N21 N12 N22
    else ordered = [at(0), at(1), at(2), at(3)]; // N11 N12 N21 N22
    for (const [re, im] of ordered) values.push(re, im);
  };

  const keywordOf = (content: string, line: number): { keyword: Keyword; argument: string; written: string } => {
    const match = /^\[([^\]]*)\](.*)$/.exec(content);
    if (!match) throw new TouchstoneError(line, `keyword without a closing "]": "${content}"`);
    const name = match[1].trim().replace(/\s+/g, ' ').toLowerCase();
    if (!KEYWORDS.has(name)) {
      throw new TouchstoneError(
        line,
        `unknown keyword "[${match[1]}]"; version 2.0 keywords are [Version], [Number of Ports], [Two-Port Data Order], ` +
          '[Number of Frequencies], [Number of Noise Frequencies], [Reference], [Matrix Format], [Mixed-Mode Order], ' +
          '[Begin Information], [End Information], [Network Data], [Noise Data] and [End]',
      );
    }
    return { keyword: name as Keyword, argument: match[2].trim(), written: `[${match[1]}]` };
  };

  const noArgument = (written: string, argument: string, line: number): void => {
    if (argument !== '') throw new TouchstoneError(line, `${written} takes no argument, found "${argument}"`);
  };

  const positiveInteger = (written: string, argument: string, line: number): number => {
    if (!INTEGER_PATTERN.test(argument) || Number(argument) < 1) {
      throw new TouchstoneError(line, `${written} needs a whole number of at least 1, found "${argument}"`);
    }
    return Number(argument);
  };

  const addReferenceValues = (content: string, line: number): void => {
    const list = keywordReference as number[];
    for (const token of content.split(/\s+/).filter((t) => t !== '')) {
      const value = parseTouchstoneNumber(token);
      if (value === undefined) throw new TouchstoneError(line, `non-numeric value "${token}" in [Reference] (line ${referenceLine})`);
      if (!(value > 0) || !Number.isFinite(value)) {
        throw new TouchstoneError(line, `[Reference] value "${token}" must be a positive number of ohms`);
      }
      list.push(value);
    }
    if (list.length > ports) {
      throw new TouchstoneError(line, `[Reference] has ${list.length} values but the file has ${ports} port${ports === 1 ? '' : 's'}`);
    }
    referencePending = list.length < ports;
  };

  const headerKeyword = (keyword: Keyword, argument: string, written: string, line: number): void => {
    if (referencePending && keyword !== 'reference') {
      throw new TouchstoneError(line, `[Reference] (line ${referenceLine}) has ${(keywordReference as number[]).length} of ${ports} values before ${written}`);
    }
    const once = (): void => {
      const earlier = seen.get(keyword);
      if (earlier !== undefined) throw new TouchstoneError(line, `${written} appears twice (first on line ${earlier})`);
      seen.set(keyword, line);
    };
    switch (keyword) {
      case 'version':
        throw new TouchstoneError(line, `[Version] must be the first line that is not a comment (it is on line ${line})`);
      case 'number of ports':
        throw new TouchstoneError(line, `[Number of Ports] appears twice (first on line ${seen.get('number of ports')})`);
      case 'two-port data order': {
        once();
        if (ports !== 2) throw new TouchstoneError(line, '[Two-Port Data Order] is only allowed in 2-port files');
        if (argument !== '12_21' && argument !== '21_12') {
          throw new TouchstoneError(line, `[Two-Port Data Order] must be 12_21 or 21_12, found "${argument}"`);
        }
        twoPortOrder = argument;
        return;
      }
      case 'number of frequencies':
        once();
        declaredFrequencies = positiveInteger(written, argument, line);
        declaredFrequenciesLine = line;
        return;
      case 'number of noise frequencies':
        once();
        if (ports !== 2) throw new TouchstoneError(line, '[Number of Noise Frequencies]: noise data exists only in 2-port files');
        declaredNoise = positiveInteger(written, argument, line);
        return;
      case 'reference':
        once();
        keywordReference = [];
        referenceLine = line;
        addReferenceValues(argument, line);
        return;
      case 'matrix format': {
        once();
        const value = argument.toLowerCase();
        if (value === 'full') matrixFormat = 'Full';
        else if (value === 'lower') matrixFormat = 'Lower';
        else if (value === 'upper') matrixFormat = 'Upper';
        else throw new TouchstoneError(line, `[Matrix Format] must be Full, Lower or Upper, found "${argument}"`);
        return;
      }
      case 'mixed-mode order':
        throw new TouchstoneError(line, '[Mixed-Mode Order]: mixed-mode data is not read here, only single-ended one- and two-port data');
      case 'begin information':
        noArgument(written, argument, line);
        stage = 'v2-information';
        return;
      case 'end information':
        throw new TouchstoneError(line, '[End Information] without [Begin Information]');
      case 'network data':
        noArgument(written, argument, line);
        if (declaredFrequencies === undefined) {
          throw new TouchstoneError(line, 'missing [Number of Frequencies]: a version 2.0 file declares it before [Network Data]');
        }
        if (ports === 2 && twoPortOrder === undefined) {
          throw new TouchstoneError(line, 'missing [Two-Port Data Order] (12_21 or 21_12): a version 2.0 2-port file declares it before [Network Data]');
        }
        stage = 'v2-network';
        return;
      case 'noise data':
        throw new TouchstoneError(line, '[Noise Data] before [Network Data]');
      case 'end':
        throw new TouchstoneError(line, 'missing data: [End] before [Network Data]');
    }
  };

  const checkFrequencyCount = (line: number, before: string): void => {
    if (declaredFrequencies !== undefined && frequencyHz.length < declaredFrequencies) {
      throw new TouchstoneError(
        line,
        `missing data: [Number of Frequencies] ${declaredFrequencies} (line ${declaredFrequenciesLine}) but only ` +
          `${frequencyHz.length} data line${frequencyHz.length === 1 ? '' : 's'} before ${before}`,
      );
    }
  };

  for (let index = 0; index < lines.length; index++) {
    const line = index + 1;
    let content = lines[index];
    if (content.trim() !== '') lastNonBlankLine = line;
    const bang = content.indexOf('!');
    if (bang >= 0) {
      comments.push(content.slice(bang + 1).trim());
      content = content.slice(0, bang);
    }
    content = content.trim();
    if (content === '') continue;
    const isKeyword = content.startsWith('[');
    const isOption = content.startsWith('#');

    if (stage === 'v2-information') {
      // Information keywords are for future use (section "[Begin Information], [End Information]"): skip them all.
      if (/^\[\s*end\s+information\s*\]$/i.test(content)) stage = 'v2-header';
      continue;
    }
    if (stage === 'v2-ended') throw new TouchstoneError(line, `content after [End]: "${content}"`);
    if (isOption && stage !== 'start' && stage !== 'v2-option') {
      throw new TouchstoneError(line, `bad option line: a second option line (the first is on line ${optionLineNumber}); a file has one`);
    }

    switch (stage) {
      case 'start': {
        if (isOption) {
          options = parseOptionLine(content.slice(1), line, ports);
          optionLineNumber = line;
          stage = 'v1-data';
        } else if (isKeyword) {
          const { keyword, argument, written } = keywordOf(content, line);
          if (keyword !== 'version') {
            throw new TouchstoneError(line, `${written} before the option line: a version 2.0 file begins with [Version] 2.0, a version 1 file has no keywords`);
          }
          if (argument !== '2.0' && argument !== '2.1') throw new TouchstoneError(line, `[Version] ${argument} is not supported; write [Version] 2.0`);
          version = argument;
          seen.set('version', line);
          stage = 'v2-option';
        } else {
          throw new TouchstoneError(line, `missing option line: data before the option line; a file begins (after comments) with an option line such as ${OPTION_LINE_FORM}`);
        }
        break;
      }
      case 'v2-option':
        if (!isOption) throw new TouchstoneError(line, `missing option line: [Version] (line ${seen.get('version')}) must be followed by the option line, e.g. ${OPTION_LINE_FORM}`);
        options = parseOptionLine(content.slice(1), line, ports);
        optionLineNumber = line;
        stage = 'v2-ports';
        break;
      case 'v2-ports': {
        const { keyword, argument, written } = isKeyword ? keywordOf(content, line) : { keyword: undefined, argument: '', written: '' };
        if (keyword !== 'number of ports') {
          throw new TouchstoneError(line, `missing [Number of Ports]: it must follow the option line (line ${optionLineNumber}) in a version 2.0 file`);
        }
        const declared = positiveInteger(written, argument, line);
        if (declared !== ports) {
          throw new TouchstoneError(
            line,
            declared > ports
              ? `more than one port where ${ports === 1 ? 'one is' : `${ports} are`} expected: [Number of Ports] ${declared}, but a ${portsWord(ports)} file is needed`
              : `[Number of Ports] ${declared}, but a ${portsWord(ports)} file is needed`,
          );
        }
        seen.set('number of ports', line);
        stage = 'v2-header';
        break;
      }
      case 'v2-header':
        if (isKeyword) {
          const { keyword, argument, written } = keywordOf(content, line);
          headerKeyword(keyword, argument, written, line);
        } else if (referencePending) {
          addReferenceValues(content, line);
        } else {
          throw new TouchstoneError(line, 'data before [Network Data]: a version 2.0 file puts its data after the [Network Data] keyword');
        }
        break;
      case 'v2-network':
        if (isKeyword) {
          const { keyword, written } = keywordOf(content, line);
          if (keyword === 'noise data') {
            if (declaredNoise === undefined) throw new TouchstoneError(line, '[Noise Data] without [Number of Noise Frequencies]');
            checkFrequencyCount(line, '[Noise Data]');
            stage = 'v2-noise';
          } else if (keyword === 'end') {
            checkFrequencyCount(line, '[End]');
            if (declaredNoise !== undefined) throw new TouchstoneError(line, 'missing [Noise Data]: [Number of Noise Frequencies] was declared');
            stage = 'v2-ended';
          } else {
            throw new TouchstoneError(line, `${written} inside [Network Data]: only data, [Noise Data] or [End] may follow it`);
          }
        } else {
          readDataLine(content, line);
        }
        break;
      case 'v2-noise':
        if (isKeyword) {
          const { keyword, written } = keywordOf(content, line);
          if (keyword !== 'end') throw new TouchstoneError(line, `${written} inside [Noise Data]: only noise data or [End] may follow it`);
          if (noiseLines !== declaredNoise) {
            throw new TouchstoneError(line, `missing data: [Number of Noise Frequencies] ${declaredNoise} but ${noiseLines} noise line${noiseLines === 1 ? '' : 's'}`);
          }
          stage = 'v2-ended';
        } else {
          const numbers = numbersOf(content, line, 'noise line');
          if (numbers.length !== NOISE_VALUES_PER_LINE) {
            throw new TouchstoneError(line, `wrong column count: a noise line has ${NOISE_VALUES_PER_LINE} values, found ${numbers.length}`);
          }
          noiseLines++;
        }
        break;
      case 'v1-data':
      case 'v1-noise':
        if (isKeyword) {
          const { written } = keywordOf(content, line);
          throw new TouchstoneError(line, `keyword ${written} in a version 1 file: keywords need [Version] 2.0 as the first line`);
        }
        if (stage === 'v1-noise') {
          const numbers = numbersOf(content, line, 'noise line');
          if (numbers.length !== NOISE_VALUES_PER_LINE) {
            throw new TouchstoneError(line, `wrong column count: a noise line has ${NOISE_VALUES_PER_LINE} values, found ${numbers.length}`);
          }
          noiseLines++;
        } else {
          readDataLine(content, line);
        }
        break;
    }
  }

  const endLine = Math.max(lastNonBlankLine, 1);
  if (stage === 'start') throw new TouchstoneError(endLine, 'missing data: the file has no option line and no data');
  if (stage === 'v1-data' && frequencyHz.length === 0) throw new TouchstoneError(endLine, `missing data: the option line (line ${optionLineNumber}) is not followed by any data line`);
  if (stage === 'v2-option') throw new TouchstoneError(endLine, 'missing option line after [Version]');
  if (stage === 'v2-ports') throw new TouchstoneError(endLine, 'missing [Number of Ports] after the option line');
  if (stage === 'v2-header' || stage === 'v2-information') throw new TouchstoneError(endLine, 'missing data: no [Network Data] keyword');
  if (stage === 'v2-network') {
    checkFrequencyCount(endLine, 'the end of the file');
    throw new TouchstoneError(endLine, 'missing [End]: a version 2.0 file ends with [End] (is the file cut short?)');
  }
  if (stage === 'v2-noise') throw new TouchstoneError(endLine, 'missing [End]: a version 2.0 file ends with [End] (is the file cut short?)');

  const opts = options as OptionLine;
  let referenceOhm: number[];
  if (keywordReference) referenceOhm = keywordReference;
  else if (opts.referenceOhm.length === ports) referenceOhm = opts.referenceOhm;
  else if (opts.referenceOhm.length === 1) referenceOhm = new Array<number>(ports).fill(opts.referenceOhm[0]);
  else if (opts.referenceOhm.length === 0) referenceOhm = new Array<number>(ports).fill(OPTION_LINE_DEFAULTS.referenceOhm);
  else throw new TouchstoneError(optionLineNumber, `bad option line: "R" needs 1 or ${ports} values`);
  return { version, options: opts, referenceOhm, frequencyHz, values, dataLine, comments, noiseLinesSkipped: noiseLines, optionLineNumber };
}

/**
 * Reads a one-port Touchstone file (`.s1p`, or a version 2.0 `.ts` with `[Number of Ports] 1`) as
 * impedance over frequency.
 *
 * Conversions to impedance Z (ohm), with R the reference resistance in effect:
 * - S-data: `Z = R (1 + S) / (1 - S)` (Pozar, Microwave Engineering, 4th ed., eq. 2.35);
 * - Z-data: version 1 `Z = z R` (normalised), version 2.0 `Z = z` (ohm);
 * - Y-data: version 1 `Z = R / y` (normalised), version 2.0 `Z = 1 / Y` (Y in siemens).
 * Normalisation rules: Touchstone File Format Specification Version 2.0 (IBIS Open Forum, 2009),
 * "[Reference]" and "Compatibility Notes".
 *
 * @param text the whole file as text
 * @throws TouchstoneError with the line number for any malformed file, a file with more than one
 *   port, or a point that is an open circuit (S = 1, Y = 0) and so has no finite impedance
 */
export function readOnePortTouchstone(text: string): OnePortImpedance {
  const raw = parseRaw(text, 1);
  const count = raw.frequencyHz.length;
  const resistanceOhm = new Float64Array(count);
  const reactanceOhm = new Float64Array(count);
  const referenceOhm = raw.referenceOhm[0];
  const normalised = raw.version === '1';
  const value = complex();
  const z: Complex = complex();
  for (let i = 0; i < count; i++) {
    value.re = raw.values[2 * i];
    value.im = raw.values[2 * i + 1];
    const line = raw.dataLine[i];
    switch (raw.options.parameter) {
      case 'S':
        if (value.re === 1 && value.im === 0) {
          throw new TouchstoneError(line, 'S11 = 1 is an open circuit: its impedance is infinite, so it cannot be a port of a match');
        }
        impedanceFromReflection(value, referenceOhm, z);
        break;
      case 'Z':
        z.re = normalised ? value.re * referenceOhm : value.re;
        z.im = normalised ? value.im * referenceOhm : value.im;
        break;
      case 'Y':
        if (value.re === 0 && value.im === 0) {
          throw new TouchstoneError(line, 'Y11 = 0 is an open circuit: its impedance is infinite, so it cannot be a port of a match');
        }
        invertComplex(value, z);
        if (normalised) {
          z.re *= referenceOhm;
          z.im *= referenceOhm;
        }
        break;
    }
    if (!Number.isFinite(z.re) || !Number.isFinite(z.im)) {
      throw new TouchstoneError(line, `the impedance of this point is out of range (${z.re} + j${z.im} ohm)`);
    }
    resistanceOhm[i] = z.re;
    reactanceOhm[i] = z.im;
  }
  return {
    version: raw.version,
    frequencyUnit: raw.options.frequencyUnit,
    parameter: raw.options.parameter,
    format: raw.options.format,
    comments: raw.comments,
    frequencyHz: Float64Array.from(raw.frequencyHz),
    resistanceOhm,
    reactanceOhm,
    referenceOhm,
    dataLine: Int32Array.from(raw.dataLine),
  };
}

/**
 * Reads a two-port Touchstone file (`.s2p`, or a version 2.0 `.ts` with `[Number of Ports] 2`).
 * Matrices come back in natural order (11, 12, 21, 22) whatever the file's data order: version 1
 * files and `[Two-Port Data Order] 21_12` write `N11 N21 N12 N22`, `12_21` writes `N11 N12 N21 N22`,
 * `[Matrix Format] Lower`/`Upper` write three pairs with `N12 = N21` (specification sections
 * "[Two-Port Data Order]", "[Matrix Format]", "1-port and 2-port Networks").
 * Version 1 Z- and Y-data are de-normalised (`Z = z R`, `Y = y / R`, with R per port taken as the
 * single option-line value); version 2.0 Z and Y are already in ohm and siemens.
 *
 * @throws TouchstoneError with the line number for any malformed file or a file that is not a
 *   two-port; H- and G-parameters are refused
 */
export function readTwoPortTouchstone(text: string): TwoPortNetworkData {
  const raw = parseRaw(text, 2);
  const count = raw.frequencyHz.length;
  const [r1, r2] = raw.referenceOhm;
  const normalised = raw.version === '1' && raw.options.parameter !== 'S';
  if (normalised && r1 !== r2) {
    throw new TouchstoneError(raw.optionLineNumber, 'version 1 Y- or Z-data with a different reference per port cannot be de-normalised here');
  }
  const scale = !normalised ? 1 : raw.options.parameter === 'Z' ? r1 : 1 / r1;
  const matrices: TwoPortMatrix[] = [];
  for (let i = 0; i < count; i++) {
    const m = createTwoPortMatrix();
    for (let k = 0; k < 8; k++) m[k] = raw.values[8 * i + k] * scale;
    matrices.push(m);
  }
  return {
    version: raw.version,
    frequencyUnit: raw.options.frequencyUnit,
    parameter: raw.options.parameter,
    format: raw.options.format,
    comments: raw.comments,
    frequencyHz: Float64Array.from(raw.frequencyHz),
    matrices,
    referenceOhm: [r1, r2],
    noiseLinesSkipped: raw.noiseLinesSkipped,
    dataLine: Int32Array.from(raw.dataLine),
  };
}
