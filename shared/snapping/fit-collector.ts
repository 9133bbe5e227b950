/**
 * Ranking of fits and the collector that keeps the best ones while a search runs.
 *
 * Order (rf-engine.md "Snapping"): tier first (every fit whose parts are all within their limits
 * and in stock before any above-limit fit; a fit that needs more of a part than is available, which
 * can only happen when one part serves both elements, after those), then the objective's loss,
 * then the ties: fewer parts, larger SRF margin (smaller largest f0/SRF; unknown SRF last), more
 * stock (the most builds the stock covers, `min available / uses`), lower cost (fewest parts of
 * unknown cost, then the lowest sum of known unit costs per build), then part number (the fit's parts in ladder order, source to load).
 *
 * Losses are compared on a grid of {@link LOSS_KEY_DB} (1e-9 dB): two fits whose losses round to one
 * grid step tie and the tie rules decide. Rounding to a grid is a total order, and a bound on TPG
 * maps to a bound on the grid key, so the searches can prune safely.
 */
import { type KindCandidates, TIER_SHORT_STOCK } from './kind-candidates.js';
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
  /** The part (index into the kind's member table) in each place of the shunt option: `[first]` or `[first, second]`. */
  shuntMembers: number[] | null;
  seriesMembers: number[] | null;
  partCount: number;
  /** Largest f0/SRF of the parts (Infinity when one is unknown). */
  frequencyRatio: number;
  /** `min available / (uses x build quantity)` over the parts: how many times over the stock covers the build. */
  stockCover: number;
  /** Uses of parts whose unit cost is unknown (fewer ranks first: unknown cost ranks after any known cost). */
  unknownCostParts: number;
  /** Sum of the known unit costs x uses, in 1/10,000 of the currency unit (exact). */
  cost: number;
  /** Part numbers (with location and id) in ladder order: the last tie rule (then the arrangement, so the order is total). */
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
    a.unknownCostParts - b.unknownCostParts ||
    compareNumbers(a.cost, b.cost) ||
    comparePartKeys(a.partKey, b.partKey)
  );
}

/** The last tie rule; a fit without its part key (a spread copy of a described fit) is a bug, never a tie. */
function comparePartKeys(a: string, b: string): number {
  if (typeof a !== 'string' || typeof b !== 'string') throw new Error('compareFits: a fit has no part key (copy fits with withLossKey, not a spread)');
  return a < b ? -1 : a > b ? 1 : 0;
}

function compareNumbers(a: number, b: number): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Uses `k` of one member cover `available / (k q)` builds; floor with a hair of slack against rounding. */
function usesAt(available: number, cover: number, q: number): number {
  return Math.floor(available / (cover * q) + 1e-9);
}

/**
 * Scratch space of {@link describeFit} (a fit has at most 4 places and 4 models), reused by every
 * call so describing a fit allocates only the fit and its member lists: the searches describe tens
 * of thousands of fits per solve, and garbage collection was a fifth of a worst-case solve.
 * Places are in ladder order, source to load.
 */
const placeShunt = [false, false, false, false];
const placeIndex = [0, 0, 0, 0];
/** The model (index into the model arrays below) each place uses. */
const placeModel = [0, 0, 0, 0];
const modelCandidates: (KindCandidates | null)[] = [null, null, null, null];
const modelCandidate = [0, 0, 0, 0];
const modelUses = [0, 0, 0, 0];
/** Members chosen for one model's places (at most 4), in the order they fill them. */
const chosen = [0, 0, 0, 0];

/**
 * A described fit. The part key, the last tie rule, is a string of part numbers built only when a
 * comparison reaches it (two fits tied on everything before it) or when it is read: most fits
 * offered to a wide window never tie, so most are never built.
 */
class DescribedFit implements FitCandidate {
  private key: string | null = null;

  constructor(
    private readonly problem: SnapProblem,
    readonly tier: number,
    readonly tpg: number,
    readonly lossKey: number,
    readonly shunt: SnapOption | null,
    readonly series: SnapOption | null,
    readonly shuntMembers: number[] | null,
    readonly seriesMembers: number[] | null,
    readonly partCount: number,
    readonly frequencyRatio: number,
    readonly stockCover: number,
    readonly unknownCostParts: number,
    readonly cost: number,
  ) {}

