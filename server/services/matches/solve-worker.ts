/**
 * A solve thread (piscina worker, started by solve-pool.ts): snaps one checked request to the stock
 * of one location. Each thread keeps the stock index per location under the fingerprint the main
 * thread read it with (load-stock-index.ts), so the parts cross to a thread only when that thread
 * has not yet indexed that very stock: it answers `need-stock`, and the pool sends the task again
 * with the parts.
 */
import { isEngineInputError, type EngineInputProblem } from '../../../shared/engine/engine-input-error.js';
import type { SolveInput } from '../../../shared/engine/solve-request.js';
import { snapMatch, type SnapMatchOptions, type SnappedSolveResponse, type SnapSettings } from '../../../shared/snapping/snap-match.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import { buildStockIndex, type StockIndex } from '../../../shared/snapping/stock-index.js';

/** One solve as the pool hands it over (structured-cloned: plain data and typed arrays only). */
export interface SolveTask {
  input: SolveInput;
  settings: SnapSettings;
  options: SnapMatchOptions;
  /** The location the stock was read for ('' for all), and the fingerprint of those rows. */
  stockKey: string;
  fingerprint: string;
  /** The parts, sent only after this thread answered `need-stock`. */
  parts?: SnapPart[];
}

/** What a thread answers. */
export type SolveOutcome =
  | { kind: 'solved'; response: SnappedSolveResponse }
  | { kind: 'need-stock' }
  /** The engine refused the request (an error's class does not survive the thread boundary). */
  | { kind: 'input-error'; message: string; details: readonly EngineInputProblem[] };

/** Locations whose index a thread keeps (as the main thread's cache). */
const KEPT_STOCKS = 16;
const stocks = new Map<string, { fingerprint: string; index: StockIndex }>();

export default function solve(task: SolveTask): SolveOutcome {
  let stock = stocks.get(task.stockKey);
  if (!stock || stock.fingerprint !== task.fingerprint) {
    if (!task.parts) return { kind: 'need-stock' };
    stock = { fingerprint: task.fingerprint, index: buildStockIndex(task.parts) };
  }
  // Most recently used last.
  stocks.delete(task.stockKey);
  stocks.set(task.stockKey, stock);
  while (stocks.size > KEPT_STOCKS) stocks.delete(stocks.keys().next().value!);
  try {
    return { kind: 'solved', response: snapMatch(task.input, stock.index, task.settings, task.options) };
  } catch (error) {
    if (isEngineInputError(error)) return { kind: 'input-error', message: error.message, details: error.details };
    throw error;
  }
}
