/**
 * A matching network as a ladder of elements from the source to the load, evaluated at one
 * frequency by ABCD cascade (rf-engine.md, "Evaluating a network"). One data shape serves ideal
 * networks, snapped fits with one or two parts per element, and the reactance-cancelling route.
 *
 * Part values can be overridden by a `values` array (C or L per part, in ladder order), which is how
 * tolerance corners and Monte Carlo samples move C and L without rebuilding anything.
 */
import { type Abcd, cascadeSeriesImpedance, cascadeShuntAdmittance, createAbcd, inputImpedance, powerWaveReflection, setIdentity, transducerPowerGain } from './abcd.js';
import { type Complex } from './complex.js';
import { EngineInputError } from './engine-input-error.js';
import type { IdealElement } from './l-network.js';
import { angularFrequency } from './part-kind.js';
import { type ElementModel, elementImpedance, elementModel, idealPart, type PartModel } from './part-model.js';
import { type PortModel, portImpedance } from './port-model.js';

/** A network ready for evaluation. */
export interface Ladder {
  /** Elements from the source to the load. */
  readonly elements: readonly ElementModel[];
  /** Every part in ladder order (element by element). */
  readonly parts: readonly PartModel[];
  /** Index of each element's first part in `parts`. */
  readonly firstPart: Int32Array;
  /** Nominal C or L of each part (F or H). */
  readonly nominalValues: Float64Array;
  /** ± tolerance amount of each part (F or H). */
  readonly toleranceValues: Float64Array;
}

/** Builds a ladder from elements listed source to load. */
export function createLadder(elements: readonly ElementModel[]): Ladder {
  const parts = elements.flatMap((e) => e.parts);
  const firstPart = new Int32Array(elements.length);
  let index = 0;
  elements.forEach((e, i) => {
    firstPart[i] = index;
    index += e.parts.length;
  });
  return {
    elements,
    parts,
    firstPart,
    nominalValues: Float64Array.from(parts, (p) => p.nominalSi),
    toleranceValues: Float64Array.from(parts, (p) => p.toleranceSi),
  };
}

/** A ladder of ideal parts (exact, lossless, no parasitics) from ideal elements. */
export function idealLadder(elements: readonly IdealElement[]): Ladder {
  return createLadder(elements.map((e) => elementModel(e.position, 'single', [idealPart(e.kind, e.value)])));
}

const scratchZ: Complex = { re: 0, im: 0 };
const scratchZs: Complex = { re: 0, im: 0 };
const scratchZl: Complex = { re: 0, im: 0 };
const scratchAbcd: Abcd = createAbcd();

/**
 * The ladder's ABCD matrix at `omega`, written into `out`: series elements `[[1, Z], [0, 1]]`,
 * shunt elements `[[1, 0], [1/Z, 1]]`, multiplied from the source to the load.
 */
export function ladderAbcd(ladder: Ladder, omegaRadPerS: number, out: Abcd, values: ArrayLike<number> | null = null, lossless = false): Abcd {
  setIdentity(out);
  const elements = ladder.elements;
  for (let i = 0; i < elements.length; i++) {
    const element = elements[i];
    const z = elementImpedance(element, omegaRadPerS, scratchZ, values, ladder.firstPart[i], lossless);
    if (element.position === 'series') cascadeSeriesImpedance(out, z.re, z.im);
    else {
      const d = z.re * z.re + z.im * z.im;
      cascadeShuntAdmittance(out, z.re / d, -z.im / d);
    }
  }
  return out;
}

/**
 * TPG of the ladder between `source` and `load` at `frequencyHz` (no allocation):
 * `TPG = 4 Rs RL / |A ZL + B + C Zs ZL + D Zs|^2`.
 * @param values C/L per part (null: nominal); @param lossless drop loss resistance, keep parasitics
 */
export function ladderTpg(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequencyHz: number,
  values: ArrayLike<number> | null = null,
  lossless = false,
): number {
  const m = ladderAbcd(ladder, angularFrequency(frequencyHz), scratchAbcd, values, lossless);
  const zs = portImpedance(source, frequencyHz, scratchZs);
  const zl = portImpedance(load, frequencyHz, scratchZl);
  return transducerPowerGain(m, zs.re, zs.im, zl.re, zl.im);
}

/** Everything the product shows about a network at one frequency (a mutable `out` record). */
export interface ResponsePoint {
  frequencyHz: number;
  tpg: number;
  /** Input impedance seen by the source, ohm. */
  zinRe: number;
  zinIm: number;
  /** Power-wave reflection coefficient at the source. */
  gammaRe: number;
  gammaIm: number;
  gammaMagnitude: number;
}

/** A fresh {@link ResponsePoint} to pass as `out`. */
export function createResponsePoint(): ResponsePoint {
  return { frequencyHz: 0, tpg: 0, zinRe: 0, zinIm: 0, gammaRe: 0, gammaIm: 0, gammaMagnitude: 0 };
}

const scratchZin: Complex = { re: 0, im: 0 };
const scratchGamma: Complex = { re: 0, im: 0 };

/**
 * TPG, Zin `(A ZL + B)/(C ZL + D)` and power-wave reflection `(Zin - conj Zs)/(Zin + Zs)` at one
 * frequency, written into `out` (rf-engine.md, "Evaluating a network").
 */
export function ladderResponse(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequencyHz: number,
  out: ResponsePoint = createResponsePoint(),
  values: ArrayLike<number> | null = null,
  lossless = false,
): ResponsePoint {
  const m = ladderAbcd(ladder, angularFrequency(frequencyHz), scratchAbcd, values, lossless);
  const zs = portImpedance(source, frequencyHz, scratchZs);
  const zl = portImpedance(load, frequencyHz, scratchZl);
  const zin = inputImpedance(m, zl.re, zl.im, scratchZin);
  const gamma = powerWaveReflection(zin.re, zin.im, zs.re, zs.im, scratchGamma);
  out.frequencyHz = frequencyHz;
  out.tpg = transducerPowerGain(m, zs.re, zs.im, zl.re, zl.im);
  out.zinRe = zin.re;
  out.zinIm = zin.im;
  out.gammaRe = gamma.re;
  out.gammaIm = gamma.im;
  out.gammaMagnitude = Math.hypot(gamma.re, gamma.im);
  return out;
}

/** Checks a `values` array against a ladder (length and finite, positive entries). */
export function checkValues(ladder: Ladder, values: ArrayLike<number>, field = 'values'): void {
  if (values.length !== ladder.parts.length) {
    throw new EngineInputError(field, values.length, `${field}: expected ${ladder.parts.length} values (one per part), got ${values.length}`);
  }
  for (let i = 0; i < values.length; i++) {
    if (!(values[i] > 0) || !Number.isFinite(values[i])) {
      throw new EngineInputError(`${field}.${i}`, values[i], `${field}.${i}: a part value must be finite and > 0, got ${values[i]}`);
    }
  }
}
