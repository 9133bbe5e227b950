/**
 * What the engine accepts as a port impedance and a frequency. Outside these ranges no L network
 * of real parts makes sense and the arithmetic would overflow, so the input is refused with a
 * clear error instead (handbook quality.md: absurd numbers get a clear error).
 */
import { type Complex } from './complex.js';
import { EngineInputError, type EngineInputProblem, quoteValue } from './engine-input-error.js';

/** Smallest port resistance, ohm (a milliohm loop antenna is still well above it). */
export const MIN_PORT_RESISTANCE_OHM = 1e-6;
/** Largest |R| or |X| of a port, ohm. */
export const MAX_PORT_MAGNITUDE_OHM = 1e9;
/** Lowest design or sweep frequency, Hz (below it element values stop being parts). */
export const MIN_FREQUENCY_HZ = 1;
/** Highest design or sweep frequency, Hz (1 THz: far above any lumped part). */
export const MAX_FREQUENCY_HZ = 1e12;

/**
 * Problems with a port impedance `R + jX`: R must be > 0 (a purely reactive or negative-resistance
 * port cannot be matched by a passive network, rf-engine.md "Inputs"), both finite and within range.
 */
export function portProblems(z: Complex, field: string): EngineInputProblem[] {
  const shown = `${quoteValue(z.re)} ${z.im < 0 ? '-' : '+'} j${quoteValue(Math.abs(z.im))} Ω`;
  if (!Number.isFinite(z.re) || !Number.isFinite(z.im)) {
    return [{ field, value: z, message: `${field}: ${shown} is not a finite impedance; write it like "12-j35" or "50"` }];
  }
  if (!(z.re > 0)) {
    return [{
      field,
      value: z,
      message: `${field}: the resistance of ${shown} must be greater than 0 Ω: a purely reactive or negative-resistance port cannot be matched by a passive network`,
    }];
  }
  if (z.re < MIN_PORT_RESISTANCE_OHM) {
    return [{ field, value: z, message: `${field}: the resistance of ${shown} is below ${MIN_PORT_RESISTANCE_OHM} Ω` }];
  }
  if (Math.abs(z.re) > MAX_PORT_MAGNITUDE_OHM || Math.abs(z.im) > MAX_PORT_MAGNITUDE_OHM) {
    return [{ field, value: z, message: `${field}: ${shown} is beyond ±${MAX_PORT_MAGNITUDE_OHM} Ω` }];
  }
  return [];
}

/** Problems with a frequency: finite, from {@link MIN_FREQUENCY_HZ} to {@link MAX_FREQUENCY_HZ}. */
export function frequencyProblems(frequencyHz: number, field: string): EngineInputProblem[] {
  if (typeof frequencyHz !== 'number' || !Number.isFinite(frequencyHz)) {
    return [{ field, value: frequencyHz, message: `${field}: ${quoteValue(frequencyHz)} is not a finite frequency; write it like "868MHz" or 8.68e8` }];
  }
  if (frequencyHz < MIN_FREQUENCY_HZ || frequencyHz > MAX_FREQUENCY_HZ) {
    return [{
      field,
      value: frequencyHz,
      message: `${field}: ${quoteValue(frequencyHz)} Hz is outside ${MIN_FREQUENCY_HZ} Hz to ${MAX_FREQUENCY_HZ} Hz; write it like "868MHz" or 8.68e8`,
    }];
  }
  return [];
}

/** Throws one {@link EngineInputError} listing every problem, if there are any. */
export function throwIfProblems(problems: readonly EngineInputProblem[]): void {
  if (problems.length > 0) throw EngineInputError.fromProblems(problems);
}
