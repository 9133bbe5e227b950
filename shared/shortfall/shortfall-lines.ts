/**
 * Shortfall lines: what purchasing must buy for the elements a build cannot meet from stock, each to
 * a spec (handbook product.md journey 3; issue "Builds, reservations, shortfall lists"):
 * buy-to value in the preferred E-series with the loss the design would have with it, quantity with
 * the attrition allowance, minimum SRF, the tolerance that keeps the worst case within the loss
 * budget, package and reason. Lines for one part spec from several matches merge into one.
 */
import type { ShortfallLine, ShortfallReason, ShortfallSource } from '../api/builds.js';
import type { ElementPosition } from '../api/matches.js';
import type { ESeriesName } from '../engine/e-series.js';
import type { PartKind } from '../engine/part-kind.js';
import { toleranceDeltaSi } from '../engine/tolerance-codes.js';
import { quantityWithAttrition } from './attrition.js';
import { buyToLoss, buyToValue } from './buy-to-value.js';
import type { MatchDesign } from './match-design.js';
import { minimumSrfHz } from './minimum-srf.js';
import { tolerancesNeeded } from './tolerance-needed.js';

/** The organisation settings a shortfall list is computed with. */
export interface ShortfallSettings {
  /** Preferred E-series per kind, for buy-to values. */
  preferredSeries: Readonly<Record<PartKind, ESeriesName>>;
  usableSrfFraction: number;
  /** Worst-case loss budget, dB. */
  lossBudgetDb: number;
  /** Attrition allowance, percent. */
  attritionPercent: number;
}

/** One element of one match that the build cannot meet. */
export interface ShortElement {
  /** Index of the element in the design's `elements`. */
  elementIndex: number;
  /** Parts short (boards without the element, for a two-part element the boards short of either part). */
  shortQuantity: number;
  reason: ShortfallReason;
  /** Plain words for the reason. */
  reasonText: string;
  /** The package of the part the fit chose, to buy the same footprint; null when unknown. */
  package: string | null;
}

/** A shortfall line before it is stored (no id, nothing received yet). */
export type ShortfallLineDraft = Omit<ShortfallLine, 'id' | 'receivedQuantity'>;

/**
 * The unmerged shortfall lines of one match: for each short element, buy-to value
 * (nearest standard value of the kind's preferred series), minimum SRF `f0 / usable fraction`,
 * tolerance (the loosest IEC 60062 letters that keep the match's worst case within the budget,
 * found for all short elements of the match together, the met elements keeping their stocked
 * parts), the loss at f0 with the buy-to values, and quantity with the attrition allowance.
 */
export function shortfallLinesForMatch(
  match: { matchId: number; matchName: string; design: MatchDesign },
  shorts: readonly ShortElement[],
  settings: ShortfallSettings,
): ShortfallLineDraft[] {
  if (shorts.length === 0) return [];
  const { design } = match;
  const buyValues = new Map<number, number>();
  for (const short of shorts) {
    const element = design.elements[short.elementIndex];
    if (!element) throw new RangeError(`shortfallLinesForMatch: match ${match.matchId} has no element ${short.elementIndex}`);
    buyValues.set(short.elementIndex, buyToValue(element.idealValue, settings.preferredSeries[element.kind]));
  }
  const loss = buyToLoss(design, buyValues);
  const needed = tolerancesNeeded(design, buyValues, settings.lossBudgetDb);
  const minSrfHz = minimumSrfHz(design.frequencyHz, settings.usableSrfFraction);
  return shorts.map((short) => {
    const element = design.elements[short.elementIndex];
    const choice = needed.choices.find((c) => c.elementIndex === short.elementIndex)!;
    const source: ShortfallSource = {
      matchId: match.matchId,
      matchName: match.matchName,
      position: element.position as ElementPosition,
      idealValue: element.idealValue,
      shortQuantity: short.shortQuantity,
      frequencyHz: design.frequencyHz,
      buyLossDb: loss.totalDb,
      buyWorstCaseDb: needed.worstCaseDb,
    };
    return {
      kind: element.kind,
      idealValue: element.idealValue,
      buyValue: buyValues.get(short.elementIndex) as number,
      series: settings.preferredSeries[element.kind],
      quantity: quantityWithAttrition(short.shortQuantity, settings.attritionPercent),
      minSrfHz,
      tolerance: choice.tolerance,
      toleranceCode: choice.code,
      toleranceWithinBudget: needed.withinBudget,
      package: short.package,
      reason: short.reason,
      reasonText: short.reasonText,
      shortQuantity: short.shortQuantity,
      buyLossDb: loss.totalDb,
      sources: [source],
    };
  });
}

/** The part spec lines merge on: kind, buy-to value, series and package. */
export function shortfallSpecKey(line: Pick<ShortfallLineDraft, 'kind' | 'buyValue' | 'series' | 'package'>): string {
  return `${line.kind}|${line.buyValue}|${line.series}|${line.package ?? ''}`;
}

/**
 * Merges lines for the same part spec (kind, buy-to value, series, package) into one, in the order
 * they first appear: parts short add up and the attrition allowance is applied once to the sum
 * (`ceil(sum x (1 + a))`, never more than the sum of the lines' own allowances); the tolerance is
 * the tightest and the minimum SRF the highest of the merged lines, so the one part bought serves
 * every match; the reason is the first line's, the reason words of all lines are kept, and
 * `sources` lists every match.
 */
export function mergeShortfallLines(lines: readonly ShortfallLineDraft[], attritionPercent: number): ShortfallLineDraft[] {
  const merged = new Map<string, ShortfallLineDraft>();
  for (const line of lines) {
    const key = shortfallSpecKey(line);
    const into = merged.get(key);
    if (!into) {
      merged.set(key, { ...line, sources: [...line.sources] });
      continue;
    }
    into.shortQuantity += line.shortQuantity;
    if (toleranceDeltaSi(line.tolerance, line.buyValue) < toleranceDeltaSi(into.tolerance, into.buyValue)) {
      into.tolerance = line.tolerance;
      into.toleranceCode = line.toleranceCode;
    }
    into.toleranceWithinBudget = into.toleranceWithinBudget && line.toleranceWithinBudget;
    into.minSrfHz = Math.max(into.minSrfHz, line.minSrfHz);
    if (line.buyLossDb !== null && (into.buyLossDb === null || line.buyLossDb > into.buyLossDb)) into.buyLossDb = line.buyLossDb;
    if (!into.reasonText.includes(line.reasonText)) into.reasonText = `${into.reasonText}; ${line.reasonText}`;
    into.sources.push(...line.sources);
  }
  return [...merged.values()].map((line) => ({ ...line, quantity: quantityWithAttrition(line.shortQuantity, attritionPercent) }));
}
