/**
 * Source and load impedances over frequency. At f0 every model gives the entered impedance; away
 * from f0 they differ, which matters for sweeps, bandwidth and the `band` loss:
 * - `constant`: the same R + jX at every frequency (what a single entered number says literally);
 * - `series-equivalent`: R in series with the ideal L (X > 0) or C (X < 0) that has reactance X at
 *   f0, so `X(f) = X0 f/f0` or `X(f) = X0 f0/f`: a circuit that exists, the one the ngspice
 *   reference check simulates, and the engine's default for an entered impedance;
 * - `table`: measured impedance over frequency (a Touchstone one-port), interpolated linearly in
 *   R and X, held at the end values outside the measured range.
 */
import { type Complex } from './complex.js';
import { EngineInputError } from './engine-input-error.js';
import { frequencyProblems, portProblems, throwIfProblems } from './port-limits.js';

/** A port impedance as a function of frequency. */
export type PortModel =
  | { readonly model: 'constant'; readonly resistanceOhm: number; readonly reactanceOhm: number }
  | {
      readonly model: 'series-equivalent';
      readonly resistanceOhm: number;
      /** Reactance at `frequencyHz`, ohm. */
      readonly reactanceOhm: number;
      readonly frequencyHz: number;
    }
  | {
      readonly model: 'table';
      readonly frequenciesHz: Float64Array;
      readonly resistanceOhm: Float64Array;
      readonly reactanceOhm: Float64Array;
    };

/** Which model an entered impedance gets. */
export type PortModelKind = 'constant' | 'series-equivalent';

/** A port with the same impedance at every frequency. @throws EngineInputError if R <= 0 */
export function constantPort(z: Complex, field = 'port'): PortModel {
  throwIfProblems(portProblems(z, field));
  return { model: 'constant', resistanceOhm: z.re, reactanceOhm: z.im };
}

/**
 * A port realised as R in series with an ideal L or C that gives X at `frequencyHz`.
 * @throws EngineInputError if R <= 0 or the frequency is out of range
 */
export function seriesEquivalentPort(z: Complex, frequencyHz: number, field = 'port'): PortModel {
  throwIfProblems([...portProblems(z, field), ...frequencyProblems(frequencyHz, `${field}.frequencyHz`)]);
  return { model: 'series-equivalent', resistanceOhm: z.re, reactanceOhm: z.im, frequencyHz };
}

/** An entered impedance as a port of the chosen model (default `series-equivalent`). */
export function portFromImpedance(z: Complex, frequencyHz: number, kind: PortModelKind = 'series-equivalent', field = 'port'): PortModel {
  return kind === 'constant' ? constantPort(z, field) : seriesEquivalentPort(z, frequencyHz, field);
}

/**
 * A measured port: frequencies strictly ascending, R > 0 at every point.
 * @throws EngineInputError naming the first bad point
 */
export function tablePort(frequenciesHz: ArrayLike<number>, resistanceOhm: ArrayLike<number>, reactanceOhm: ArrayLike<number>, field = 'port'): PortModel {
  const n = frequenciesHz.length;
  if (n === 0 || resistanceOhm.length !== n || reactanceOhm.length !== n) {
    throw new EngineInputError(field, n, `${field}: a measured port needs at least one point and as many R and X values as frequencies`);
  }
  for (let i = 0; i < n; i++) {
    throwIfProblems([
      ...frequencyProblems(frequenciesHz[i], `${field}.frequenciesHz.${i}`),
      ...portProblems({ re: resistanceOhm[i], im: reactanceOhm[i] }, `${field}.points.${i}`),
    ]);
    if (i > 0 && !(frequenciesHz[i] > frequenciesHz[i - 1])) {
      throw new EngineInputError(`${field}.frequenciesHz.${i}`, frequenciesHz[i], `${field}: frequencies must rise strictly (point ${i})`);
    }
  }
  return {
    model: 'table',
    frequenciesHz: Float64Array.from(frequenciesHz),
    resistanceOhm: Float64Array.from(resistanceOhm),
    reactanceOhm: Float64Array.from(reactanceOhm),
  };
}

/**
 * Port impedance at `frequencyHz`, written into `out` (no allocation).
 * series-equivalent: `X(f) = X0 f/f0` for X0 > 0 (inductor), `X0 f0/f` for X0 < 0 (capacitor);
 * table: linear interpolation between the neighbouring points, end values outside the range.
 */
export function portImpedance(port: PortModel, frequencyHz: number, out: Complex): Complex {
  switch (port.model) {
    case 'constant':
      out.re = port.resistanceOhm;
      out.im = port.reactanceOhm;
      return out;
    case 'series-equivalent': {
      const x0 = port.reactanceOhm;
      out.re = port.resistanceOhm;
      out.im = x0 > 0 ? (x0 * frequencyHz) / port.frequencyHz : x0 < 0 ? (x0 * port.frequencyHz) / frequencyHz : 0;
      return out;
    }
    case 'table':
      return interpolate(port.frequenciesHz, port.resistanceOhm, port.reactanceOhm, frequencyHz, out);
  }
}

function interpolate(f: Float64Array, r: Float64Array, x: Float64Array, frequencyHz: number, out: Complex): Complex {
  const last = f.length - 1;
  if (frequencyHz <= f[0]) return setOut(out, r[0], x[0]);
  if (frequencyHz >= f[last]) return setOut(out, r[last], x[last]);
  let low = 0;
  let high = last;
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if (f[middle] <= frequencyHz) low = middle;
    else high = middle;
  }
  const t = (frequencyHz - f[low]) / (f[high] - f[low]);
  return setOut(out, r[low] + t * (r[high] - r[low]), x[low] + t * (x[high] - x[low]));
}

function setOut(out: Complex, re: number, im: number): Complex {
  out.re = re;
  out.im = im;
  return out;
}
