/**
 * ABCD (chain) matrices and the port quantities computed from them (handbook rf-engine.md,
 * "Evaluating a network"; D. M. Pozar, Microwave Engineering, 4th ed., table 4.1 for the element
 * matrices and section 2.12 / 4.4 for the power gains).
 *
 * A matrix is a `Float64Array(8)`: `[Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim]`. Cascading multiplies
 * on the right, element by element from the source to the load, in place.
 */
import { type Complex } from './complex.js';
import type { Placement } from './part-kind.js';

/** An ABCD matrix: `[Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim]`. */
export type Abcd = Float64Array;

/** A new identity ABCD matrix. */
export function createAbcd(): Abcd {
  return setIdentity(new Float64Array(8));
}

/** Sets `m` to the identity `[[1, 0], [0, 1]]`. */
export function setIdentity(m: Abcd): Abcd {
  m.fill(0);
  m[0] = 1;
  m[6] = 1;
  return m;
}

/**
 * `m = m [[1, Z], [0, 1]]`: a series impedance Z (ohm) after m. So `B += A Z`, `D += C Z`.
 */
export function cascadeSeriesImpedance(m: Abcd, zRe: number, zIm: number): Abcd {
  const aRe = m[0];
  const aIm = m[1];
  const cRe = m[4];
  const cIm = m[5];
  m[2] += aRe * zRe - aIm * zIm;
  m[3] += aRe * zIm + aIm * zRe;
  m[6] += cRe * zRe - cIm * zIm;
  m[7] += cRe * zIm + cIm * zRe;
  return m;
}

/**
 * `m = m [[1, 0], [Y, 1]]`: a shunt admittance Y (siemens) after m. So `A += B Y`, `C += D Y`.
 */
export function cascadeShuntAdmittance(m: Abcd, yRe: number, yIm: number): Abcd {
  const bRe = m[2];
  const bIm = m[3];
  const dRe = m[6];
  const dIm = m[7];
  m[0] += bRe * yRe - bIm * yIm;
  m[1] += bRe * yIm + bIm * yRe;
  m[4] += dRe * yRe - dIm * yIm;
  m[5] += dRe * yIm + dIm * yRe;
  return m;
}

/**
 * Transducer power gain between source Zs and load ZL:
 * `TPG = 4 Rs RL / |A ZL + B + C Zs ZL + D Zs|^2` (rf-engine.md; dimensionless, 0..1 for passive m).
 */
export function transducerPowerGain(m: Abcd, zsRe: number, zsIm: number, zlRe: number, zlIm: number): number {
  const zszlRe = zsRe * zlRe - zsIm * zlIm;
  const zszlIm = zsRe * zlIm + zsIm * zlRe;
  const re = m[0] * zlRe - m[1] * zlIm + m[2] + (m[4] * zszlRe - m[5] * zszlIm) + (m[6] * zsRe - m[7] * zsIm);
  const im = m[0] * zlIm + m[1] * zlRe + m[3] + (m[4] * zszlIm + m[5] * zszlRe) + (m[6] * zsIm + m[7] * zsRe);
  return (4 * zsRe * zlRe) / (re * re + im * im);
}

/** Input impedance with load ZL: `Zin = (A ZL + B) / (C ZL + D)`, ohm, written into `out`. */
export function inputImpedance(m: Abcd, zlRe: number, zlIm: number, out: Complex): Complex {
  const nRe = m[0] * zlRe - m[1] * zlIm + m[2];
  const nIm = m[0] * zlIm + m[1] * zlRe + m[3];
  const dRe = m[4] * zlRe - m[5] * zlIm + m[6];
  const dIm = m[4] * zlIm + m[5] * zlRe + m[7];
  const d = dRe * dRe + dIm * dIm;
  out.re = (nRe * dRe + nIm * dIm) / d;
  out.im = (nIm * dRe - nRe * dIm) / d;
  return out;
}

/**
 * Power-wave reflection coefficient seen by the source:
 * `G = (Zin - conj(Zs)) / (Zin + Zs)` (K. Kurokawa, "Power waves and the scattering matrix",
 * IEEE Trans. MTT 13(2), 1965; rf-engine.md). `1 - |G|^2` equals TPG for a lossless network.
 */
export function powerWaveReflection(zinRe: number, zinIm: number, zsRe: number, zsIm: number, out: Complex): Complex {
  const nRe = zinRe - zsRe;
  const nIm = zinIm + zsIm;
  const dRe = zinRe + zsRe;
  const dIm = zinIm + zsIm;
  const d = dRe * dRe + dIm * dIm;
  out.re = (nRe * dRe + nIm * dIm) / d;
  out.im = (nIm * dRe - nRe * dIm) / d;
  return out;
}

/** Return loss `-20 log10 |G|`, dB (Infinity for a perfect match). */
export function returnLossDb(gammaMagnitude: number): number {
  return -20 * Math.log10(gammaMagnitude);
}

