/**
 * A measured one-port (a Touchstone file) as the source or the load of a match: the file read into
 * impedance over frequency, checked for what a match needs (R > 0 at every point), the impedance at
 * f0 by linear interpolation (impedance-interpolation.ts), and the band checked to lie inside the
 * measured range. Every problem is an EngineInputError naming the request field and, for problems in
 * the file, the file's line, so the server answers 400 and the form shows it beside the file.
 */
import type { MeasuredPortInput } from '../api/matches.js';
import { type Complex, complex } from '../engine/complex.js';
import { EngineInputError, isEngineInputError } from '../engine/engine-input-error.js';
import { type PortModel, tablePort } from '../engine/port-model.js';
import { formatValue } from '../engine/value-format.js';
import { RANGE_EDGE_RELATIVE, impedanceAtFrequency } from './impedance-interpolation.js';
import { isTouchstoneError } from './touchstone-error.js';
import { type OnePortImpedance, readOnePortTouchstone } from './touchstone-read.js';

/**
 * Longest file text accepted, characters: it travels inside a JSON request, which the server takes
 * up to 1 MB (server/app.ts); a 10,001-point file of 12-digit numbers is about 600,000.
 */
export const MAX_MEASURED_TEXT_CHARS = 900_000;
/** Longest file name kept. */
export const MAX_MEASURED_FILE_NAME = 200;

/** A measured port read from a request. */
export interface MeasuredPort {
  /** The name the file was uploaded under, or null. */
  fileName: string | null;
  /** The file as impedance over frequency (SI units). */
  data: OnePortImpedance;
  /** The same data as the engine's port model (`table`: linear in R and X between points). */
  port: PortModel;
  /** First and last measured frequency, Hz. */
  firstHz: number;
  lastHz: number;
}

/** How a message names the file: `"antenna.s1p"` or `the file`. */
function named(fileName: string | null): string {
  return fileName ? `"${fileName}"` : 'the file';
}

const show = (hz: number) => formatValue(hz, 'frequency', { significantDigits: 6 });

/**
 * Reads `value` (`{fileName?, text}`, api.md extension) as a measured port.
 * @param field the request field (`loadTouchstone` or `sourceTouchstone`)
 * @throws EngineInputError naming `field` (and the file's line for problems inside the file)
 */
export function readMeasuredPort(value: unknown, field: string): MeasuredPort {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new EngineInputError(field, value, `${field}: must be an object {fileName, text} holding a one-port Touchstone file's text`);
  }
  const { fileName: rawName, text, ...rest } = value as Record<string, unknown>;
  const extra = Object.keys(rest);
  if (extra.length > 0) throw new EngineInputError(`${field}.${extra[0]}`, rest[extra[0]], `${field}.${extra[0]}: unknown field; ${field} has fileName and text`);
  if (rawName != null && (typeof rawName !== 'string' || rawName.length > MAX_MEASURED_FILE_NAME)) {
    throw new EngineInputError(`${field}.fileName`, rawName, `${field}.fileName: must be a file name of at most ${MAX_MEASURED_FILE_NAME} characters`);
  }
  const fileName = typeof rawName === 'string' && rawName.trim() !== '' ? rawName.trim() : null;
  if (typeof text !== 'string' || text.trim() === '') {
    throw new EngineInputError(`${field}.text`, fileName, `${field}.text: ${named(fileName)} is empty; give the text of a one-port Touchstone file (.s1p)`);
  }
  if (text.length > MAX_MEASURED_TEXT_CHARS) {
    throw new EngineInputError(`${field}.text`, fileName, `${field}.text: ${named(fileName)} is ${text.length} characters long; at most ${MAX_MEASURED_TEXT_CHARS} are accepted`);
  }
  let data: OnePortImpedance;
  try {
    data = readOnePortTouchstone(text);
  } catch (error) {
    if (!isTouchstoneError(error)) throw error;
    throw new EngineInputError(`${field}.text`, fileName, `${field}: ${named(fileName)} line ${error.line}: ${error.reason}`, [
      { field: `${field}.text`, value: fileName, message: `${field}: ${named(fileName)} line ${error.line}: ${error.reason}`, line: error.line },
    ]);
  }
  for (let i = 0; i < data.frequencyHz.length; i++) {
    const r = data.resistanceOhm[i];
    if (!(r > 0)) {
      const line = data.dataLine[i];
      const message =
        `${field}: ${named(fileName)} line ${line}: the measured resistance at ${show(data.frequencyHz[i])} is ${r.toPrecision(4)} ohm; ` +
        'a port of a passive match needs R > 0 at every point (|S11| < 1): check the calibration, or trim the file to the band';
      throw new EngineInputError(`${field}.text`, fileName, message, [{ field: `${field}.text`, value: fileName, message, line }]);
    }
  }
  let port: PortModel;
  try {
    port = tablePort(data.frequencyHz, data.resistanceOhm, data.reactanceOhm, field);
  } catch (error) {
    if (!isEngineInputError(error)) throw error;
    throw new EngineInputError(`${field}.text`, fileName, `${field}: ${named(fileName)}: ${error.message}`);
  }
  return { fileName, data, port, firstHz: data.frequencyHz[0], lastHz: data.frequencyHz[data.frequencyHz.length - 1] };
}

