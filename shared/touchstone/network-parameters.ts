/**
 * Conversions between network parameters for the Touchstone reader and writer.
 *
 * One-ports: reflection `S` at a real reference `R0` and impedance `Z` (ohm).
 * Two-ports: a {@link TwoPortMatrix} holds any 2x2 complex matrix (ABCD, S, Z or Y) row by row,
 * `[p11re, p11im, p12re, p12im, p21re, p21im, p22re, p22im]`. For ABCD that is
 * `[Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim]`, the layout the engine's ABCD cascade uses.
 *
 * Source of every two-port formula: D. M. Pozar, Microwave Engineering, 4th ed. (Wiley, 2012),
 * section 4.4, Table 4.2 "Conversions between two-port network parameters", with the same
 * characteristic impedance Z0 at both ports. The one-port formulas are the definition of the
 * reflection coefficient (Pozar 4th ed., eq. 2.35, `Gamma = (ZL - Z0) / (ZL + Z0)`).
 */
import {
  type Complex,
  complex,
  divideComplex,
  multiplyComplex,
  setComplex,
  subtractComplex,
} from '../engine/complex.js';

/** A 2x2 complex matrix, row by row: `[p11re, p11im, p12re, p12im, p21re, p21im, p22re, p22im]`. */
export type TwoPortMatrix = Float64Array;

/** Number of doubles in a {@link TwoPortMatrix}. */
export const TWO_PORT_MATRIX_LENGTH = 8;

/** A new zero {@link TwoPortMatrix}. */
export function createTwoPortMatrix(): TwoPortMatrix {
  return new Float64Array(TWO_PORT_MATRIX_LENGTH);
}

/**
 * Impedance of a one-port from its reflection coefficient:
 * `Z = R0 (1 + S) / (1 - S)` (ohm; S dimensionless; R0 the real reference in ohm).
 * Pozar 4th ed., eq. 2.35 solved for ZL. `S = 1` (an open circuit) gives an infinite or NaN result:
 * callers check.
 */
export function impedanceFromReflection(s: Complex, referenceOhm: number, out: Complex): Complex {
  const numerator = complex(referenceOhm * (1 + s.re), referenceOhm * s.im);
  const denominator = complex(1 - s.re, -s.im);
  return divideComplex(numerator, denominator, out);
}

/**
 * Reflection coefficient of an impedance Z (ohm) against a real reference R0 (ohm):
 * `S = (Z - R0) / (Z + R0)` (dimensionless). Pozar 4th ed., eq. 2.35.
 */
export function reflectionFromImpedance(z: Complex, referenceOhm: number, out: Complex): Complex {
  const numerator = complex(z.re - referenceOhm, z.im);
  const denominator = complex(z.re + referenceOhm, z.im);
  return divideComplex(numerator, denominator, out);
}

function element(m: ArrayLike<number>, index: number): Complex {
  return complex(m[2 * index], m[2 * index + 1]);
}

function store(out: TwoPortMatrix, index: number, value: Complex): void {
  out[2 * index] = value.re;
  out[2 * index + 1] = value.im;
}

const P11 = 0;
const P12 = 1;
const P21 = 2;
const P22 = 3;

/**
 * S-parameters of a two-port from its ABCD matrix, both ports at the real reference Z0 (ohm):
 *
 *     Δ   = A + B/Z0 + C Z0 + D
 *     S11 = (A + B/Z0 - C Z0 - D) / Δ
 *     S12 = 2 (A D - B C) / Δ
 *     S21 = 2 / Δ
 *     S22 = (-A + B/Z0 - C Z0 + D) / Δ
 *
 * Pozar, Microwave Engineering, 4th ed., Table 4.2 (column "ABCD", rows S11 to S22).
 * A and D are dimensionless, B in ohm, C in siemens; S dimensionless. Written into `out`.
 *
 * @throws RangeError when Δ = 0 (no passive network has that; it means the matrix is not a two-port's)
 */
