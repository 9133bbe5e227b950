/**
 * The arithmetic behind the match's Smith chart: impedances normalised to a reference resistance,
 * mapped to the reflection plane, and the path a network takes from the load to what the source
 * sees, element by element. Pure functions on the engine's complex math (shared/engine/complex.ts);
 * the component only draws what these return.
 *
 * The chart's geometry is P. H. Smith's, "Transmission line calculator", Electronics 12 (1939): for a
 * real reference Z0, `Gamma = (z - 1)/(z + 1)` with `z = Z/Z0`; constant-resistance circles have centre
 * `(r/(1+r), 0)` and radius `1/(1+r)`, constant-reactance circles centre `(1, 1/x)` and radius `1/|x|`.
 */
import {
  type Complex,
  addComplex,
  complex,
  conjugateComplex,
  divideComplex,
  invertComplex,
} from '../../../shared/engine/index.js';
import type { ElementKind, ElementPosition } from '../../../shared/api/matches.js';

/** Points drawn per element along its arc. */
export const POINTS_PER_ELEMENT = 30;

/** An element as the chart needs it: where it sits and its reactance at f0. */
export interface SmithElement {
  position: ElementPosition;
  /** Reactance X at f0, ohm (a shunt element's admittance is `1/(jX)`). */
  reactanceOhm: number;
}

/** One element's arc on the chart. */
export interface SmithArc {
  position: ElementPosition;
  /** Impedances along the arc, normalised to Z0, from the load side of the element to its source side. */
  impedances: Complex[];
  /** The same points as reflection coefficients `(z - 1)/(z + 1)`. */
  reflections: Complex[];
}

/** The whole path of a network and its end points. */
export interface SmithPath {
  /** The load, normalised. */
  load: Complex;
  /** What the source sees through the network, normalised (the end of the last arc). */
  end: Complex;
  /** Arcs in the order the path walks them: from the load toward the source. */
  arcs: SmithArc[];
}

/** `z = Z / Z0` for a real reference resistance Z0 (ohm). */
export function normalisedImpedance(impedanceOhm: Complex, referenceOhm: number): Complex {
  return complex(impedanceOhm.re / referenceOhm, impedanceOhm.im / referenceOhm);
}

/** Reflection coefficient of a normalised impedance: `Gamma = (z - 1)/(z + 1)` (Smith 1939). */
export function reflectionOf(z: Complex): Complex {
  return divideComplex(complex(z.re - 1, z.im), complex(z.re + 1, z.im), complex());
}

/**
 * The reactance at f0 of a C or an L: `X = -1/(w C)` or `X = w L`, with `w = 2 pi f0`.
 * @param valueSi C in F or L in H; @param frequencyHz f0 in Hz; @returns X in ohm
 */
export function reactanceAt(kind: ElementKind, valueSi: number, frequencyHz: number): number {
  const omega = 2 * Math.PI * frequencyHz;
  return kind === 'capacitor' ? -1 / (omega * valueSi) : omega * valueSi;
}

/**
 * The path from the load to the source through a ladder whose elements are listed source to load
 * (api.md `elements` order). Walking from the load, a series element adds `j t x` to z
 * (a constant-resistance arc) and a shunt element adds `j t b` to `y = 1/z` with `b = -Z0/X`
 * (a constant-conductance arc), for t from 0 to 1 in `pointsPerElement` steps.
 * @param loadOhm ZL in ohm; @param referenceOhm Z0 in ohm (> 0)
 */
export function smithPath(
  loadOhm: Complex,
  elements: readonly SmithElement[],
  referenceOhm: number,
  pointsPerElement = POINTS_PER_ELEMENT,
): SmithPath {
  if (!(referenceOhm > 0) || !Number.isFinite(referenceOhm)) {
    throw new Error(`smithPath: the reference resistance must be a finite number above 0 Ω, got ${referenceOhm}.`);
  }
  if (!Number.isInteger(pointsPerElement) || pointsPerElement < 2) {
    throw new Error(`smithPath: pointsPerElement must be a whole number of at least 2, got ${pointsPerElement}.`);
  }
  const load = normalisedImpedance(loadOhm, referenceOhm);
  let z = complex(load.re, load.im);
  const arcs: SmithArc[] = [];
  for (const element of [...elements].reverse()) {
    const impedances: Complex[] = [];
    if (element.position === 'series') {
      const x = element.reactanceOhm / referenceOhm;
      for (let i = 0; i < pointsPerElement; i++) {
        const t = i / (pointsPerElement - 1);
        impedances.push(addComplex(z, complex(0, t * x), complex()));
      }
    } else {
      const b = -referenceOhm / element.reactanceOhm;
      const y = invertComplex(z, complex());
      for (let i = 0; i < pointsPerElement; i++) {
        const t = i / (pointsPerElement - 1);
        impedances.push(invertComplex(addComplex(y, complex(0, t * b), complex()), complex()));
      }
    }
    arcs.push({ position: element.position, impedances, reflections: impedances.map(reflectionOf) });
    z = impedances[impedances.length - 1];
  }
  return { load, end: z, arcs };
}

/** The point a conjugate match reaches: `conj(Zs)/Z0`. */
export function matchTarget(sourceOhm: Complex, referenceOhm: number): Complex {
  return normalisedImpedance(conjugateComplex(sourceOhm, complex()), referenceOhm);
}

/** A circle in the reflection plane (unit circle = |Gamma| = 1). */
export interface PlaneCircle {
  centre: Complex;
  radius: number;
}

/** The constant-resistance circle of normalised resistance r >= 0: centre `(r/(1+r), 0)`, radius `1/(1+r)`. */
export function resistanceCircle(r: number): PlaneCircle {
  return { centre: complex(r / (1 + r), 0), radius: 1 / (1 + r) };
}

/** The constant-reactance circle of normalised reactance x != 0: centre `(1, 1/x)`, radius `1/|x|`. */
export function reactanceCircle(x: number): PlaneCircle {
  return { centre: complex(1, 1 / x), radius: 1 / Math.abs(x) };
}
