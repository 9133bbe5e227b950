/**
 * How a build's needs are shared out over the stock it has locked (pure: no database).
 *
 * Each element of each match needs `boards x per board` of each part its chosen fit uses. Where the
 * parts are there, they are taken. Where a part is short (several matches of the build want it, or
 * earlier builds hold it), the competing elements are each snapped again alone against what is
 * left (shared/shortfall/substitute-part.ts), and the one whose worst-case loss grows least by
 * moving to its next-best part moves; this repeats until the part suffices or nobody can move, and
 * then the part goes to the matches in the order the build lists them, the rest short. A match
 * whose chosen fit is over the loss budget has the element that is to blame snapped again the same
 * way, or put on the shortfall list. Every element left short becomes a shortfall line.
 */
import type { ShortfallReason } from '../../../shared/api/builds.js';
import type { ESeriesName } from '../../../shared/engine/e-series.js';
import type { PartSpec } from '../../../shared/engine/part-model.js';
import { buyToValue } from '../../../shared/shortfall/buy-to-value.js';
import { designLosses, type MatchDesign } from '../../../shared/shortfall/match-design.js';
import { bestSubstitute, type StockCandidate, type SubstituteRules } from '../../../shared/shortfall/substitute-part.js';
import { tolerancesNeeded } from '../../../shared/shortfall/tolerance-needed.js';
import type { PlannedMatchDesign } from '../../models/build-match.js';

/**
 * Stocked parts whose nominal value is within this factor of the ideal value are the candidates an
 * element is snapped again against (a wider step than any E-series has, E3's 2.2 included).
 */
export const SUBSTITUTE_VALUE_WINDOW = 2.5;

/** A locked part row as the allocation sees it. */
export interface StockRow {
  id: number;
  partNumber: string;
  location: string;
  spec: PartSpec;
  /** On hand minus reserved at the time of the lock, never below 0. */
  available: number;
  package: string | null;
}

/** One match of the build to allocate for. */
export interface PlanToAllocate {
  matchId: number;
  matchName: string;
  design: PlannedMatchDesign;
}

/** Organisation rules the allocation follows. */
export interface AllocationRules extends SubstituteRules {
  preferredSeries: Readonly<Record<'capacitor' | 'inductor', ESeriesName>>;
}

/** One part of an allocated element. */
export interface AllocatedPart {
  rowId: number | null;
  partNumber: string | null;
  location: string | null;
  perBoard: number;
  needed: number;
  reserved: number;
}

/** Why and how much an element is short. */
export interface ElementShortfall {
  /** Boards without the element. */
  shortQuantity: number;
  reason: ShortfallReason;
  reasonText: string;
  package: string | null;
}

/** What the allocation decided for one element. */
export interface AllocatedElement {
  planIndex: number;
  elementIndex: number;
  parts: AllocatedPart[];
  /** The chosen fit's part numbers when the element was moved to another part. */
  movedFrom: string[] | null;
  short: ElementShortfall | null;
}

/** An element moved to its next-best part, and what it costs. */
export interface AllocationMove {
  planIndex: number;
  elementIndex: number;
  from: string[];
  to: string;
  /** Null when the chosen part is not in stock at all. */
  fromWorstCaseDb: number | null;
  toWorstCaseDb: number;
  message: string;
}

/** The whole decision. */
export interface Allocation {
  elements: AllocatedElement[];
  moves: AllocationMove[];
  /** The design of each plan with the parts it ends up with (short elements keep their chosen or ideal parts). */
  designs: MatchDesign[];
}

interface Slot {
  row: StockRow | null;
  partNumber: string;
  perBoard: number;
  need: number;
  /** Parts granted when the row could not cover the need; null while the full need stands. */
  cap: number | null;
}

interface ElementState {
  planIndex: number;
  elementIndex: number;
  slots: Slot[];
  arrangement: 'single' | 'series' | 'parallel';
  movedFrom: string[] | null;
  /** Rows this element has been moved off (never offered again). */
  tried: Set<number>;
  short: ElementShortfall | null;
}

const db = (x: number) => `${x.toFixed(2)} dB`;