  get partKey(): string {
    if (this.key === null) this.key = partKeyOf(this.problem, this.shunt, this.series, this.shuntMembers, this.seriesMembers);
    return this.key;
  }

  /** The same fit ranked on another loss key (an objective's loss instead of the nominal one). */
  withLossKey(lossKey: number): DescribedFit {
    const fit = new DescribedFit(
      this.problem,
      this.tier,
      this.tpg,
      lossKey,
      this.shunt,
      this.series,
      this.shuntMembers,
      this.seriesMembers,
      this.partCount,
      this.frequencyRatio,
      this.stockCover,
      this.unknownCostParts,
      this.cost,
    );
    fit.key = this.key;
    return fit;
  }
}

/**
 * The fit ranked on `lossKey` instead of its own (objective-window.ts re-ranks the nominal search's
 * fits by an objective). Use this, not a spread: a spread copy of a described fit has no part key.
 */
export function withLossKey(fit: FitCandidate, lossKey: number): FitCandidate {
  return fit instanceof DescribedFit ? fit.withLossKey(lossKey) : { ...fit, lossKey };
}

/** The part numbers (with location and id) of each element, element by element in ladder order, then the arrangements. */
function partKeyOf(problem: SnapProblem, shunt: SnapOption | null, series: SnapOption | null, shuntMembers: number[] | null, seriesMembers: number[] | null): string {
  const elementKey = (c: KindCandidates | null, members: number[] | null) =>
    members ? members.map((k) => c!.members.keys[k]).sort().join('\u0002') : null;
  const shuntKey = elementKey(problem.shunt, shuntMembers);
  const seriesKey = elementKey(problem.series, seriesMembers);
  const keys = problem.placement === 'shunt-at-source' ? [shuntKey, seriesKey] : [seriesKey, shuntKey];
  // Same parts in series and in parallel can tie on everything: the arrangement settles it last.
  return `${keys.filter((k) => k !== null).join('\u0003')}\u0004${shunt ? shunt.arrangement : '-'}${series ? series.arrangement : '-'}`;
}

/**
 * Completes a fit's ranking fields from its options and picks the parts of each merged model by the
 * tie rules after the loss (stock-index.ts):
 * 1. stock: for each model used u times in the fit (both elements count), the best cover
 *    `max min available/(uses x q)` over ways to spread the u uses over its members (found by trying
 *    each `available/(k q)`); the fit's cover is the least of these; below 1 the fit is short of stock;
 * 2. cost: at that cover each member can take `floor(available/(cover q))` uses; filling the u uses
 *    cheapest member first (known costs before unknown, then by part number) gives the fewest parts
 *    of unknown cost and then the lowest known sum;
 * 3. part number: the chosen members fill the model's places in ladder order, smallest key first.
 */
