/**
 * One way to fill an element from stock: a single part, or two parts of one kind in series
 * (impedances add) or in parallel (admittances add) (rf-engine.md "Part models", "Two parts as one
 * element"). The immittance of an option at f0 is computed here once, so the fast search and the
 * exhaustive reference search evaluate every option with the very same arithmetic.
 */
import type { Complex } from '../engine/complex.js';
import type { Arrangement } from '../engine/part-kind.js';
import type { KindCandidates } from './kind-candidates.js';

/** Arrangement code of one part. */
export const SINGLE = 0;
/** Arrangement code of two parts in series (impedances add). */
export const SERIES_PAIR = 1;
/** Arrangement code of two parts in parallel (admittances add). */
export const PARALLEL_PAIR = 2;
/** One of {@link SINGLE}, {@link SERIES_PAIR}, {@link PARALLEL_PAIR}. */
export type ArrangementCode = 0 | 1 | 2;

/** The api.md name of an arrangement code. */
export const ARRANGEMENT_NAMES: readonly Arrangement[] = ['single', 'series', 'parallel'];

/** Which plane an immittance is in: impedance `R + jX` or admittance `G + jB`. */
export type Plane = 'Z' | 'Y';

/** An option: candidate indices into one {@link KindCandidates}; `second` is -1 for a single part, else `first <= second`. */
export interface SnapOption {
  arrangement: ArrangementCode;
  first: number;
  second: number;
}

/**
 * The option's immittance at f0 in `plane`, into `out`: single `Z_i` (or `Y_i`); series pair
 * `Z = Z_i + Z_j`, `Y = 1/Z`; parallel pair `Y = Y_i + Y_j`, `Z = 1/Y` (ohm or siemens).
 */
export function optionImmittance(c: KindCandidates, arrangement: ArrangementCode, first: number, second: number, plane: Plane, out: Complex): Complex {
  if (arrangement === SINGLE) {
    out.re = plane === 'Z' ? c.zRe[first] : c.yRe[first];
    out.im = plane === 'Z' ? c.zIm[first] : c.yIm[first];
    return out;
  }
  const additive: Plane = arrangement === SERIES_PAIR ? 'Z' : 'Y';
  const re = additive === 'Z' ? c.zRe[first] + c.zRe[second] : c.yRe[first] + c.yRe[second];
  const im = additive === 'Z' ? c.zIm[first] + c.zIm[second] : c.yIm[first] + c.yIm[second];
  if (additive === plane) {
    out.re = re;
    out.im = im;
  } else {
    const d = re * re + im * im;
    out.re = re / d;
    out.im = -im / d;
  }
  return out;
}

/** Tier of an option: the highest tier of its parts. */
export function optionTier(c: KindCandidates, option: SnapOption): number {
  return option.second < 0 ? c.tier[option.first] : Math.max(c.tier[option.first], c.tier[option.second]);
}

/** Every option of a candidate set: singles, and with `combinations` every pair `i <= j` in series and in parallel (`i = j` only when stock covers both uses). */
export function allOptions(c: KindCandidates, combinations: boolean): SnapOption[] {
  const options: SnapOption[] = [];
  for (let i = 0; i < c.count; i++) options.push({ arrangement: SINGLE, first: i, second: -1 });
  if (!combinations) return options;
  for (const arrangement of [SERIES_PAIR, PARALLEL_PAIR] as const) {
    for (let i = 0; i < c.count; i++) {
      for (let j = i; j < c.count; j++) {
        if (i === j && !c.canDouble[i]) continue;
        options.push({ arrangement, first: i, second: j });
      }
    }
  }
  return options;
}
