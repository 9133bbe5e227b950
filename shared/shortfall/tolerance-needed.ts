/**
 * The tolerance purchasing must ask for: the loosest IEC 60062 tolerance letter that keeps the
 * design's worst-case loss (rf-engine.md: the largest total loss over all tolerance corners) within
 * the organisation's loss budget. Looser parts are cheaper and easier to get, so the loosest that
 * works is the one to buy.
 */
import type { PartKind } from '../engine/part-kind.js';
import { TOLERANCE_LETTERS, type Tolerance, type ToleranceLetter, toleranceDeltaSi } from '../engine/tolerance-codes.js';
import { boughtPartSpec, designLosses, type MatchDesign } from './match-design.js';

/** Default worst-case loss budget, dB (an organisation setting). */
export const DEFAULT_LOSS_BUDGET_DB = 0.5;

/**
 * Below this capacitance IEC 60062 tolerances are given as absolute amounts (B ±0.1 pF, C ±0.25 pF,
 * D ±0.5 pF): IEC 60062 uses them for capacitors below 10 pF.
 */
export const ABSOLUTE_TOLERANCE_BELOW_F = 10e-12;

/** Relative letters, loosest first (IEC 60062: M 20 %, K 10 %, J 5 %, G 2 %, F 1 %). */
const RELATIVE_LETTERS: readonly ToleranceLetter[] = ['M', 'K', 'J', 'G', 'F'];
/** Absolute letters for small capacitors, loosest first (D ±0.5 pF, C ±0.25 pF, B ±0.1 pF). */
const ABSOLUTE_LETTERS: readonly ToleranceLetter[] = ['D', 'C', 'B'];

/** A tolerance letter with its meaning. */
export interface ToleranceChoice {
  code: ToleranceLetter;
  tolerance: Tolerance;
}

/**
 * The IEC 60062 letters a part of `kind` and value `valueSi` is sold in, loosest first: the absolute
 * D, C, B for capacitors below 10 pF; the relative M, K, J, G, F otherwise (inductors always).
 */
export function toleranceChoices(kind: PartKind, valueSi: number): ToleranceChoice[] {
  const letters = kind === 'capacitor' && valueSi < ABSOLUTE_TOLERANCE_BELOW_F ? ABSOLUTE_LETTERS : RELATIVE_LETTERS;
  return letters.map((code) => ({ code, tolerance: TOLERANCE_LETTERS[code] }));
}

/** The tolerance chosen for one bought element. */
export interface NeededTolerance extends ToleranceChoice {
  elementIndex: number;
}

/** What {@link tolerancesNeeded} found. */
export interface TolerancesNeeded {
  /** One per element in `buyValues`, in the same order. */
  choices: NeededTolerance[];
  /** Worst-case loss of the design with every bought part at its chosen tolerance, dB. */
  worstCaseDb: number;
  /** Whether that worst case is within the budget (false: even the tightest letters are not enough). */
  withinBudget: boolean;
}

/**
 * The loosest tolerances for the bought elements that keep the worst-case loss of `design` within
 * `lossBudgetDb`. Every bought element starts at its loosest letter; while the worst case is over
 * the budget, the one element whose next tighter letter lowers the worst case most is tightened.
 * With one bought element this is exactly "the loosest letter whose worst case is within budget"
 * (a tighter tolerance box lies inside a looser one, so its worst corner is no worse).
 * @param buyValues element index to buy-to value (F or H); the other elements keep their stocked parts and tolerances
 */
export function tolerancesNeeded(design: MatchDesign, buyValues: ReadonlyMap<number, number>, lossBudgetDb = DEFAULT_LOSS_BUDGET_DB): TolerancesNeeded {
  if (!(lossBudgetDb > 0) || !Number.isFinite(lossBudgetDb)) {
    throw new RangeError(`tolerancesNeeded: the loss budget must be a finite number of dB above 0, got ${lossBudgetDb}`);
  }
  const indices = [...buyValues.keys()];
  const ladders = indices.map((index) => toleranceChoices(design.elements[index].kind, buyValues.get(index) as number));
  const level = indices.map(() => 0);
  const worstAt = (levels: number[]) => {
    const replacements = new Map(
      indices.map((index, i) => [index, boughtPartSpec(design.elements[index].kind, buyValues.get(index) as number, ladders[i][levels[i]].tolerance)]),
    );
    return designLosses(design, replacements).worstCaseDb;
  };
  let worst = worstAt(level);
  while (worst > lossBudgetDb) {
    let bestI = -1;
    let bestWorst = Infinity;
    for (let i = 0; i < indices.length; i++) {
      if (level[i] + 1 >= ladders[i].length) continue;
      const trial = level.slice();
      trial[i] += 1;
      const w = worstAt(trial);
      if (w < bestWorst) {
        bestWorst = w;
        bestI = i;
      }
    }
    if (bestI < 0) break;
    level[bestI] += 1;
    worst = bestWorst;
  }
  return {
    choices: indices.map((elementIndex, i) => ({ elementIndex, ...ladders[i][level[i]] })),
    worstCaseDb: worst,
    withinBudget: worst <= lossBudgetDb,
  };
}

/** Whether tolerance `a` is tighter than `b` at `valueSi` (a smaller ± amount). */
export function isTighter(a: Tolerance, b: Tolerance, valueSi: number): boolean {
  return toleranceDeltaSi(a, valueSi) < toleranceDeltaSi(b, valueSi);
}

/** The IEC 60062 letter of a tolerance, or a plain `±x` when it is not one of the letters. */
export function toleranceCode(tolerance: Tolerance): string {
  for (const [code, t] of Object.entries(TOLERANCE_LETTERS)) {
    if (t.mode === tolerance.mode && (t.mode === 'relative' ? t.fraction === (tolerance as { fraction: number }).fraction : t.deltaSi === (tolerance as { deltaSi: number }).deltaSi)) {
      return code;
    }
  }
  return tolerance.mode === 'relative' ? `±${tolerance.fraction * 100}%` : `±${tolerance.deltaSi}`;
}