export function describeFit(problem: SnapProblem, shunt: SnapOption | null, series: SnapOption | null, tpg: number, lossKey: number, partsTier: number): FitCandidate {
  const q = (problem.shunt ?? problem.series)!.buildQuantity;
  // Places in ladder order, source to load, and the models they use.
  let places = 0;
  let modelCount = 0;
  const addPlaces = (option: SnapOption | null, c: KindCandidates | null, isShunt: boolean) => {
    if (!option || !c) return;
    const count = option.arrangement === SINGLE ? 1 : 2;
    for (let place = 0; place < count; place++) {
      const candidate = place === 0 ? option.first : option.second;
      let m = 0;
      while (m < modelCount && !(modelCandidates[m] === c && modelCandidate[m] === candidate)) m++;
      if (m === modelCount) {
        modelCandidates[m] = c;
        modelCandidate[m] = candidate;
        modelUses[m] = 0;
        modelCount++;
      }
      modelUses[m]++;
      placeShunt[places] = isShunt;
      placeIndex[places] = place;
      placeModel[places] = m;
      places++;
    }
  };
  if (problem.placement === 'shunt-at-source') {
    addPlaces(shunt, problem.shunt, true);
    addPlaces(series, problem.series, false);
  } else {
    addPlaces(series, problem.series, false);
    addPlaces(shunt, problem.shunt, true);
  }
  let cover = Infinity;
  for (let m = 0; m < modelCount; m++) {
    const c = modelCandidates[m]!;
    const start = c.memberStart[modelCandidate[m]];
    const end = c.memberEnd[modelCandidate[m]];
    const available = c.members.available;
    const u = modelUses[m];
    let best = 0;
    if (u === 1) {
      for (let k = start; k < end; k++) if (available[k] >= q && available[k] / q > best) best = available[k] / q;
    } else {
      for (let k = start; k < end; k++) {
        if (available[k] < q) continue;
        for (let times = 1; times <= u; times++) {
          const candidateCover = available[k] / (times * q);
          if (candidateCover <= best) break;
          let total = 0;
          for (let j = start; j < end && total < u; j++) if (available[j] >= q) total += usesAt(available[j], candidateCover, q);
          if (total >= u) best = candidateCover;
        }
      }
    }
    if (best < cover) cover = best;
  }
  let tier = partsTier;
  if (cover < 1) tier |= TIER_SHORT_STOCK;
  const shuntMembers: number[] | null = shunt ? [0, 0].slice(0, shunt.arrangement === SINGLE ? 1 : 2) : null;
  const seriesMembers: number[] | null = series ? [0, 0].slice(0, series.arrangement === SINGLE ? 1 : 2) : null;
  let cost = 0;
  let unknownCostParts = 0;
  let frequencyRatio = 0;
  let stockCover = Infinity;
  for (let m = 0; m < modelCount; m++) {
    const c = modelCandidates[m]!;
    const start = c.memberStart[modelCandidate[m]];
    const end = c.memberEnd[modelCandidate[m]];
    const { available, costs, keys } = c.members;
    let remaining = modelUses[m];
    let taken = 0;
    for (let k = start; k < end && remaining > 0; k++) {
      if (available[k] < q) continue;
      const take = Math.min(remaining, usesAt(available[k], cover, q));
      if (take <= 0) continue;
      for (let t = 0; t < take; t++) chosen[taken++] = k;
      remaining -= take;
      if (Number.isFinite(costs[k])) cost += costs[k] * take;
      else unknownCostParts += take;
      const covered = available[k] / (take * q);
      if (covered < stockCover) stockCover = covered;
    }
    // Smallest key first, into the model's places in ladder order (insertion sort: at most 4).
    for (let i = 1; i < taken; i++) {
      const k = chosen[i];
      let j = i - 1;
      while (j >= 0 && (keys[chosen[j]] > keys[k] || (keys[chosen[j]] === keys[k] && chosen[j] > k))) {
        chosen[j + 1] = chosen[j];
        j--;
      }
      chosen[j + 1] = k;
    }
    for (let place = 0, i = 0; place < places; place++) {
      if (placeModel[place] !== m) continue;
      (placeShunt[place] ? shuntMembers! : seriesMembers!)[placeIndex[place]] = chosen[i++];
    }
    const ratio = c.frequencyRatio[modelCandidate[m]];
    if (ratio > frequencyRatio) frequencyRatio = ratio;
    modelCandidates[m] = null;
  }
  return new DescribedFit(problem, tier, tpg, lossKey, shunt, series, shuntMembers, seriesMembers, places, frequencyRatio, stockCover, unknownCostParts, cost);
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
    // After every kept fit that ranks at or before it (binary search: windows hold up to 2,000).
    let low = 0;
    let high = entries.length;
    while (low < high) {
      const mid = (low + high) >>> 1;
      if (compareFits(fit, entries[mid]) < 0) high = mid;
      else low = mid + 1;
    }
    entries.splice(low, 0, fit);
    if (entries.length > this.capacity) entries.pop();
    if (entries.length === this.capacity) {
      const last = entries[entries.length - 1];
      this.setThreshold(last.tier, last.lossKey);
    }
  }
}
