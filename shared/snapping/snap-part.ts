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

/** Unit cost as a number for ranking (`"0.0125"` -> 0.0125); unknown cost ranks last (Infinity). */
export function unitCostForRanking(unitCost: string | null): number {
  if (unitCost === null) return Infinity;
  const value = Number(unitCost);
  return Number.isFinite(value) ? value : Infinity;
}
