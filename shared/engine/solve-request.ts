/**
 * Reading a `POST /api/matches/solve` body (shared/api/matches.ts) into checked SI numbers, with every
 * problem collected into one EngineInputError whose `details` name the fields (the server sends
 * them as a 400).
 */
import type { Objective, SolveRequest } from '../api/matches.js';
import { type Complex } from './complex.js';
import { EngineInputError, type EngineInputProblem, isEngineInputError, quoteValue } from './engine-input-error.js';
import { MAX_FREQUENCY_HZ, MIN_FREQUENCY_HZ, frequencyProblems, portProblems } from './port-limits.js';
import { MAX_POWER_W } from './power-check.js';
import { parseComplex, parseValue } from './value-parse.js';
import { type PortModel, seriesEquivalentPort } from './port-model.js';
import { type MeasuredPort, measuredBandProblem, measuredImpedanceAt, readMeasuredPort } from '../touchstone/measured-port.js';

/** A solve request as checked numbers, defaults filled in (api.md). */
export interface SolveInput {
  /** Zs at f0: as entered, or interpolated from `sourceMeasured`. */
  source: Complex;
  /** ZL at f0: as entered, or interpolated from `loadMeasured`. */
  load: Complex;
  /** The source over frequency: the measured table, or R with the L or C giving X at f0 (port-model.ts). */
  sourcePort: PortModel;
  /** The load over frequency, as `sourcePort`. */
  loadPort: PortModel;
  /** The measured source file, when the request gave `sourceTouchstone`. */
  sourceMeasured: MeasuredPort | null;
  /** The measured load file, when the request gave `loadTouchstone`. */
  loadMeasured: MeasuredPort | null;
  frequencyHz: number;
  bandwidthHz: number | null;
  powerW: number | null;
  buildQuantity: number;
  combinations: boolean;
  objective: Objective;
  fitsPerNetwork: number;
  location: string | null;
  usableSrfFraction: number | null;
  excludeAboveLimit: boolean | null;
}

/** Largest fitsPerNetwork a request may ask for. */
export const MAX_FITS_PER_NETWORK = 50;
/** Largest buildQuantity a request may ask for. */
export const MAX_BUILD_QUANTITY = 1_000_000;

const OBJECTIVES: readonly Objective[] = ['worst-case', 'nominal', 'band'];
const KNOWN_FIELDS = new Set([
  'source', 'load', 'sourceTouchstone', 'loadTouchstone', 'frequencyHz', 'bandwidthHz', 'powerW', 'buildQuantity', 'combinations',
  'objective', 'fitsPerNetwork', 'location', 'usableSrfFraction', 'excludeAboveLimit',
]);

/**
 * Checks and converts a solve request body. Impedances accept `"12-j35"`, numbers or `{re, im}`, or
 * come from a measured one-port file (`sourceTouchstone`/`loadTouchstone`, measured-port.ts);
 * frequencies and power accept numbers or strings (`"868MHz"`, `"100mW"`).
 * @throws EngineInputError with one detail per problem
 */
