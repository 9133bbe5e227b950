/**
 * A reopened saved match shown as a solve answer: its one ideal network with the chosen fit, as
 * saved, the cautions product.md asks for, and notes on what has changed in the stock since.
 */
import type { SolveResponse } from '../../../shared/api/matches.js';
import { cautionsFor, isEngineInputError, parseSolveRequest } from '../../../shared/engine/index.js';
import type { SavedMatch, StockChange } from './saved-match.js';

/** One sentence on a changed part. */
export function stockChangeNote(change: StockChange): string {
  switch (change.change) {
    case 'gone':
      return `${change.partNumber} is no longer in the stock list.`;
    case 'changed':
      return `${change.partNumber} has a different value, tolerance, SRF or loss in the stock list now; the figures below are as saved.`;
    case 'short':
      return `${change.partNumber} no longer has enough available for the build quantity.`;
  }
}

/**
 * The saved match as the results view reads a solve answer. Cautions come from the engine
 * (shared/engine/cautions.ts) with the saved network's node Q and, when a power was given, the
 * largest peak voltage on its elements.
 */
export function savedMatchView(detail: SavedMatch): SolveResponse {
  let powerW: number | null = null;
  try {
    powerW = parseSolveRequest(detail.request).powerW;
  } catch (error: unknown) {
    if (!isEngineInputError(error)) throw error;
  }
  const peaks = detail.network.elements.flatMap((element) => (element.stress ? [element.stress.peakVoltageV] : []));
  return {
    networks: [{ ...detail.network, fits: [detail.fit] }],
    infeasible: [],
    cautions: cautionsFor({ maxNodeQ: detail.network.nodeQ, powerW, maxPeakVoltageV: peaks.length > 0 ? Math.max(...peaks) : null }),
    notes: detail.stockChanges.map(stockChangeNote),
  };
}
