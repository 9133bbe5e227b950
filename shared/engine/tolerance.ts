/**
 * Tolerance corners: every part at its nominal value plus or minus its tolerance, all 2^k
 * combinations for k parts (rf-engine.md, `worstCase`). Tolerance moves C or L only.
 */
import type { Ladder } from './ladder.js';

/** A value may not be pushed below this fraction of nominal (an absolute ±0.25 pF on 0.2 pF). */
export const MIN_VALUE_FRACTION = 0.01;
/** Corner enumeration stops here (2^16 corners): a two-element fit has at most 4 parts. */
export const MAX_CORNER_PARTS = 16;

/** Number of tolerance corners for k parts: `2^k`. */
export function cornerCount(partCount: number): number {
  if (!Number.isInteger(partCount) || partCount < 0 || partCount > MAX_CORNER_PARTS) {
    throw new RangeError(`cornerCount: ${partCount} parts is outside 0 to ${MAX_CORNER_PARTS}`);
  }
  return 2 ** partCount;
}

/** `v` kept at or above {@link MIN_VALUE_FRACTION} of nominal. */
export function clampValue(valueSi: number, nominalSi: number): number {
  const floor = MIN_VALUE_FRACTION * nominalSi;
  return valueSi < floor ? floor : valueSi;
}

/**
 * The part values of corner `index` into `out`: bit i of `index` set puts part i at
 * `nominal + tolerance`, clear at `nominal - tolerance` (clamped by {@link clampValue}).
 */
export function cornerValues(ladder: Ladder, index: number, out: Float64Array = new Float64Array(ladder.parts.length)): Float64Array {
  const nominal = ladder.nominalValues;
  const delta = ladder.toleranceValues;
  for (let i = 0; i < nominal.length; i++) {
    const sign = (index >>> i) & 1 ? 1 : -1;
    out[i] = clampValue(nominal[i] + sign * delta[i], nominal[i]);
  }
  return out;
}
