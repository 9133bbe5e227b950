/** The public face of a part (api.md `GET /api/parts` item) and the raw row it is read from. */
import { Decimal } from 'decimal.js';
import type { PartItem, PartKind, Tolerance } from '../../../shared/api/stock.js';

/** A `parts` row as raw SQL returns it (snake_case; NUMERIC as a string). */
export interface PartRow {
  id: number;
  part_number: string;
  location: string;
  kind: PartKind;
  value_si: number;
  tolerance_kind: Tolerance['mode'];
  tolerance_value: number;
  srf_hz: number | null;
  q: number | null;
  q_frequency_hz: number | null;
  esr_ohm: number | null;
  quantity: number;
  reserved: number;
  package: string | null;
  voltage_rating_v: number | null;
  current_rating_a: number | null;
  series: string | null;
  unit_cost: string | null;
  manufacturer_part: string | null;
  description: string | null;
}

/** The columns of {@link PartRow}, for SELECT lists. */
export const PART_ROW_COLUMNS =
  'id, part_number, location, kind, value_si, tolerance_kind, tolerance_value, srf_hz, q, q_frequency_hz, esr_ohm, ' +
  'quantity, reserved, package, voltage_rating_v, current_rating_a, series, unit_cost, manufacturer_part, description';

/** A money string in its shortest exact form: `"0.0120"` -> `"0.012"`, `"3.0000"` -> `"3"`. */
export function canonicalMoney(text: string | null): string | null {
  return text === null ? null : new Decimal(text).toFixed();
}

/** `available = quantity - reserved`, never below zero (an import may count fewer than are reserved). */
export function availableOf(quantity: number, reserved: number): number {
  return Math.max(0, quantity - reserved);
}

/** The API item for one row. */
export function presentPart(row: PartRow): PartItem {
  return {
    id: row.id,
    partNumber: row.part_number,
    kind: row.kind,
    value: row.value_si,
    tolerance: toleranceOf(row.tolerance_kind, row.tolerance_value),
    srfHz: row.srf_hz,
    q: row.q,
    qFrequencyHz: row.q_frequency_hz,
    esrOhm: row.esr_ohm,
    quantity: row.quantity,
    reserved: row.reserved,
    available: availableOf(row.quantity, row.reserved),
    package: row.package,
    voltageRating: row.voltage_rating_v,
    currentRating: row.current_rating_a,
    location: row.location,
    series: row.series,
    unitCost: canonicalMoney(row.unit_cost),
    manufacturerPart: row.manufacturer_part,
    description: row.description,
  };
}

/** The engine's tolerance from the two stored columns. */
export function toleranceOf(mode: Tolerance['mode'], amount: number): Tolerance {
  return mode === 'relative' ? { mode, fraction: amount } : { mode, deltaSi: amount };
}