/**
 * The measured impedance at `frequencyHz` (linear interpolation between the neighbouring points).
 * @throws EngineInputError (field `frequencyHz`) when the frequency lies outside the measured range
 */
export function measuredImpedanceAt(measured: MeasuredPort, frequencyHz: number, field: string): Complex {
  try {
    return impedanceAtFrequency(measured.data, frequencyHz, complex(), 'frequencyHz');
  } catch (error) {
    if (!isEngineInputError(error)) throw error;
    throw new EngineInputError('frequencyHz', frequencyHz, `frequencyHz: ${error.message.replace(/\.$/, '')} (${field} ${named(measured.fileName)}).`);
  }
}

/**
 * Problems of a band `f0 ± bandwidth/2` that reaches outside the measured range (sweeps and the band
 * loss use the measured data, which the engine does not extrapolate).
 */
export function measuredBandProblem(measured: MeasuredPort, frequencyHz: number, bandwidthHz: number, field: string, given: unknown) {
  const low = frequencyHz - bandwidthHz / 2;
  const high = frequencyHz + bandwidthHz / 2;
  const inside = low >= measured.firstHz * (1 - RANGE_EDGE_RELATIVE) && high <= measured.lastHz * (1 + RANGE_EDGE_RELATIVE);
  if (inside) return null;
  return {
    field: 'bandwidthHz',
    value: given,
    message:
      `bandwidthHz: the band ${show(low)} to ${show(high)} reaches outside the measured data of ${field} ${named(measured.fileName)} ` +
      `(${show(measured.firstHz)} to ${show(measured.lastHz)}); narrow the band or measure a wider span`,
  };
}

/**
 * The measured impedances inside `[startHz, stopHz]`, plus the interpolated ends, for a Smith chart
 * trace or a table (ohm, frequencies ascending).
 */
export function measuredTrace(measured: MeasuredPort, startHz: number, stopHz: number): { frequenciesHz: number[]; impedances: Complex[] } {
  const f = measured.data.frequencyHz;
  const low = Math.max(startHz, measured.firstHz);
  const high = Math.min(stopHz, measured.lastHz);
  const frequenciesHz: number[] = [];
  const impedances: Complex[] = [];
  if (!(high >= low)) return { frequenciesHz, impedances };
  const push = (hz: number) => {
    frequenciesHz.push(hz);
    impedances.push(impedanceAtFrequency(measured.data, hz, complex()));
  };
  push(low);
  for (let i = 0; i < f.length; i++) if (f[i] > low && f[i] < high) push(f[i]);
  if (high > low) push(high);
  return { frequenciesHz, impedances };
}

/** The range every given measured port covers (their overlap), or null when none is given. */
export function measuredSpan(measured: readonly (MeasuredPort | null)[]): { firstHz: number; lastHz: number } | null {
  let span: { firstHz: number; lastHz: number } | null = null;
  for (const m of measured) {
    if (!m) continue;
    span = span ? { firstHz: Math.max(span.firstHz, m.firstHz), lastHz: Math.min(span.lastHz, m.lastHz) } : { firstHz: m.firstHz, lastHz: m.lastHz };
  }
  return span;
}
