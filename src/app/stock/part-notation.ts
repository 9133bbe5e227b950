/**
 * How the stock screens write part data: engineering notation with SI prefixes and units (the RF
 * engine's formatter, so screens and reports agree), tolerances as IEC 60062 style `±5 %` or
 * `±0.1 pF`, losses as Q at its test frequency or as ESR.
 */
import { formatValue } from '../../../shared/engine/value-format.js';
import { formatTolerance } from '../../../shared/engine/tolerance-codes.js';
import type { PartItem, PartKind, Tolerance } from '../../../shared/api/stock.js';

/** A dash for "not given", so empty cells read as deliberate. */
export const NOT_GIVEN = '—';

/** Below these the trade still writes pF and nH (0.5 pF, not 500 fF). */
const SMALLEST_PREFIXED = { capacitance: { limitSi: 1e-12, unit: 'pF' }, inductance: { limitSi: 1e-9, unit: 'nH' } } as const;

/** The nominal value of a part: `4.7 pF`, `12 nH`, `0.5 pF`. */
export function partValueText(kind: PartKind, valueSi: number): string {
  const quantity = kind === 'capacitor' ? 'capacitance' : 'inductance';
  const { limitSi, unit } = SMALLEST_PREFIXED[quantity];
  if (valueSi > 0 && valueSi < limitSi) return `${Number((valueSi / limitSi).toPrecision(4))} ${unit}`;
  return formatValue(valueSi, quantity);
}

/** A loss resistance in ohms as datasheets write ESR: `0.3 Ω`, `1.36 Ω`. */
export function resistanceText(resistanceOhm: number): string {
  return resistanceOhm >= 1000 ? formatValue(resistanceOhm, 'resistance', { significantDigits: 3 }) : `${Number(resistanceOhm.toPrecision(3))} Ω`;
}

/** A tolerance: `±5 %`, `±0.25 pF`, `±0.2 nH`. */
export function toleranceText(kind: PartKind, tolerance: Tolerance): string {
  return formatTolerance(tolerance, kind);
}

/** A frequency (`6.2 GHz`), or a dash when unknown. */
export function frequencyText(frequencyHz: number | null): string {
  return frequencyHz === null ? NOT_GIVEN : formatValue(frequencyHz, 'frequency', { significantDigits: 3 });
}

/** The loss the part list gives: ESR when given (it wins over Q), else `Q 40 @ 500 MHz`, else a dash. */
export function lossText(part: Pick<PartItem, 'esrOhm' | 'q' | 'qFrequencyHz'>): string {
  if (part.esrOhm !== null) return `ESR ${resistanceText(part.esrOhm)}`;
  if (part.q !== null && part.qFrequencyHz !== null) return `Q ${Number(part.q.toPrecision(3))} @ ${frequencyText(part.qFrequencyHz)}`;
  return NOT_GIVEN;
}

/** The rating that applies to the kind: a capacitor's voltage (`50 V`), an inductor's current (`300 mA`). */
export function ratingText(part: Pick<PartItem, 'kind' | 'voltageRating' | 'currentRating'>): string {
  if (part.kind === 'capacitor') return part.voltageRating === null ? NOT_GIVEN : formatValue(part.voltageRating, 'voltage', { significantDigits: 3 });
  return part.currentRating === null ? NOT_GIVEN : formatValue(part.currentRating, 'current', { significantDigits: 3 });
}

/** A unit cost as the exact decimal string the API sends, or a dash. */
export function unitCostText(unitCost: string | null): string {
  return unitCost ?? NOT_GIVEN;
}

/** One changed field of an import, in the words and units of the stock list. */
export function changedFieldText(kind: PartKind, field: string, value: unknown): string {
  if (value === null || value === undefined) return NOT_GIVEN;
  switch (field) {
    case 'value':
      return partValueText(kind, value as number);
    case 'tolerance':
      return toleranceText(kind, value as Tolerance);
    case 'srfHz':
    case 'qFrequencyHz':
      return frequencyText(value as number);
    case 'esrOhm':
      return resistanceText(value as number);
    case 'voltageRating':
      return formatValue(value as number, 'voltage', { significantDigits: 3 });
    case 'currentRating':
      return formatValue(value as number, 'current', { significantDigits: 3 });
    default:
      return String(value);
  }
}

/** Field names as a person reads them. */
export const FIELD_LABELS: Readonly<Record<string, string>> = {
  kind: 'kind',
  value: 'value',
  tolerance: 'tolerance',
  srfHz: 'SRF',
  q: 'Q',
  qFrequencyHz: 'Q frequency',
  esrOhm: 'ESR',
  package: 'package',
  voltageRating: 'voltage rating',
  currentRating: 'current rating',
  series: 'series',
  unitCost: 'unit cost',
  manufacturerPart: 'manufacturer part',
  description: 'description',
};
