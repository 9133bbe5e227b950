/**
 * Ranking of fits and the collector that keeps the best ones while a search runs.
 *
 * Order (rf-engine.md "Snapping"): tier first (every fit whose parts are all within their limits
 * and in stock before any above-limit fit; a fit that needs more of a part than is available, which
 * can only happen when one part serves both elements, after those), then the objective's loss,
 * then the ties: fewer parts, larger SRF margin (smaller largest f0/SRF; unknown SRF last), more
 * stock (the most builds the stock covers, `min available / uses`), lower cost (sum of unit costs per
 * build; unknown last), then part number (the fit's parts in ladder order, source to load).
 *
 * Losses are compared on a grid of {@link LOSS_KEY_DB} (1e-9 dB): two fits whose losses round to one
 * grid step tie and the tie rules decide. Rounding to a grid is a total order, and a bound on TPG
 * maps to a bound on the grid key, so the searches can prune safely.
 */
import { TIER_SHORT_STOCK } from './kind-candidates.js';
import type { SnapProblem } from './snap-problem.js';
import { type ArrangementCode, SINGLE, type SnapOption } from './snap-option.js';

/** Step of the loss grid fits are ranked on, dB. */
export const LOSS_KEY_DB = 1e-9;
/** Losses above this (dB) share the last grid key (an open or short circuit). */
export const MAX_RANKED_LOSS_DB = 1e4;
/** Relative margin on every TPG bound, so rounding in a bound never prunes a fit that ties. */
export const BOUND_SLACK = 1e-12;

/** `round(loss / 1e-9 dB)` for `loss = -10 log10 TPG`, capped at {@link MAX_RANKED_LOSS_DB}. */
export function lossKeyOfTpg(tpg: number): number {
  if (!(tpg > 0)) return Math.round(MAX_RANKED_LOSS_DB / LOSS_KEY_DB);
  return lossKeyOfDb(-10 * Math.log10(tpg));
}

/** `round(loss / 1e-9 dB)`, capped; a loss a hair below 0 from rounding is key 0. */
export function lossKeyOfDb(lossDb: number): number {
  if (!(lossDb < MAX_RANKED_LOSS_DB)) return Math.round(MAX_RANKED_LOSS_DB / LOSS_KEY_DB);
  const key = Math.round(lossDb / LOSS_KEY_DB);
  return key <= 0 ? 0 : key;
}

/** The largest TPG whose key is still above `key` is below this: `10^(-(key + 0.5) 1e-9 / 10)`. */
function tpgAtKeyEdge(key: number): number {
  return Math.pow(10, (-(key + 0.5) * LOSS_KEY_DB) / 10);
}

/** A fit found by a search, with everything its rank depends on. */
export interface FitCandidate {
  /** Bits: 1 above limit, 2 short of stock. */
  tier: number;
  /** Nominal TPG at f0, full models. */
  tpg: number;
  /** The grid key of the loss being ranked on (nominal loss unless an objective window re-ranks). */
  lossKey: number;
  shunt: SnapOption | null;
  series: SnapOption | null;
  partCount: number;
  /** Largest f0/SRF of the parts (Infinity when one is unknown). */
  frequencyRatio: number;
  /** `min available / (uses x build quantity)` over the parts: how many times over the stock covers the build. */
  stockCover: number;
  /** Sum of unit cost x uses (Infinity when one is unknown). */
  cost: number;
  /** Part numbers (with location and id) in ladder order: the last tie rule. */
  partKey: string;
}

/** Rank order: negative when `a` ranks before `b`. */
export function compareFits(a: FitCandidate, b: FitCandidate): number {
  return (
    a.tier - b.tier ||
    a.lossKey - b.lossKey ||
    a.partCount - b.partCount ||
    compareNumbers(a.frequencyRatio, b.frequencyRatio) ||
    compareNumbers(b.stockCover, a.stockCover) ||
    compareNumbers(a.cost, b.cost) ||
    (a.partKey < b.partKey ? -1 : a.partKey > b.partKey ? 1 : 0)
  );
}

function compareNumbers(a: number, b: number): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

interface PartUse {
  index: number;
  uses: number;
}

/**
 * Completes a fit's ranking fields from its options: shortage from parts shared by both elements,
 * part count, frequency ratio, stock cover, cost and the part-number key.
 */
