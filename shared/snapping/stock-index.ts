/**
 * A stock list prepared for snapping, once per stock (not per match): parts grouped by their
 * electrical model, so the searches treat every group as one candidate and the tie rules later pick
 * the group's part(s) (fit-collector.ts `describeFit`).
 *
 * Two parts have one electrical model when kind, value, tolerance, SRF, ESR, Q and Q test frequency
 * are all equal (rf-engine.md "Part models": nothing else enters the fit's losses). Such parts give
 * exactly the same loss in every fit, so a fit with one differs from a fit with the other only in the
 * tie rules after the loss (stock, cost, part number); merging them is exact. Ratings stay per part
 * (they decide the "over rating" flag of the part actually chosen, not the rank).
 */
import type { PartKind } from '../engine/part-kind.js';
import type { PartModel } from '../engine/part-model.js';
import { type SnapPart, snapPartModel, unitCostForRanking } from './snap-part.js';

/** Parts of one electrical model: members `start .. end - 1` of the kind's {@link MemberTable}. */
export interface ModelGroup {
  readonly kind: PartKind;
  /** Any member: they share every model field. */
  readonly model: SnapPart;
  /** The engine model of the group (ratings and part number of {@link model}), built once. */
  readonly partModel: PartModel;
  readonly start: number;
  readonly end: number;
}

/**
 * Every part of one kind, group by group; within a group ordered for the cost tie rule (known unit
 * cost ascending, unknown last, then by tie key).
 */
export interface MemberTable {
  readonly parts: readonly SnapPart[];
  /** {@link partTieKey} of each part. */
  readonly keys: readonly string[];
  /** {@link unitCostForRanking} of each part. */
  readonly costs: Float64Array;
  readonly available: Float64Array;
}

/** The prepared stock: groups of each kind (in ascending value) and their members. */
export interface StockIndex {
  readonly groups: Readonly<Record<PartKind, readonly ModelGroup[]>>;
  readonly members: Readonly<Record<PartKind, MemberTable>>;
  readonly partCount: number;
  /** Whether identical models were merged (false: one group per part, for reference searches). */
  readonly merged: boolean;
}

/** The tie key of a part: part number, then location, then id (so the order is total). */
export function partTieKey(part: SnapPart): string {
  return `${part.partNumber}\u0001${part.location}\u0001${String(part.id).padStart(12, '0')}`;
}

function modelKey(p: SnapPart): string {
  const t = p.tolerance;
  const amount = t.mode === 'relative' ? t.fraction : t.deltaSi;
  return `${p.kind}|${p.value}|${t.mode}|${amount}|${p.srfHz}|${p.esrOhm}|${p.q}|${p.qFrequencyHz}`;
}

/**
 * Groups `parts` by electrical model (or, with `merge: false`, one group per part) and builds each
 * group's engine model once (models do not depend on frequency). O(n log n).
 * @throws EngineInputError naming the part when a stored part is not a valid model
 */
export function buildStockIndex(parts: readonly SnapPart[], options: { merge?: boolean } = {}): StockIndex {
  const merge = options.merge ?? true;
  const byKey = new Map<string, SnapPart[]>();
  const singles: SnapPart[][] = [];
  for (const part of parts) {
    if (!merge) {
      singles.push([part]);
      continue;
    }
    const key = modelKey(part);
    const list = byKey.get(key);
    if (list) list.push(part);
    else byKey.set(key, [part]);
  }
  const lists = merge ? [...byKey.values()] : singles;
  const sorted: Record<PartKind, SnapPart[][]> = { capacitor: [], inductor: [] };
  for (const list of lists) sorted[list[0].kind].push(list);
  const groups: Record<PartKind, ModelGroup[]> = { capacitor: [], inductor: [] };
  const members = {} as Record<PartKind, MemberTable>;
  for (const kind of ['capacitor', 'inductor'] as const) {
    sorted[kind].sort((a, b) => a[0].value - b[0].value);
    const parts: SnapPart[] = [];
    const keys: string[] = [];
    const costs: number[] = [];
    for (const list of sorted[kind]) {
      const entries = list.map((part) => ({ part, key: partTieKey(part), cost: unitCostForRanking(part.unitCost) }));
      if (entries.length > 1) entries.sort((a, b) => a.cost - b.cost || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
      const start = parts.length;
      for (const e of entries) {
        parts.push(e.part);
        keys.push(e.key);
        costs.push(e.cost);
      }
      groups[kind].push({ kind, model: entries[0].part, partModel: snapPartModel(entries[0].part), start, end: parts.length });
    }
    members[kind] = { parts, keys, costs: Float64Array.from(costs), available: Float64Array.from(parts, (p) => p.available) };
  }
  return { groups, members, partCount: parts.length, merged: merge };
}