export function parseSolveRequest(body: unknown): SolveInput {
  const problems: EngineInputProblem[] = [];
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw new EngineInputError('body', body, 'body: a solve request must be a JSON object with source, load and frequencyHz');
  }
  const request = body as Record<string, unknown> & Partial<SolveRequest>;
  const attempt = <T>(run: () => T, fallback: T): T => {
    try {
      return run();
    } catch (error) {
      if (!isEngineInputError(error)) throw error;
      problems.push(...error.details);
      return fallback;
    }
  };
  for (const key of Object.keys(request)) {
    if (!KNOWN_FIELDS.has(key)) problems.push({ field: key, value: request[key], message: `${key}: unknown field; the solve request has ${[...KNOWN_FIELDS].join(', ')}` });
  }
  const required = (name: 'source' | 'load' | 'frequencyHz', alternative?: string) => {
    if (request[name] === undefined || request[name] === null) {
      problems.push({ field: name, value: request[name], message: `${name}: is required${alternative ? ` (or ${alternative}, a measured file)` : ''}` });
      return false;
    }
    return true;
  };
  /** A measured port file, when the request gives one for `name` (and not the typed impedance too). */
  const measuredFile = (name: 'source' | 'load'): MeasuredPort | null | 'absent' => {
    const key = `${name}Touchstone` as const;
    if (request[key] == null) return 'absent';
    if (request[name] != null) {
      problems.push({ field: key, value: null, message: `${key}: give either ${name} (typed) or ${key} (a measured file), not both` });
      return null;
    }
    return attempt(() => readMeasuredPort(request[key], key), null);
  };
  const zero: Complex = { re: 1, im: 0 };
  const sourceFile = measuredFile('source');
  const loadFile = measuredFile('load');
  const typed = (name: 'source' | 'load', file: MeasuredPort | null | 'absent') =>
    file === 'absent' && required(name, `${name}Touchstone`) ? attempt(() => parseComplex(request[name], name), zero) : zero;
  let source = typed('source', sourceFile);
  let load = typed('load', loadFile);
  // Port and frequency problems quote the value as the request gave it.
  const asGiven = (found: EngineInputProblem[], value: unknown) => found.map((p) => ({ ...p, value }));
  if (request.source != null && source !== zero) problems.push(...asGiven(portProblems(source, 'source'), request.source));
  if (request.load != null && load !== zero) problems.push(...asGiven(portProblems(load, 'load'), request.load));
  const frequencyHz = required('frequencyHz')
    ? attempt(() => parseValue(request.frequencyHz, 'frequency', { field: 'frequencyHz', sign: 'any' }), NaN)
    : NaN;
  const frequencyOk = !Number.isNaN(frequencyHz) && frequencyProblems(frequencyHz, 'frequencyHz').length === 0;
  if (!Number.isNaN(frequencyHz)) problems.push(...asGiven(frequencyProblems(frequencyHz, 'frequencyHz'), request.frequencyHz));
  // A measured port's impedance at f0, and its problems (R <= 0 there, f0 outside the file).
  const atF0 = (name: 'source' | 'load', file: MeasuredPort | null | 'absent'): Complex => {
    if (file === 'absent' || file === null || !frequencyOk) return zero;
    const z = attempt(() => measuredImpedanceAt(file, frequencyHz, `${name}Touchstone`), zero);
    if (z !== zero) problems.push(...asGiven(portProblems(z, `${name}Touchstone`), file.fileName));
    return z;
  };
  if (sourceFile !== 'absent') source = atF0('source', sourceFile);
  if (loadFile !== 'absent') load = atF0('load', loadFile);

  let bandwidthHz: number | null = null;
  if (request.bandwidthHz != null) {
    bandwidthHz = attempt(() => parseValue(request.bandwidthHz, 'frequency', { field: 'bandwidthHz' }), null);
    if (bandwidthHz !== null && Number.isFinite(frequencyHz)) {
      const low = frequencyHz - bandwidthHz / 2;
      const high = frequencyHz + bandwidthHz / 2;
      if (low < MIN_FREQUENCY_HZ || high > MAX_FREQUENCY_HZ) {
        problems.push({
          field: 'bandwidthHz',
          value: request.bandwidthHz,
          message: `bandwidthHz: ${quoteValue(request.bandwidthHz)} around ${frequencyHz} Hz reaches outside ${MIN_FREQUENCY_HZ} Hz to ${MAX_FREQUENCY_HZ} Hz; it must be less than twice the frequency`,
        });
      } else {
        for (const [name, file] of [['sourceTouchstone', sourceFile], ['loadTouchstone', loadFile]] as const) {
          if (file === 'absent' || file === null) continue;
          const problem = measuredBandProblem(file, frequencyHz, bandwidthHz, name, request.bandwidthHz);
          if (problem) problems.push(problem);
        }
      }
    }
  }
  const powerW = request.powerW == null ? null : attempt(() => parseValue(request.powerW, 'power', { field: 'powerW', maxSi: MAX_POWER_W }), null);

  const integer = (name: 'buildQuantity' | 'fitsPerNetwork', fallback: number, max: number) => {
    const value = request[name];
    if (value === undefined || value === null) return fallback;
    if (typeof value !== 'number' || !Number.isInteger(value) || value < 1 || value > max) {
      problems.push({ field: name, value, message: `${name}: ${quoteValue(value)} must be a whole number from 1 to ${max}` });
      return fallback;
    }
    return value;
  };
  const flag = (name: 'combinations' | 'excludeAboveLimit') => {
    const value = request[name];
    if (value === undefined || value === null) return null;
    if (typeof value !== 'boolean') {
      problems.push({ field: name, value, message: `${name}: ${quoteValue(value)} must be true or false` });
      return null;
    }
    return value;
  };
  let objective: Objective = 'worst-case';
  if (request.objective != null) {
    if (OBJECTIVES.includes(request.objective as Objective)) objective = request.objective as Objective;
    else problems.push({ field: 'objective', value: request.objective, message: `objective: ${quoteValue(request.objective)} must be one of ${OBJECTIVES.join(', ')}` });
  }
  if (objective === 'band' && bandwidthHz === null && request.bandwidthHz == null) {
    problems.push({ field: 'bandwidthHz', value: request.bandwidthHz, message: 'bandwidthHz: the "band" objective needs a bandwidth, e.g. "10MHz"' });
  }
  let location: string | null = null;
  if (request.location != null) {
    if (typeof request.location !== 'string' || request.location.trim() === '' || request.location.length > 64) {
      problems.push({ field: 'location', value: request.location, message: `location: ${quoteValue(request.location)} must be a location name of 1 to 64 characters` });
    } else location = request.location.trim();
  }
  let usableSrfFraction: number | null = null;
  if (request.usableSrfFraction != null) {
    const value = request.usableSrfFraction;
    if (typeof value !== 'number' || !(value > 0) || !(value <= 1)) {
      problems.push({ field: 'usableSrfFraction', value, message: `usableSrfFraction: ${quoteValue(value)} must be a number above 0 and at most 1 (default 0.5)` });
    } else usableSrfFraction = value;
  }
  const buildQuantity = integer('buildQuantity', 1, MAX_BUILD_QUANTITY);
  const combinations = flag('combinations') ?? false;
  const fitsPerNetwork = integer('fitsPerNetwork', 3, MAX_FITS_PER_NETWORK);
  const excludeAboveLimit = flag('excludeAboveLimit');
  if (problems.length > 0) throw EngineInputError.fromProblems(problems);
  const measured = (file: MeasuredPort | null | 'absent') => (file === 'absent' ? null : file);
  const sourceMeasured = measured(sourceFile);
  const loadMeasured = measured(loadFile);
  const result: SolveInput = {
    source,
    load,
    sourcePort: sourceMeasured?.port ?? seriesEquivalentPort(source, frequencyHz, 'source'),
    loadPort: loadMeasured?.port ?? seriesEquivalentPort(load, frequencyHz, 'load'),
    sourceMeasured,
    loadMeasured,
    frequencyHz,
    bandwidthHz,
    powerW,
    buildQuantity,
    combinations,
    objective,
    fitsPerNetwork,
    location,
    usableSrfFraction,
    excludeAboveLimit,
  };
  return result;
}
