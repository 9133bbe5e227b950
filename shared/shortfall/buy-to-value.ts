/**
 * The value purchasing buys for a short element: the standard value of the organisation's preferred
 * E-series nearest the ideal value by log distance (rf-engine.md "Standard values"; IEC 60063
 * tables), and the loss the design would have with it.
 */
import { type ESeriesName, nearestStandardValue } from '../engine/e-series.js';
import { EXACT } from '../engine/tolerance-codes.js';
import { boughtPartSpec, designLosses, type MatchDesign } from './match-design.js';

/**
 * The buy-to value: the member of `series` nearest `idealValueSi` by `|ln(ideal / standard)|`
 * (IEC 60063:2015 tables; log distance because the series is geometric). 3.9 nH in E6 buys 3.3 nH.
 * @param idealValueSi ideal C (F) or L (H), > 0
 */
export function buyToValue(idealValueSi: number, series: ESeriesName): number {
  return nearestStandardValue(idealValueSi, series);
}

/** Losses of a design with buy-to values put in, dB. */
export interface BuyToLoss {
  /** Loss at f0 with nominal values (`-10 log10 TPG`, full models of the stocked parts, bought parts ideal). */
  totalDb: number;
  /** The part of it due to the value error alone (loss resistance dropped). */
  valueErrorDb: number;
}

/**
 * The loss at f0 of `design` with the elements in `buyValues` (element index to buy-to value)
 * replaced by ideal parts of those values (exact, lossless, no parasitics: the loss the value step
 * alone costs; a real part adds its ESR and, near its SRF, a shift in effective value).
 */
export function buyToLoss(design: MatchDesign, buyValues: ReadonlyMap<number, number>): BuyToLoss {
  const replacements = new Map([...buyValues].map(([index, value]) => [index, boughtPartSpec(design.elements[index].kind, value, EXACT)]));
  const losses = designLosses(design, replacements);
  return { totalDb: losses.totalDb, valueErrorDb: losses.valueErrorDb };
}
