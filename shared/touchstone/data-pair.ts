/**
 * One complex value as a Touchstone data pair (Touchstone File Format Specification Version 2.0,
 * IBIS Open Forum, 2009, section "Option Line", `<format>`):
 * - `RI`: `a + j b`;
 * - `MA`: `a (cos b + j sin b)`, `b` in degrees;
 * - `DB`: `10^(a/20) (cos b + j sin b)`, `a = 20 log10 |value|`, `b` in degrees.
 */
import { type Complex } from '../engine/complex.js';
import type { DataFormat } from './touchstone-option-line.js';

const RADIANS_PER_DEGREE = Math.PI / 180;
const DEGREES_PER_RADIAN = 180 / Math.PI;
/** dB of a voltage-like ratio: `20 log10`. */
const DB_PER_DECADE = 20;

/**
 * Turns a pair as written in a file into a complex number, written into `out`.
 * Units are those of the parameter (1 for S, ohm or normalised for Z, siemens or normalised for Y).
 */
export function decodeDataPair(format: DataFormat, first: number, second: number, out: Complex): Complex {
  if (format === 'RI') {
    out.re = first;
    out.im = second;
    return out;
  }
  const magnitude = format === 'MA' ? first : Math.pow(10, first / DB_PER_DECADE);
  const angleRad = second * RADIANS_PER_DEGREE;
  out.re = magnitude * Math.cos(angleRad);
  out.im = magnitude * Math.sin(angleRad);
  return out;
}

/**
 * Turns a complex value into the pair a file holds in `format`: `[re, im]`, `[|v|, arg v in deg]`
 * or `[20 log10 |v|, arg v in deg]`. A zero value has no dB form: the caller must not ask for one
 * (the writers check and refuse with a clear message).
 */
export function encodeDataPair(format: DataFormat, re: number, im: number): [number, number] {
  if (format === 'RI') return [re, im];
  const magnitude = Math.hypot(re, im);
  const angleDeg = Math.atan2(im, re) * DEGREES_PER_RADIAN;
  return format === 'MA' ? [magnitude, angleDeg] : [DB_PER_DECADE * Math.log10(magnitude), angleDeg];
}
