/**
 * The losses of a fit, all in dB and >= 0 (rf-engine.md, "Losses of a fit"):
 * - `valueError`: `-10 log10 TPG` at f0, nominal values, lossless models (parasitics kept);
 * - `total`: the same with full models; `dissipative = total - valueError`;
 * - `worstCase`: the largest `total` over all 2^k tolerance corners;
 * - `band`: the largest `total` across the band at nominal values.
 */
import { lossDb } from './abcd.js';
import { EngineInputError } from './engine-input-error.js';
import { type Ladder, ladderTpg } from './ladder.js';
import { frequencyProblems, throwIfProblems } from './port-limits.js';
import type { PortModel } from './port-model.js';
import { cornerCount, cornerValues } from './tolerance.js';

/** A frequency band, Hz. */
export interface Band {
  lowHz: number;
  highHz: number;
}

/** Points of the band grid used for `band` loss (ends included). */
export const DEFAULT_BAND_POINTS = 101;

/** The losses of one fit. */
export interface FitLosses {
  valueErrorDb: number;
  /** `total - valueError`, floored at 0: loss resistance that happens to improve a mismatch counts as no loss. */
  dissipativeDb: number;
  totalDb: number;
  worstCaseDb: number;
  /** Null when no band was given. */
  bandDb: number | null;
  /** TPG at f0 with nominal values and full models. */
  tpg: number;
  /** Which corner gave `worstCaseDb` (bit i set: part i at +tolerance). */
  worstCorner: number;
}

/** The worst corner: its loss (dB) and index. */
export interface WorstCorner {
  lossDb: number;
  corner: number;
}

/**
 * The largest full-model loss at `frequencyHz` over all `2^k` tolerance corners, each part at
 * nominal ± tolerance (an absolute tolerance applies as is). `scratch` holds k values (reused).
 */
export function worstCaseLoss(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequencyHz: number,
  scratch: Float64Array = new Float64Array(ladder.parts.length),
): WorstCorner {
  const count = cornerCount(ladder.parts.length);
  let worstTpg = Infinity;
  let worst = 0;
  for (let corner = 0; corner < count; corner++) {
    const tpg = ladderTpg(ladder, source, load, frequencyHz, cornerValues(ladder, corner, scratch), false);
    if (tpg < worstTpg) {
      worstTpg = tpg;
      worst = corner;
    }
  }
  return { lossDb: lossDb(worstTpg), corner: worst };
}

/**
 * The largest full-model loss over `points` evenly spaced frequencies from `band.lowHz` to
 * `band.highHz` (ends included), at nominal values unless `values` says otherwise.
 */
export function bandLoss(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  band: Band,
  points = DEFAULT_BAND_POINTS,
  values: ArrayLike<number> | null = null,
): number {
  checkBand(band);
  let worstTpg = Infinity;
  const step = points > 1 ? (band.highHz - band.lowHz) / (points - 1) : 0;
  for (let i = 0; i < points; i++) {
    const f = i === points - 1 ? band.highHz : band.lowHz + i * step;
    const tpg = ladderTpg(ladder, source, load, f, values, false);
    if (tpg < worstTpg) worstTpg = tpg;
  }
  return lossDb(worstTpg);
}

/** Checks a band: both edges valid frequencies and `lowHz <= highHz`. */
export function checkBand(band: Band, field = 'band'): void {
  throwIfProblems([...frequencyProblems(band.lowHz, `${field}.lowHz`), ...frequencyProblems(band.highHz, `${field}.highHz`)]);
  if (!(band.highHz >= band.lowHz)) {
    throw new EngineInputError(`${field}.highHz`, band.highHz, `${field}: the upper edge ${band.highHz} Hz is below the lower edge ${band.lowHz} Hz`);
  }
}

/** The band `f0 ± bandwidth/2` of a request's `bandwidthHz`. */
export function bandAround(frequencyHz: number, bandwidthHz: number): Band {
  return { lowHz: frequencyHz - bandwidthHz / 2, highHz: frequencyHz + bandwidthHz / 2 };
}

/** Loss floor: `-10 log10` of a TPG a hair above 1 from rounding reads as 0, not -1e-15. */
function nonNegative(db: number): number {
  return db > 0 ? db : 0;
}

/**
 * Every loss of rf-engine.md for one fit at `frequencyHz`, plus the band loss when `band` is given.
 */
export function fitLosses(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequencyHz: number,
  band: Band | null = null,
  bandPoints = DEFAULT_BAND_POINTS,
): FitLosses {
  const valueError = nonNegative(lossDb(ladderTpg(ladder, source, load, frequencyHz, null, true)));
  const tpg = ladderTpg(ladder, source, load, frequencyHz, null, false);
  const total = nonNegative(lossDb(tpg));
  const worst = worstCaseLoss(ladder, source, load, frequencyHz);
  return {
    valueErrorDb: valueError,
    dissipativeDb: nonNegative(total - valueError),
    totalDb: total,
    worstCaseDb: nonNegative(worst.lossDb),
    bandDb: band ? nonNegative(bandLoss(ladder, source, load, band, bandPoints)) : null,
    tpg,
    worstCorner: worst.corner,
  };
}
