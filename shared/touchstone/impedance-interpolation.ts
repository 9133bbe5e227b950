/**
 * The impedance of a measured one-port at a frequency between its points.
 *
 * Interpolation is linear in the real and in the imaginary part of Z between the two neighbouring
 * points (no extrapolation):
 *
 *     t = (f - f[i]) / (f[i+1] - f[i]),   Z(f) = Z[i] + t (Z[i+1] - Z[i])
 *
 * This is a plain choice, not a physical model: it is exact at every measured point and good where
 * the points are dense compared with how fast Z turns (a measured antenna near resonance needs a
 * fine sweep; interpolate S or use a rational fit if that ever matters).
 */
import { type Complex, complex } from '../engine/complex.js';
import { EngineInputError } from '../engine/engine-input-error.js';
import { formatValue } from '../engine/value-format.js';

/** Impedance samples over frequency, as {@link readOnePortTouchstone} returns them. */
export interface ImpedanceSamples {
  /** Hz, strictly increasing. */
  frequencyHz: ArrayLike<number>;
  /** `Re Z`, ohm. */
  resistanceOhm: ArrayLike<number>;
  /** `Im Z`, ohm. */
  reactanceOhm: ArrayLike<number>;
}

/**
 * A frequency this close (relative) to the first or last point counts as that point, so that a
 * frequency typed as "868MHz" meets a file point written as 0.868 GHz despite rounding.
 */
export const RANGE_EDGE_RELATIVE = 1e-12;

const SHOWN_DIGITS = 6;

/**
 * Impedance Z (ohm) at `frequencyHz`, linear in Re Z and Im Z between the neighbouring points
 * (formula above), written into `out`.
 *
 * @throws EngineInputError (field `frequencyHz`) when the frequency is not a finite number or lies
 *   outside the samples' range; the message names the range.
 */
export function impedanceAtFrequency(samples: ImpedanceSamples, frequencyHz: number, out: Complex = complex(), field = 'frequencyHz'): Complex {
  const f = samples.frequencyHz;
  const count = f.length;
  if (count === 0) throw new EngineInputError(field, frequencyHz, 'The measured data has no points.');
  if (!Number.isFinite(frequencyHz)) {
    throw new EngineInputError(field, frequencyHz, `The frequency must be a finite number of hertz, e.g. 868e6; got ${String(frequencyHz)}.`);
  }
  const first = f[0];
  const last = f[count - 1];
  const show = (hz: number): string => formatValue(hz, 'frequency', { significantDigits: SHOWN_DIGITS });
  if (frequencyHz < first * (1 - RANGE_EDGE_RELATIVE) || frequencyHz > last * (1 + RANGE_EDGE_RELATIVE)) {
    const range = count === 1 ? `only ${show(first)}` : `${show(first)} to ${show(last)}`;
    throw new EngineInputError(
      field,
      frequencyHz,
      `${show(frequencyHz)} is outside the measured data (${range}); choose a frequency inside it or measure a wider band.`,
    );
  }
  if (frequencyHz <= first) return set(out, samples, 0);
  if (frequencyHz >= last) return set(out, samples, count - 1);
  // Largest i with f[i] <= frequencyHz.
  let low = 0;
  let high = count - 1;
  while (high - low > 1) {
    const mid = (low + high) >>> 1;
    if (f[mid] <= frequencyHz) low = mid;
    else high = mid;
  }
  const t = (frequencyHz - f[low]) / (f[high] - f[low]);
  const r = samples.resistanceOhm;
  const x = samples.reactanceOhm;
  out.re = r[low] + t * (r[high] - r[low]);
  out.im = x[low] + t * (x[high] - x[low]);
  return out;
}

function set(out: Complex, samples: ImpedanceSamples, index: number): Complex {
  out.re = samples.resistanceOhm[index];
  out.im = samples.reactanceOhm[index];
  return out;
}
