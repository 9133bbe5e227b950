/**
 * Power check (rf-engine.md): with the source's available power P, its open-circuit peak voltage is
 * `Vs = sqrt(8 P Rs)` (available power `|Vs|^2 / (8 Rs)` for a peak phasor). The network is solved
 * at f0 for the peak voltage across each capacitor and the RMS current in each inductor, and each is
 * compared with the part's rating. Ratings in stock lists are DC figures: RF use needs margin
 * (heating from ESR, dielectric stress at RF), so "within rating" is not "safe".
 */
import { type Complex, complex, divideComplex, magnitude, multiplyComplex } from './complex.js';
import { EngineInputError } from './engine-input-error.js';
import type { Ladder } from './ladder.js';
import { angularFrequency, type PartKind } from './part-kind.js';
import { elementImpedance, partImpedance } from './part-model.js';
import { type PortModel, portImpedance } from './port-model.js';

/** Largest power the check accepts, W (1 MW: far beyond chip parts). */
export const MAX_POWER_W = 1e6;

/** Stress on one part at f0. */
export interface PartStress {
  elementIndex: number;
  partIndex: number;
  kind: PartKind;
  partNumber: string | null;
  /** Peak voltage across the part's terminals, V. */
  peakVoltageV: number;
  /** RMS current: through the terminals of a capacitor, through the winding (L + R branch) of an inductor, A. */
  rmsCurrentA: number;
  /** The rating it is compared with: V for a capacitor, A for an inductor; null when not given. */
  rating: number | null;
  /** Stress over rating (peak V over V rating, RMS A over A rating); null without a rating. */
  ratingRatio: number | null;
  overRating: boolean;
}

/** The result of {@link powerCheck}. */
export interface PowerCheck {
  powerW: number;
  /** `sqrt(8 P Rs)`, V. */
  sourcePeakVoltageV: number;
  parts: PartStress[];
  anyOverRating: boolean;
  /** Parts with no rating to compare against. */
  unratedParts: number;
}

/**
 * Solves the ladder at `frequencyHz` for every part's voltage and current with available power
 * `powerW` (W) from `source`. Walks from the load (V = 1, I = V/ZL) to the source: a series Z gives
 * `V += I Z`, a shunt Y gives `I += Y V`; then scales everything so that `|V + I Zs| = sqrt(8 P Rs)`.
 * Inductor current is the winding current `V / (R + j w L)` (what heats the wire), RMS = peak/sqrt(2).
 */
export function powerCheck(ladder: Ladder, source: PortModel, load: PortModel, frequencyHz: number, powerW: number): PowerCheck {
  if (!Number.isFinite(powerW) || !(powerW > 0) || powerW > MAX_POWER_W) {
    throw new EngineInputError('powerW', powerW, `powerW: ${powerW} W must be a finite power greater than 0 and at most ${MAX_POWER_W} W; write it like "100mW" or 0.1`);
  }
  const omega = angularFrequency(frequencyHz);
  const zs = portImpedance(source, frequencyHz, complex());
  const zl = portImpedance(load, frequencyHz, complex());
  const voltage = complex(1, 0);
  const current = divideComplex(voltage, zl, complex());
  const elementVoltage: Complex[] = [];
  const elementCurrent: Complex[] = [];
  const z = complex();
  const t = complex();
  for (let i = ladder.elements.length - 1; i >= 0; i--) {
    const element = ladder.elements[i];
    elementImpedance(element, omega, z, null, ladder.firstPart[i]);
    if (element.position === 'series') {
      multiplyComplex(current, z, t);
      elementVoltage[i] = complex(t.re, t.im);
      elementCurrent[i] = complex(current.re, current.im);
      voltage.re += t.re;
      voltage.im += t.im;
    } else {
      divideComplex(voltage, z, t);
      elementVoltage[i] = complex(voltage.re, voltage.im);
      elementCurrent[i] = complex(t.re, t.im);
      current.re += t.re;
      current.im += t.im;
    }
  }
  multiplyComplex(current, zs, t);
  const openCircuit = magnitude(complex(voltage.re + t.re, voltage.im + t.im));
  const sourcePeakVoltageV = Math.sqrt(8 * powerW * zs.re);
  const scale = sourcePeakVoltageV / openCircuit;

  const parts: PartStress[] = [];
  ladder.elements.forEach((element, elementIndex) => {
    element.parts.forEach((part, partIndex) => {
      const zPart = partImpedance(part, omega, complex());
      let v: Complex;
      let iTerminal: Complex;
      if (element.arrangement === 'parallel') {
        v = elementVoltage[elementIndex];
        iTerminal = divideComplex(v, zPart, complex());
      } else {
        iTerminal = elementCurrent[elementIndex];
        v = element.arrangement === 'single' ? elementVoltage[elementIndex] : multiplyComplex(iTerminal, zPart, complex());
      }
      const winding = part.kind === 'inductor' && part.cpF > 0 ? divideComplex(v, complex(part.lossOhm, omega * part.nominalSi), complex()) : iTerminal;
      const peakVoltageV = magnitude(v) * scale;
      const rmsCurrentA = (magnitude(winding) * scale) / Math.SQRT2;
      const rating = part.kind === 'capacitor' ? part.voltageRatingV : part.currentRatingA;
      const stress = part.kind === 'capacitor' ? peakVoltageV : rmsCurrentA;
      const ratingRatio = rating === null ? null : stress / rating;
      parts.push({
        elementIndex,
        partIndex,
        kind: part.kind,
        partNumber: part.partNumber,
        peakVoltageV,
        rmsCurrentA,
        rating,
        ratingRatio,
        overRating: ratingRatio !== null && ratingRatio > 1,
      });
    });
  });
  return {
    powerW,
    sourcePeakVoltageV,
    parts,
    anyOverRating: parts.some((p) => p.overRating),
    unratedParts: parts.filter((p) => p.rating === null).length,
  };
}
