/**
 * What a fit reports per element (rf-engine.md, "Snapping": parts, arrangement, nominal and
 * effective value at f0, f0/SRF and flags), computed from the element model.
 */
import { angularFrequency, type PartKind } from './part-kind.js';
import {
  DEFAULT_USABLE_SRF_FRACTION,
  type ElementModel,
  effectiveValue,
  elementImpedance,
  frequencyStatus,
  type PartModel,
} from './part-model.js';

/** Flags a part or an element can carry from its model alone (stock and rating flags come from elsewhere). */
export type ModelFlag = 'above-limit' | 'limit-unknown' | 'loss-unknown';

/**
 * A part's model flags at `frequencyHz`: `limit-unknown` without SRF, `above-limit` between
 * `usableFraction x SRF` and SRF, `loss-unknown` without ESR or Q. (At or above SRF a part is never
 * used as its kind: callers exclude it; see {@link frequencyStatus}.)
 */
export function partFlags(part: PartModel, frequencyHz: number, usableFraction = DEFAULT_USABLE_SRF_FRACTION): ModelFlag[] {
  const flags: ModelFlag[] = [];
  const status = frequencyStatus(part, frequencyHz, usableFraction);
  if (status === 'above-limit') flags.push('above-limit');
  if (status === 'limit-unknown') flags.push('limit-unknown');
  if (!part.lossKnown) flags.push('loss-unknown');
  return flags;
}

/**
 * The element's value from nominal part values: capacitors in parallel and inductors in series add
 * (`C1 + C2`, `L1 + L2`); capacitors in series and inductors in parallel combine reciprocally
 * (`1/(1/C1 + 1/C2)`, `1/(1/L1 + 1/L2)`).
 */
export function combinedNominalValue(element: ElementModel): number {
  const [first, second] = element.parts;
  if (element.arrangement === 'single' || !second) return first.nominalSi;
  const adds = (element.arrangement === 'parallel') === (first.kind === 'capacitor');
  return adds ? first.nominalSi + second.nominalSi : 1 / (1 / first.nominalSi + 1 / second.nominalSi);
}

/** An element's report at one frequency. */
export interface ElementReport {
  kind: PartKind;
  /** {@link combinedNominalValue}, F or H. */
  nominalValue: number;
  /** From the element's full-model reactance at f: `C = -1/(w X)` or `L = X/w`, F or H. */
  effectiveValue: number;
  /** Largest `f / SRF` over the parts; null when any SRF is unknown. */
  frequencyRatio: number | null;
  /** Union of the parts' {@link partFlags}. */
  flags: ModelFlag[];
}

/** Nominal and effective value, f/SRF and model flags of an element at `frequencyHz`. */
export function elementReport(element: ElementModel, frequencyHz: number, usableFraction = DEFAULT_USABLE_SRF_FRACTION): ElementReport {
  const omega = angularFrequency(frequencyHz);
  const z = elementImpedance(element, omega, { re: 0, im: 0 });
  const kind = element.parts[0].kind;
  const ratios = element.parts.map((p) => (p.srfHz === null ? null : frequencyHz / p.srfHz));
  const flags = new Set<ModelFlag>(element.parts.flatMap((p) => partFlags(p, frequencyHz, usableFraction)));
  return {
    kind,
    nominalValue: combinedNominalValue(element),
    effectiveValue: effectiveValue(kind, z.im, omega),
    frequencyRatio: ratios.some((r) => r === null) ? null : Math.max(...(ratios as number[])),
    flags: (['above-limit', 'limit-unknown', 'loss-unknown'] as const).filter((f) => flags.has(f)),
  };
}
