/**
 * How the match form reads what a designer types, field by field, with the engine's own parsers
 * (shared/engine/value-parse.ts) and checks (shared/engine/solve-request.ts), so the browser and the
 * server agree on what is accepted and say it with the same words.
 */
import type { MeasuredPortInput, Objective, SolveRequest } from '../../../shared/api/matches.js';
import {
  formatImpedance,
  formatValue,
  isEngineInputError,
  parseComplex,
  parseSolveRequest,
  parseValue,
} from '../../../shared/engine/index.js';
import { measuredImpedanceAt, readMeasuredPort } from '../../../shared/touchstone/measured-port.js';

/** The form's fields, as the designer sees them. */
export interface MatchFormValue {
  source: string;
  load: string;
  /** A measured source file, used in place of the typed source. */
  sourceFile: MeasuredPortInput | null;
  /** A measured load file, used in place of the typed load. */
  loadFile: MeasuredPortInput | null;
  frequency: string;
  band: string;
  power: string;
  quantity: number | null;
  combinations: boolean;
  objective: Objective;
  location: string;
}

/** A form control's name. */
export type MatchFormField = keyof MatchFormValue;

/** What a field's text reads as: the value in engineering notation, or why it cannot be read. */
export type FieldReading = { kind: 'value'; shown: string } | { kind: 'problem'; message: string } | { kind: 'empty' };

/** Which form control a request field (`details[].field`) belongs to. */
const CONTROL_OF_REQUEST_FIELD: Readonly<Record<string, MatchFormField>> = {
  source: 'source',
  load: 'load',
  // A measured file's problems show under the port it stands for.
  sourceTouchstone: 'source',
  loadTouchstone: 'load',
  frequencyHz: 'frequency',
  bandwidthHz: 'band',
  powerW: 'power',
  buildQuantity: 'quantity',
  combinations: 'combinations',
  objective: 'objective',
  location: 'location',
};

/** The form control for a request field such as `frequencyHz` or `load.re`, or null when none fits. */
export function controlOfRequestField(field: string | undefined): MatchFormField | null {
  if (!field) return null;
  return CONTROL_OF_REQUEST_FIELD[field.split('.')[0]] ?? null;
}

/** An engine message without its leading `field: ` (the field's own label already says which). */
export function withoutFieldPrefix(message: string): string {
  return message.replace(/^[A-Za-z][\w.]*: /, '');
}

/**
 * The solve request the form's text makes: strings as typed (the server reads prefixes itself and
 * quotes them back in errors), optional fields left out when blank.
 */
export function solveRequestOf(value: MatchFormValue): SolveRequest {
  const request: SolveRequest = {
    ...(value.sourceFile ? { sourceTouchstone: value.sourceFile } : { source: value.source.trim() }),
    ...(value.loadFile ? { loadTouchstone: value.loadFile } : { load: value.load.trim() }),
    frequencyHz: value.frequency.trim(),
    buildQuantity: value.quantity ?? Number.NaN,
    combinations: value.combinations,
    objective: value.objective,
  };
  if (value.band.trim() !== '') request.bandwidthHz = value.band.trim();
  if (value.power.trim() !== '') request.powerW = value.power.trim();
  if (value.location.trim() !== '') request.location = value.location.trim();
  return request;
}

/**
 * Every problem the engine finds in the request the form makes, by form control (the first per
 * control), in the engine's words without the field prefix. An empty record means the server will
 * accept the request as far as its inputs go.
 */
export function requestProblems(value: MatchFormValue): Partial<Record<MatchFormField, string>> {
  const problems: Partial<Record<MatchFormField, string>> = {};
  const request = solveRequestOf(value);
  // A blank quantity would be read as "not given" (default 1) by the server; the form says so instead.
  if (value.quantity === null) problems.quantity = 'Enter how many boards you will build (a whole number from 1).';
  try {
    parseSolveRequest({ ...request, buildQuantity: value.quantity ?? 1 });
  } catch (error: unknown) {
    if (!isEngineInputError(error)) throw error;
    for (const detail of error.details) {
      const control = controlOfRequestField(detail.field);
      if (control && problems[control] === undefined) problems[control] = withoutFieldPrefix(detail.message);
    }
  }
  return problems;
}

/** Reads an impedance field: `12-j35` shows as `12 - j35 Ω`. */
export function readImpedance(text: string, field: string): FieldReading {
  if (text.trim() === '') return { kind: 'empty' };
  try {
    const z = parseComplex(text, field);
    return { kind: 'value', shown: formatImpedance(z.re, z.im) };
  } catch (error: unknown) {
    if (isEngineInputError(error)) return { kind: 'problem', message: withoutFieldPrefix(error.message) };
    throw error;
  }
}

/**
 * Reads a measured port file: `181 points, 780 MHz to 960 MHz; 7.66 - j31.4 Ω at 868 MHz` (the
 * impedance at f0 only when the frequency reads and lies inside the file).
 */
export function readMeasuredFile(file: MeasuredPortInput, field: 'sourceTouchstone' | 'loadTouchstone', frequencyText: string): FieldReading {
  try {
    const measured = readMeasuredPort(file, field);
    const points = measured.data.frequencyHz.length;
    const range = `${points} point${points === 1 ? '' : 's'}, ${formatValue(measured.firstHz, 'frequency')} to ${formatValue(measured.lastHz, 'frequency')}`;
    let atF0 = '';
    try {
      const f0 = parseValue(frequencyText, 'frequency', { field: 'frequencyHz' });
      const z = measuredImpedanceAt(measured, f0, field);
      atF0 = `; ${formatImpedance(z.re, z.im)} at ${formatValue(f0, 'frequency')}`;
    } catch (error: unknown) {
      if (!isEngineInputError(error)) throw error;
    }
    return { kind: 'value', shown: range + atF0 };
  } catch (error: unknown) {
    if (isEngineInputError(error)) return { kind: 'problem', message: withoutFieldPrefix(error.message) };
    throw error;
  }
}

/** Reads a frequency or power field: `868MHz` shows as `868 MHz`. */
export function readQuantity(text: string, quantity: 'frequency' | 'power', field: string): FieldReading {
  if (text.trim() === '') return { kind: 'empty' };
  try {
    return { kind: 'value', shown: formatValue(parseValue(text, quantity, { field, sign: 'any' }), quantity) };
  } catch (error: unknown) {
    if (isEngineInputError(error)) return { kind: 'problem', message: withoutFieldPrefix(error.message) };
    throw error;
  }
}

/**
 * What each text field reads as, combining the field's own parse (for the value shown) with the
 * request-wide checks (port resistance above 0, a band for the band objective, ranges).
 */
export function readForm(value: MatchFormValue): Partial<Record<MatchFormField, FieldReading>> {
  const problems = requestProblems(value);
  const readings: Partial<Record<MatchFormField, FieldReading>> = {
    source: value.sourceFile ? readMeasuredFile(value.sourceFile, 'sourceTouchstone', value.frequency) : readImpedance(value.source, 'source'),
    load: value.loadFile ? readMeasuredFile(value.loadFile, 'loadTouchstone', value.frequency) : readImpedance(value.load, 'load'),
    frequency: readQuantity(value.frequency, 'frequency', 'frequencyHz'),
    band: readQuantity(value.band, 'frequency', 'bandwidthHz'),
    power: readQuantity(value.power, 'power', 'powerW'),
  };
  for (const [field, message] of Object.entries(problems) as [MatchFormField, string][]) {
    readings[field] = { kind: 'problem', message };
  }
  return readings;
}
