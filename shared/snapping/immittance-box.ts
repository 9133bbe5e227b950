/**
 * Bounds over boxes of the complex plane, for the snapper's branch and bound:
 * - the TPG bound of an element whose TPG is `M / |E - c|^2` (a disc around `c` in the element's own
 *   plane: impedance for a series element, admittance for a shunt element alone);
 * - the bounding box of `1/z` over a box (two parts in parallel add admittances, two in series add
 *   impedances: a sum box in one plane is carried to the other this way);
 * - the distance from a point to the wedge `R >= kappa |X|` every stocked element lies in.
 *
 * `M / |E - c|^2` follows from the ABCD form of TPG (rf-engine.md "Evaluating a network"): with one
 * element E and everything else fixed, `A ZL + B + C Zs ZL + D Zs` is affine in E, `alpha + beta E`,
 * so `TPG = 4 Rs RL / |beta|^2 / |E + alpha/beta|^2`.
 */

/**
 * Squared distance from `(cRe, cIm)` to the box `[reLo, reHi] x [imLo, imHi]`:
 * `dx^2 + dy^2` with `dx = max(reLo - cRe, 0, cRe - reHi)` and likewise `dy`.
 */
export function boxDistanceSquared(cRe: number, cIm: number, reLo: number, reHi: number, imLo: number, imHi: number): number {
  const dx = cRe < reLo ? reLo - cRe : cRe > reHi ? cRe - reHi : 0;
  const dy = cIm < imLo ? imLo - cIm : cIm > imHi ? cIm - imHi : 0;
  return dx * dx + dy * dy;
}

/** Relative widening of every inverted box: covers rounding in `1/z` so the bound stays a bound. */
const INVERSION_SLACK = 1e-12;

function consider(out: Float64Array, r: number, x: number): void {
  const d = r * r + x * x;
  const g = r / d;
  const b = -x / d;
  if (g < out[0]) out[0] = g;
  if (g > out[1]) out[1] = g;
  if (b < out[2]) out[2] = b;
  if (b > out[3]) out[3] = b;
}

/** The critical points of the edge `r = const` inside `(imLo, imHi)`: `x = 0` and `x = ±r`. */
function considerEdgeR(out: Float64Array, r: number, imLo: number, imHi: number): void {
  if (r !== 0 && 0 > imLo && 0 < imHi) consider(out, r, 0);
  if (r !== 0 && r > imLo && r < imHi) consider(out, r, r);
  if (r !== 0 && -r > imLo && -r < imHi) consider(out, r, -r);
}

/** The critical point of the edge `x = const` inside `(reLo, reHi)`: `r = |x|`. */
function considerEdgeX(out: Float64Array, x: number, reLo: number, reHi: number): void {
  const r = Math.abs(x);
  if (r > reLo && r < reHi) consider(out, r, x);
}

/**
 * Bounding box of `{1/z : z in [reLo, reHi] x [imLo, imHi]}` into `out = [reLo', reHi', imLo', imHi']`,
 * for a box with `reLo >= 0`. `1/z = (r - jx)/(r^2 + x^2)` is holomorphic away from 0, so its real and
 * imaginary parts are harmonic and take their extremes on the box's edges; along an edge each is a
 * one-variable function whose extremes are at the ends or at its critical points: on `r = const`,
 * `r/(r^2+x^2)` peaks at `x = 0` and `-x/(r^2+x^2)` at `x = ±r`; on `x = const`, `r/(r^2+x^2)` peaks
 * at `r = |x|` and `-x/(r^2+x^2)` is monotone. Every such point is evaluated. A box holding 0 maps to
 * the whole plane (infinite box).
 */
export function invertBox(reLo: number, reHi: number, imLo: number, imHi: number, out: Float64Array): Float64Array {
  if (reLo <= 0 && reHi >= 0 && imLo <= 0 && imHi >= 0) {
    out[0] = -Infinity;
    out[1] = Infinity;
    out[2] = -Infinity;
    out[3] = Infinity;
    return out;
  }
  out[0] = Infinity;
  out[1] = -Infinity;
  out[2] = Infinity;
  out[3] = -Infinity;
  consider(out, reLo, imLo);
  consider(out, reLo, imHi);
  consider(out, reHi, imLo);
  consider(out, reHi, imHi);
  // Unrolled (no array literals): this runs for every box the combination searches visit.
  considerEdgeR(out, reLo, imLo, imHi);
  if (reHi !== reLo) considerEdgeR(out, reHi, imLo, imHi);
  considerEdgeX(out, imLo, reLo, reHi);
  if (imHi !== imLo) considerEdgeX(out, imHi, reLo, reHi);
  const widenRe = INVERSION_SLACK * Math.max(Math.abs(out[0]), Math.abs(out[1]));
  const widenIm = INVERSION_SLACK * Math.max(Math.abs(out[2]), Math.abs(out[3]));
  out[0] -= widenRe;
  out[1] += widenRe;
  out[2] -= widenIm;
  out[3] += widenIm;
  return out;
}

/**
 * Squared distance from the point `(R, X) = (-fixedResistanceOhm, targetReactanceOhm)` to the wedge
 * `{R >= kappa s X, s X >= 0}` (s = +1 for inductors, -1 for capacitors) that holds every series
 * element of one kind whose parts all satisfy `R >= kappa |X|` (singles; series pairs since R and X
 * add; parallel pairs since `G >= kappa |B|` adds and `R/|X| = G/|B|`). With `t = s X_target` and
 * `Rf = fixedResistanceOhm > 0`, the nearest point is on the ray `R = kappa t'`,
 * `t' = max(0, (t - kappa Rf)/(1 + kappa^2))`, so `d^2 = (kappa t' + Rf)^2 + (t' - t)^2`.
 */
export function wedgeDistanceSquared(fixedResistanceOhm: number, targetReactanceOhm: number, sign: 1 | -1, kappa: number): number {
  const t = sign * targetReactanceOhm;
  const tNear = Math.max(0, (t - kappa * fixedResistanceOhm) / (1 + kappa * kappa));
  const dr = kappa * tNear + fixedResistanceOhm;
  const dt = tNear - t;
  return dr * dr + dt * dt;
}