export function abcdToScattering(abcd: ArrayLike<number>, referenceOhm: number, out: TwoPortMatrix = createTwoPortMatrix()): TwoPortMatrix {
  const a = element(abcd, P11);
  const bOverZ0 = element(abcd, P12);
  bOverZ0.re /= referenceOhm;
  bOverZ0.im /= referenceOhm;
  const cZ0 = element(abcd, P21);
  cZ0.re *= referenceOhm;
  cZ0.im *= referenceOhm;
  const d = element(abcd, P22);
  const delta = complex(a.re + bOverZ0.re + cZ0.re + d.re, a.im + bOverZ0.im + cZ0.im + d.im);
  if (delta.re === 0 && delta.im === 0) {
    throw new RangeError('abcdToScattering: A + B/Z0 + C Z0 + D is zero, so the matrix has no S-parameters');
  }
  const t = complex();
  store(out, P11, divideComplex(setComplex(t, a.re + bOverZ0.re - cZ0.re - d.re, a.im + bOverZ0.im - cZ0.im - d.im), delta, t));
  const ad = multiplyComplex(a, d, complex());
  const bc = multiplyComplex(element(abcd, P12), element(abcd, P21), complex());
  const determinant = subtractComplex(ad, bc, complex());
  store(out, P12, divideComplex(setComplex(t, 2 * determinant.re, 2 * determinant.im), delta, t));
  store(out, P21, divideComplex(setComplex(t, 2, 0), delta, t));
  store(out, P22, divideComplex(setComplex(t, -a.re + bOverZ0.re - cZ0.re + d.re, -a.im + bOverZ0.im - cZ0.im + d.im), delta, t));
  return out;
}

/**
 * ABCD matrix of a two-port from its S-parameters at the real reference Z0 (ohm):
 *
 *     A = ((1 + S11)(1 - S22) + S12 S21) / (2 S21)
 *     B = Z0 ((1 + S11)(1 + S22) - S12 S21) / (2 S21)
 *     C = (1/Z0) ((1 - S11)(1 - S22) - S12 S21) / (2 S21)
 *     D = ((1 - S11)(1 + S22) + S12 S21) / (2 S21)
 *
 * Pozar, Microwave Engineering, 4th ed., Table 4.2 (column "S", rows A to D). Written into `out`.
 *
 * @throws RangeError when S21 = 0 (a network that passes nothing forward has no ABCD matrix)
 */
export function scatteringToAbcd(s: ArrayLike<number>, referenceOhm: number, out: TwoPortMatrix = createTwoPortMatrix()): TwoPortMatrix {
  const s11 = element(s, P11);
  const s12 = element(s, P12);
  const s21 = element(s, P21);
  const s22 = element(s, P22);
  if (s21.re === 0 && s21.im === 0) throw new RangeError('scatteringToAbcd: S21 is zero, so the network has no ABCD matrix');
  const onePlus11 = complex(1 + s11.re, s11.im);
  const oneMinus11 = complex(1 - s11.re, -s11.im);
  const onePlus22 = complex(1 + s22.re, s22.im);
  const oneMinus22 = complex(1 - s22.re, -s22.im);
  const s12s21 = multiplyComplex(s12, s21, complex());
  const twoS21 = complex(2 * s21.re, 2 * s21.im);
  const t = complex();
  const term = (x: Complex, y: Complex, sign: 1 | -1, scale: number): Complex => {
    multiplyComplex(x, y, t);
    setComplex(t, scale * (t.re + sign * s12s21.re), scale * (t.im + sign * s12s21.im));
    return divideComplex(t, twoS21, t);
  };
  store(out, P11, term(onePlus11, oneMinus22, 1, 1));
  store(out, P12, term(onePlus11, onePlus22, -1, referenceOhm));
  store(out, P21, term(oneMinus11, oneMinus22, -1, 1 / referenceOhm));
  store(out, P22, term(oneMinus11, onePlus22, 1, 1));
  return out;
}