/** Shares `rows` out over `plans` for `boards` boards. */
export function allocateStock(plans: readonly PlanToAllocate[], boards: number, rows: readonly StockRow[], rules: AllocationRules): Allocation {
  const available = new Map(rows.map((row) => [row.id, row.available]));
  const rulesFor = (plan: PlanToAllocate): SubstituteRules => ({
    usableSrfFraction: plan.design.usableSrfFraction ?? rules.usableSrfFraction,
    excludeAboveLimit: plan.design.excludeAboveLimit ?? rules.excludeAboveLimit,
    lossBudgetDb: rules.lossBudgetDb,
  });
  const rowsOf = (plan: PlanToAllocate) => (plan.design.location ? rows.filter((r) => r.location === plan.design.location) : rows);
  const rowById = new Map(rows.map((row) => [row.id, row]));
  /** The chosen part's row: the very row the match chose when it names one, else the row of that stock code with most available. */
  const resolve = (plan: PlanToAllocate, partNumber: string, partId?: number): StockRow | null => {
    if (partId !== undefined) {
      const row = rowById.get(partId);
      if (row && row.partNumber === partNumber) return row;
    }
    let best: StockRow | null = null;
    for (const row of rowsOf(plan)) {
      if (row.partNumber !== partNumber) continue;
      if (!best || row.available > best.available || (row.available === best.available && row.id < best.id)) best = row;
    }
    return best;
  };

  const states: ElementState[] = [];
  plans.forEach((plan, planIndex) =>
    plan.design.elements.forEach((element, elementIndex) => {
      states.push({
        planIndex,
        elementIndex,
        arrangement: element.arrangement,
        slots: element.parts.map((p) => ({ row: resolve(plan, p.partNumber, p.partId), partNumber: p.partNumber, perBoard: p.perBoard, need: boards * p.perBoard, cap: null })),
        movedFrom: null,
        tried: new Set(),
        short: null,
      });
    }),
  );
  const statesOf = (planIndex: number) => states.filter((s) => s.planIndex === planIndex);
  const moves: AllocationMove[] = [];

  /** The design of a plan with each element's current parts (ideal parts where a row is missing). */
  const designOf = (planIndex: number): MatchDesign => {
    const plan = plans[planIndex];
    return {
      source: plan.design.source,
      load: plan.design.load,
      frequencyHz: plan.design.frequencyHz,
      elements: plan.design.elements.map((element, elementIndex) => {
        const state = statesOf(planIndex).find((s) => s.elementIndex === elementIndex)!;
        const complete = state.slots.every((slot) => slot.row);
        if (!complete) return { ...element, arrangement: 'single' as const, parts: [{ kind: element.kind, valueSi: element.idealValue }] };
        return { ...element, arrangement: state.arrangement, parts: state.slots.flatMap((slot) => Array.from({ length: slot.perBoard }, () => slot.row!.spec)) };
      }),
    };
  };
  const worstOf = (planIndex: number) => designLosses(designOf(planIndex)).worstCaseDb;
  const demandOn = (rowId: number, except: ElementState | null = null) => {
    let total = 0;
    for (const state of states) {
      if (state === except || state.short) continue;
      for (const slot of state.slots) if (slot.row?.id === rowId) total += slot.cap ?? slot.need;
    }
    return total;
  };
  const substituteFor = (state: ElementState, exclude: Set<number>) => {
    const plan = plans[state.planIndex];
    const element = plan.design.elements[state.elementIndex];
    const low = element.idealValue / SUBSTITUTE_VALUE_WINDOW;
    const high = element.idealValue * SUBSTITUTE_VALUE_WINDOW;
    const candidates: StockCandidate[] = rowsOf(plan)
      .filter((row) => row.spec.kind === element.kind && row.spec.valueSi >= low && row.spec.valueSi <= high)
      .map((row) => ({ id: row.id, partNumber: row.partNumber, location: row.location, spec: row.spec, package: row.package, available: (available.get(row.id) ?? 0) - demandOn(row.id, state) }));
    return bestSubstitute(designOf(state.planIndex), state.elementIndex, candidates, boards, rulesFor(plan), exclude);
  };
  const moveTo = (state: ElementState, row: StockRow, fromWorst: number | null, toWorst: number, why: string) => {
    const from = state.slots.map((s) => s.partNumber);
    state.movedFrom ??= from;
    state.slots.forEach((s) => s.row && state.tried.add(s.row.id));
    state.slots = [{ row, partNumber: row.partNumber, perBoard: 1, need: boards, cap: null }];
    state.arrangement = 'single';
    moves.push({
      planIndex: state.planIndex,
      elementIndex: state.elementIndex,
      from,
      to: row.partNumber,
      fromWorstCaseDb: fromWorst,
      toWorstCaseDb: toWorst,
      message: `${why}; moved ${plans[state.planIndex].matchName} ${plans[state.planIndex].design.elements[state.elementIndex].position} ${from.join(' + ')} to ${row.partNumber}, worst case ${db(toWorst)}${fromWorst === null ? '' : ` instead of ${db(fromWorst)}`}`,
    });
  };
  const packageOf = (state: ElementState) => state.slots.find((s) => s.row)?.row?.package ?? null;
  const kindWords = (state: ElementState) => plans[state.planIndex].design.elements[state.elementIndex].kind;

  // Elements whose chosen part is not in stock at all: snapped again, or short.
  for (const state of states) {
    const missing = state.slots.find((slot) => !slot.row);
    if (!missing) continue;
    const substitute = substituteFor(state, new Set());
    if (substitute) {
      moveTo(state, rowById.get(substitute.candidate.id)!, null, substitute.losses.worstCaseDb, `${missing.partNumber} is not in stock`);
    } else {
      state.short = {
        shortQuantity: boards,
        reason: 'short-stock',
        reasonText: `${missing.partNumber} is not in stock${plans[state.planIndex].design.location ? ` at ${plans[state.planIndex].design.location}` : ''}, and no other stocked ${kindWords(state)} keeps the worst case within ${db(rules.lossBudgetDb)}`,
        package: packageOf(state),
      };
    }
  }

  // Matches whose chosen fit is over the loss budget: the element to blame is snapped again, or bought.
  plans.forEach((plan, planIndex) => {
    const own = statesOf(planIndex);
    if (own.some((s) => s.short || s.slots.some((slot) => !slot.row))) return;
    const design = designOf(planIndex);
    const worst = designLosses(design).worstCaseDb;
    if (worst <= rules.lossBudgetDb) return;
    const trials = own.map((state) => {
      const element = plan.design.elements[state.elementIndex];
      return { state, found: tolerancesNeeded(design, new Map([[state.elementIndex, buyToValue(element.idealValue, rules.preferredSeries[element.kind])]]), rules.lossBudgetDb) };
    });
    const curing = trials.filter((t) => t.found.withinBudget).sort((a, b) => a.found.worstCaseDb - b.found.worstCaseDb);
    const blamed = curing.length > 0 ? [curing[0].state] : own;
    for (const state of blamed) {
      const substitute = substituteFor(state, new Set(state.slots.map((s) => s.row!.id)));
      if (substitute) {
        moveTo(state, rowById.get(substitute.candidate.id)!, worst, substitute.losses.worstCaseDb, `the chosen fit's worst case ${db(worst)} is over the ${db(rules.lossBudgetDb)} budget`);
      } else {
        state.short = {
          shortQuantity: boards,
          reason: 'over-budget',
          reasonText: `the chosen fit's worst case is ${db(worst)}, over the ${db(rules.lossBudgetDb)} budget, and no stocked ${kindWords(state)} brings it back`,
          package: packageOf(state),
        };
      }
    }
  });

  // Scarce parts: move whoever loses least, or share out in build order.
  for (;;) {
    const over = [...available.keys()].filter((id) => demandOn(id) > (available.get(id) ?? 0)).sort((a, b) => a - b);
    if (over.length === 0) break;
    const rowId = over[0];
    const competitors = states.filter((s) => !s.short && s.slots.some((slot) => slot.row?.id === rowId && slot.cap === null));
    if (competitors.length === 0) break;
    let best: { state: ElementState; row: StockRow; delta: number; fromWorst: number; toWorst: number } | null = null;
    for (const state of competitors) {
      const substitute = substituteFor(state, new Set([...state.tried, rowId]));
      if (!substitute) continue;
      const fromWorst = worstOf(state.planIndex);
      const delta = substitute.losses.worstCaseDb - fromWorst;
      // Ties go to the match listed later: the first matches of a build keep their chosen parts.
      if (!best || delta <= best.delta) best = { state, row: rowById.get(substitute.candidate.id)!, delta, fromWorst, toWorst: substitute.losses.worstCaseDb };
    }
    if (best) {
      const row = rowById.get(rowId)!;
      moveTo(best.state, best.row, best.fromWorst, best.toWorst, `${row.partNumber} has ${available.get(rowId)} available for ${demandOn(rowId)} wanted`);
      continue;
    }
    let left = (available.get(rowId) ?? 0) - states.reduce((sum, s) => sum + (s.short ? 0 : s.slots.filter((slot) => slot.row?.id === rowId && slot.cap !== null).reduce((a, slot) => a + (slot.cap ?? 0), 0)), 0);
    for (const state of competitors) {
      for (const slot of state.slots) {
        if (slot.row?.id !== rowId || slot.cap !== null) continue;
        const give = Math.max(0, Math.min(slot.need, left));
        slot.cap = give;
        left -= give;
      }
    }
  }

  const elements: AllocatedElement[] = states.map((state) => {
    const parts: AllocatedPart[] = state.slots.map((slot) => ({
      rowId: slot.row?.id ?? null,
      partNumber: slot.row?.partNumber ?? slot.partNumber,
      location: slot.row?.location ?? null,
      perBoard: slot.perBoard,
      needed: slot.need,
      reserved: state.short || !slot.row ? 0 : (slot.cap ?? slot.need),
    }));
    let short = state.short;
    if (!short) {
      const boardsShort = Math.max(0, ...parts.map((p) => Math.ceil((p.needed - p.reserved) / p.perBoard)));
      if (boardsShort > 0) {
        const scarce = state.slots.filter((slot) => slot.cap !== null && slot.cap < slot.need).map((slot) => `${slot.row!.partNumber}: ${slot.cap} of ${slot.need}`);
        short = {
          shortQuantity: boardsShort,
          reason: 'short-stock',
          reasonText: `not enough stock (${scarce.join(', ')}), and no other stocked ${kindWords(state)} keeps the worst case within ${db(rules.lossBudgetDb)}`,
          package: packageOf(state),
        };
      }
    }
    return { planIndex: state.planIndex, elementIndex: state.elementIndex, parts, movedFrom: state.movedFrom, short };
  });
  return { elements, moves, designs: plans.map((_, i) => designOf(i)) };
}