/** Mismatch loss `-10 log10 (1 - |G|^2)`, dB. */
export function mismatchLossDb(gammaMagnitude: number): number {
  return -10 * Math.log10(1 - gammaMagnitude * gammaMagnitude);
}

/** Voltage standing wave ratio `(1 + |G|) / (1 - |G|)` (Infinity at |G| = 1). */
export function vswr(gammaMagnitude: number): number {
  return (1 + gammaMagnitude) / (1 - gammaMagnitude);
}

/** A power ratio as a loss, `-10 log10 TPG`, dB (>= 0 for TPG <= 1). */
export function lossDb(tpg: number): number {
  return -10 * Math.log10(tpg);
}

/**
 * TPG of a two-element L network from plain numbers, for the snapper's inner loop (no allocation):
 * series impedance `Zser` and shunt admittance `Ysh` (0 + j0 for an absent element), placed as
 * `placement` says. `shunt-at-load` is `[[1 + Z Y, Z], [Y, 1]]`, `shunt-at-source` is
 * `[[1, Z], [Y, 1 + Y Z]]`; then {@link transducerPowerGain}'s formula.
 */
export function twoElementTpg(
  placement: Placement,
  zsRe: number,
  zsIm: number,
  zlRe: number,
  zlIm: number,
  seriesRe: number,
  seriesIm: number,
  shuntRe: number,
  shuntIm: number,
): number {
  const zyRe = seriesRe * shuntRe - seriesIm * shuntIm;
  const zyIm = seriesRe * shuntIm + seriesIm * shuntRe;
  let aRe = 1;
  let aIm = 0;
  let dRe = 1;
  let dIm = 0;
  if (placement === 'shunt-at-load') {
    aRe += zyRe;
    aIm += zyIm;
  } else {
    dRe += zyRe;
    dIm += zyIm;
  }
  const zszlRe = zsRe * zlRe - zsIm * zlIm;
  const zszlIm = zsRe * zlIm + zsIm * zlRe;
  const re = aRe * zlRe - aIm * zlIm + seriesRe + (shuntRe * zszlRe - shuntIm * zszlIm) + (dRe * zsRe - dIm * zsIm);
  const im = aRe * zlIm + aIm * zlRe + seriesIm + (shuntRe * zszlIm + shuntIm * zszlRe) + (dRe * zsIm + dIm * zsRe);
  return (4 * zsRe * zlRe) / (re * re + im * im);
}

/** Terms of {@link seriesSearchTerms}: `TPG = numerator / ((fixedResistanceOhm + Rser)^2 + (Xser - targetReactanceOhm)^2)`. */
export interface SeriesSearchTerms {
  /** The series reactance that maximises TPG for this shunt element, ohm. */
  targetReactanceOhm: number;
  /** Port resistance plus the resistance the shunt node presents, ohm. */
  fixedResistanceOhm: number;
  /** `4 Rfar R' G/(G + Gsh)`, ohm^2. */
  numerator: number;
}

/**
 * For a fixed shunt admittance Ysh, TPG as a function of the series impedance `Rser + jXser`
 * (derived here from power bookkeeping, checked against the ABCD cascade in the tests):
 * with the near port N (load for shunt-at-load, source for shunt-at-source) and far port F,
 * `Z' = R' + jX' = 1 / (YN + Ysh)`, then
 * `TPG = 4 RF R' (GN / (GN + Gsh)) / ((RF + R' + Rser)^2 + (XF + X' + Xser)^2)`.
 * So TPG depends on Xser only through `|Xser - X*|` with `X* = -(XF + X')`, and loss resistance
 * `Rser >= 0` can only lower it: the bound the snapper's outward search uses (rf-engine.md,
 * "Snapping"; by reciprocity the shunt-at-source case is the mirror).
 */
export function seriesSearchTerms(
  placement: Placement,
  zsRe: number,
  zsIm: number,
  zlRe: number,
  zlIm: number,
  shuntRe: number,
  shuntIm: number,
  out: SeriesSearchTerms,
): SeriesSearchTerms {
  const nearRe = placement === 'shunt-at-load' ? zlRe : zsRe;
  const nearIm = placement === 'shunt-at-load' ? zlIm : zsIm;
  const farRe = placement === 'shunt-at-load' ? zsRe : zlRe;
  const farIm = placement === 'shunt-at-load' ? zsIm : zlIm;
  const m2 = nearRe * nearRe + nearIm * nearIm;
  const gNear = nearRe / m2;
  const yRe = gNear + shuntRe;
  const yIm = -nearIm / m2 + shuntIm;
  const y2 = yRe * yRe + yIm * yIm;
  const rPrime = yRe / y2;
  const xPrime = -yIm / y2;
  out.targetReactanceOhm = -(farIm + xPrime);
  out.fixedResistanceOhm = farRe + rPrime;
  out.numerator = (4 * farRe * rPrime * gNear) / yRe;
  return out;
}