export function describeFit(problem: SnapProblem, shunt: SnapOption | null, series: SnapOption | null, tpg: number, lossKey: number, partsTier: number): FitCandidate {
  const sameKind = problem.shunt !== null && problem.series !== null && problem.shunt === problem.series;
  const buildQuantity = (problem.shunt ?? problem.series)!.buildQuantity;
  let tier = partsTier;
  let partCount = 0;
  let frequencyRatio = 0;
  let cost = 0;
  let stockCover = Infinity;
  const elementKeys: string[] = [];
  const shuntUses: PartUse[] = [];
  const seriesUses: PartUse[] = [];
  const collect = (option: SnapOption | null, into: PartUse[]) => {
    if (!option) return;
    const add = (index: number) => {
      const found = into.find((u) => u.index === index);
      if (found) found.uses++;
      else into.push({ index, uses: 1 });
    };
    add(option.first);
    if (option.arrangement !== SINGLE) add(option.second);
  };
  collect(shunt, shuntUses);
  collect(series, seriesUses);
  const tally = (c: NonNullable<SnapProblem['shunt']>, uses: PartUse[], others: PartUse[]) => {
    const keys: string[] = [];
    for (const u of uses) {
      const shared = sameKind ? (others.find((o) => o.index === u.index)?.uses ?? 0) : 0;
      const total = u.uses + shared;
      const part = c.parts[u.index];
      if (total * buildQuantity > c.available[u.index]) tier |= TIER_SHORT_STOCK;
      partCount += u.uses;
      frequencyRatio = Math.max(frequencyRatio, c.frequencyRatio[u.index]);
      cost += c.unitCost[u.index] * u.uses;
      stockCover = Math.min(stockCover, c.available[u.index] / (total * buildQuantity));
      for (let k = 0; k < u.uses; k++) keys.push(`${part.partNumber}\u0001${part.location}\u0001${part.id}`);
    }
    return keys.sort().join('\u0002');
  };
  const shuntKey = shunt ? tally(problem.shunt!, shuntUses, seriesUses) : null;
  const seriesKey = series ? tally(problem.series!, seriesUses, shuntUses) : null;
  if (problem.placement === 'shunt-at-source') {
    if (shuntKey !== null) elementKeys.push(shuntKey);
    if (seriesKey !== null) elementKeys.push(seriesKey);
  } else {
    if (seriesKey !== null) elementKeys.push(seriesKey);
    if (shuntKey !== null) elementKeys.push(shuntKey);
  }
  return {
    tier,
    tpg,
    lossKey,
    shunt,
    series,
    partCount,
    frequencyRatio,
    stockCover,
    cost: Number.isNaN(cost) ? Infinity : cost,
    partKey: elementKeys.join('\u0003'),
  };
}

/** A limit a collector starts with: only fits ranking at or before `(tier, lossKey)` are kept. */
export interface CollectorLimit {
  tier: number;
  lossKey: number;
}

/**
 * Keeps the `capacity` best fits offered, in rank order, and answers whether a bound can still
 * place a fit among them (`canBeat`): the pruning test of every search.
 */
export class FitCollector {
  /** The kept fits, best first. */
  readonly entries: FitCandidate[] = [];
  /** Fits offered (evaluated), for the benchmark and tests. */
  offered = 0;
  private thresholdTier = Infinity;
  private thresholdKey = Infinity;
  private thresholdTpg = -Infinity;

  constructor(
    private readonly problem: SnapProblem,
    private readonly capacity: number,
    limit: CollectorLimit | null = null,
  ) {
    if (limit) this.setThreshold(limit.tier, limit.lossKey);
  }

  private setThreshold(tier: number, lossKey: number): void {
    this.thresholdTier = tier;
    this.thresholdKey = lossKey;
    this.thresholdTpg = tpgAtKeyEdge(lossKey);
  }

  /**
   * Whether a fit with tier at least `minTier` and TPG at most `boundTpg` could rank among the kept
   * fits (or within the limit): lower tier, or same tier and `boundTpg` above the TPG edge of the
   * threshold's loss key (with {@link BOUND_SLACK}).
   */
  canBeat(minTier: number, boundTpg: number): boolean {
    if (minTier !== this.thresholdTier) return minTier < this.thresholdTier;
    return boundTpg * (1 + BOUND_SLACK) > this.thresholdTpg;
  }

  /** Offers a fit (arrangement -1: element absent) with its nominal TPG and its parts' tier. */
  offer(
    shuntArrangement: ArrangementCode | -1,
    shuntFirst: number,
    shuntSecond: number,
    seriesArrangement: ArrangementCode | -1,
    seriesFirst: number,
    seriesSecond: number,
    tpg: number,
    partsTier: number,
  ): void {
    this.offered++;
    const lossKey = lossKeyOfTpg(tpg);
    // Sharing can only raise the tier, so a fit already outside the threshold stays outside.
    if (partsTier > this.thresholdTier || (partsTier === this.thresholdTier && lossKey > this.thresholdKey)) return;
    const shunt = shuntArrangement < 0 ? null : { arrangement: shuntArrangement as ArrangementCode, first: shuntFirst, second: shuntSecond };
    const series = seriesArrangement < 0 ? null : { arrangement: seriesArrangement as ArrangementCode, first: seriesFirst, second: seriesSecond };
    this.insert(describeFit(this.problem, shunt, series, tpg, lossKey, partsTier));
  }

  /** Inserts a described fit in rank order, dropping the one past capacity. */
  insert(fit: FitCandidate): void {
    if (fit.tier > this.thresholdTier || (fit.tier === this.thresholdTier && fit.lossKey > this.thresholdKey)) return;
    const entries = this.entries;
    if (entries.length === this.capacity && compareFits(fit, entries[entries.length - 1]) >= 0) return;
    let at = entries.length;
    while (at > 0 && compareFits(fit, entries[at - 1]) < 0) at--;
    entries.splice(at, 0, fit);
    if (entries.length > this.capacity) entries.pop();
    if (entries.length === this.capacity) {
      const last = entries[entries.length - 1];
      this.setThreshold(last.tier, last.lossKey);
    }
  }
}