/**
 * S-parameters of a two-port from its Z-parameters (ohm) at the real reference Z0 (ohm):
 *
 *     ΔZ  = (Z11 + Z0)(Z22 + Z0) - Z12 Z21
 *     S11 = ((Z11 - Z0)(Z22 + Z0) - Z12 Z21) / ΔZ
 *     S12 = 2 Z12 Z0 / ΔZ
 *     S21 = 2 Z21 Z0 / ΔZ
 *     S22 = ((Z11 + Z0)(Z22 - Z0) - Z12 Z21) / ΔZ
 *
 * Pozar, Microwave Engineering, 4th ed., Table 4.2 (column "Z"). Written into `out`.
 */
export function impedanceToScattering(z: ArrayLike<number>, referenceOhm: number, out: TwoPortMatrix = createTwoPortMatrix()): TwoPortMatrix {
  return immittanceToScattering(z, referenceOhm, 1, out);
}

/**
 * S-parameters of a two-port from its Y-parameters (siemens) at the real reference Z0 (ohm),
 * with `Y0 = 1/Z0`:
 *
 *     ΔY  = (Y11 + Y0)(Y22 + Y0) - Y12 Y21
 *     S11 = ((Y0 - Y11)(Y0 + Y22) + Y12 Y21) / ΔY
 *     S12 = -2 Y12 Y0 / ΔY
 *     S21 = -2 Y21 Y0 / ΔY
 *     S22 = ((Y0 + Y11)(Y0 - Y22) + Y12 Y21) / ΔY
 *
 * Pozar, Microwave Engineering, 4th ed., Table 4.2 (column "Y"). Written into `out`.
 */
export function admittanceToScattering(y: ArrayLike<number>, referenceOhm: number, out: TwoPortMatrix = createTwoPortMatrix()): TwoPortMatrix {
  return immittanceToScattering(y, 1 / referenceOhm, -1, out);
}

/**
 * The Z and Y rows of Pozar's Table 4.2 are one formula: with `P` the matrix, `P0` the reference
 * (Z0 for Z, Y0 for Y) and `k = +1` for Z, `-1` for Y, `S11 = k ((P11 - P0)(P22 + P0) - P12 P21) / Δ`,
 * `S12 = 2 k P12 P0 / Δ`, `S21 = 2 k P21 P0 / Δ`, `S22 = k ((P11 + P0)(P22 - P0) - P12 P21) / Δ`.
 */
function immittanceToScattering(p: ArrayLike<number>, reference: number, sign: 1 | -1, out: TwoPortMatrix): TwoPortMatrix {
  const p11 = element(p, P11);
  const p12 = element(p, P12);
  const p21 = element(p, P21);
  const p22 = element(p, P22);
  const p12p21 = multiplyComplex(p12, p21, complex());
  const p11Plus = complex(p11.re + reference, p11.im);
  const p11Minus = complex(p11.re - reference, p11.im);
  const p22Plus = complex(p22.re + reference, p22.im);
  const p22Minus = complex(p22.re - reference, p22.im);
  const delta = subtractComplex(multiplyComplex(p11Plus, p22Plus, complex()), p12p21, complex());
  const t = complex();
  const scaled = (value: Complex, factor: number): Complex => divideComplex(setComplex(t, factor * value.re, factor * value.im), delta, t);
  store(out, P11, scaled(subtractComplex(multiplyComplex(p11Minus, p22Plus, complex()), p12p21, complex()), sign));
  store(out, P12, scaled(p12, 2 * sign * reference));
  store(out, P21, scaled(p21, 2 * sign * reference));
  store(out, P22, scaled(subtractComplex(multiplyComplex(p11Plus, p22Minus, complex()), p12p21, complex()), sign));
  return out;
}
