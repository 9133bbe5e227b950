/**
 * Bandwidth: the frequencies either side of the TPG peak where TPG has fallen 1 dB or 3 dB below it,
 * found on a sweep and refined by bisection (rf-engine.md, "Bandwidth").
 */
import { type Ladder, ladderTpg } from './ladder.js';
import type { PortModel } from './port-model.js';

/** The edges for one drop. */
export interface BandEdges {
  /** How far below the peak, dB (1 or 3). */
  dropDb: number;
  /** Lower edge, Hz; null when TPG stays above the level down to the sweep's first frequency. */
  lowHz: number | null;
  /** Upper edge, Hz; null when TPG stays above the level up to the sweep's last frequency. */
  highHz: number | null;
  /** `highHz - lowHz`, or null when an edge lies outside the sweep. */
  widthHz: number | null;
}

/** The 1 dB and 3 dB edges and the peak they are measured from. */
export interface Bandwidth {
  peakTpg: number;
  peakFrequencyHz: number;
  oneDb: BandEdges;
  threeDb: BandEdges;
}

/** Bisection stops when the bracket is this small relative to the frequency (about 50 iterations). */
const BISECTION_RELATIVE = 1e-12;
const MAX_BISECTIONS = 200;

/**
 * Edges at `peak - dropDb` from a sweep (`tpg` measured at `frequenciesHz`), each bracket refined by
 * bisection on `TPG(f) - level` with `level = peak 10^(-drop/10)`.
 */
export function bandEdges(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequenciesHz: ArrayLike<number>,
  tpg: ArrayLike<number>,
  dropDb: number,
  values: ArrayLike<number> | null = null,
  lossless = false,
): BandEdges {
  const peakIndex = indexOfMax(tpg);
  const level = tpg[peakIndex] * 10 ** (-dropDb / 10);
  const refine = (below: number, above: number) => {
    // `below` has TPG < level, `above` TPG >= level.
    let lo = below;
    let hi = above;
    for (let i = 0; i < MAX_BISECTIONS && Math.abs(hi - lo) > BISECTION_RELATIVE * Math.abs(hi); i++) {
      const middle = 0.5 * (lo + hi);
      if (ladderTpg(ladder, source, load, middle, values, lossless) < level) lo = middle;
      else hi = middle;
    }
    return 0.5 * (lo + hi);
  };
  let lowHz: number | null = null;
  for (let i = peakIndex; i > 0; i--) {
    if (tpg[i - 1] < level) {
      lowHz = refine(frequenciesHz[i - 1], frequenciesHz[i]);
      break;
    }
  }
  let highHz: number | null = null;
  for (let i = peakIndex; i < tpg.length - 1; i++) {
    if (tpg[i + 1] < level) {
      highHz = refine(frequenciesHz[i + 1], frequenciesHz[i]);
      break;
    }
  }
  return { dropDb, lowHz, highHz, widthHz: lowHz !== null && highHz !== null ? highHz - lowHz : null };
}

/** Both the 1 dB and the 3 dB bandwidth from one sweep (see {@link bandEdges}). */
export function bandwidth(
  ladder: Ladder,
  source: PortModel,
  load: PortModel,
  frequenciesHz: ArrayLike<number>,
  tpg: ArrayLike<number>,
  values: ArrayLike<number> | null = null,
  lossless = false,
): Bandwidth {
  const peakIndex = indexOfMax(tpg);
  return {
    peakTpg: tpg[peakIndex],
    peakFrequencyHz: frequenciesHz[peakIndex],
    oneDb: bandEdges(ladder, source, load, frequenciesHz, tpg, 1, values, lossless),
    threeDb: bandEdges(ladder, source, load, frequenciesHz, tpg, 3, values, lossless),
  };
}

function indexOfMax(values: ArrayLike<number>): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (values[i] > values[best]) best = i;
  return best;
}
