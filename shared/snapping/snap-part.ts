/**
 * The stocked parts the snapper reads: the fields of an api.md part item (`GET /api/parts`) that
 * matter for a match, and their conversion to the engine's part models (rf-engine.md "Part models").
 */
import type { PartItem } from '../api/stock.js';
import { partModel, type PartModel } from '../engine/part-model.js';

/** A stocked part as the snapper needs it (SI units; `available` is on hand minus reserved). */
export type SnapPart = Pick<
  PartItem,
  | 'id'
  | 'partNumber'
  | 'kind'
  | 'value'
  | 'tolerance'
  | 'srfHz'
  | 'q'
  | 'qFrequencyHz'
  | 'esrOhm'
  | 'available'
  | 'voltageRating'
  | 'currentRating'
  | 'location'
  | 'unitCost'
> &
  Partial<Pick<PartItem, 'package' | 'series' | 'quantity' | 'reserved' | 'manufacturerPart' | 'description'>>;

/**
 * The engine model of a stocked part (rf-engine.md "Part models": ESL or Cp from SRF,
 * `ESL = 1/((2 pi SRF)^2 C)`, `Cp = 1/((2 pi SRF)^2 L)`; loss from ESR, else from Q at fq).
 * @throws EngineInputError naming `part <partNumber>.<field>` when the stored part is not a valid model
 */
export function snapPartModel(part: SnapPart): PartModel {
  return partModel(
    {
      kind: part.kind,
      valueSi: part.value,
      tolerance: part.tolerance,
      srfHz: part.srfHz,
      esrOhm: part.esrOhm,
      q: part.q,
      qFrequencyHz: part.qFrequencyHz,
      voltageRatingV: part.voltageRating,
      currentRatingA: part.currentRating,
      partNumber: part.partNumber,
    },
    `part ${part.partNumber}`,
  );
}

/** Money steps of a unit cost: stock-csv.md keeps 4 decimal places. */
export const COST_STEPS_PER_UNIT = 10_000;

/**
 * Unit cost for ranking as a whole number of 1/10,000 of the currency unit (`"0.0125"` -> 125), so
 * sums are exact and compare without rounding; unknown cost is Infinity (ranks last).
 */
export function unitCostForRanking(unitCost: string | null): number {
  if (unitCost === null) return Infinity;
  const value = Number(unitCost);
  return Number.isFinite(value) ? Math.round(value * COST_STEPS_PER_UNIT) : Infinity;
}
