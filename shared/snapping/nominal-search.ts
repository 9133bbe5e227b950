/**
 * The exact `nominal` search: the best fits by TPG at f0 with full models over every candidate pair
 * (rf-engine.md "Snapping": "the best fit returned must be the exact optimum over all candidate
 * pairs"), without trying every pair.
 *
 * Why it is exact (the proof the property test checks against exhaustive search):
 *
 * 1. Series element, shunt option fixed. With the near port N (the one the shunt is across) and the
 *    far port F, the shunt and N together are `Z' = R' + jX' = 1/(YN + Ysh)`, and a fraction
 *    `eta = GN/(GN + Gsh)` of the power into Z' reaches N, so (abcd.ts `seriesSearchTerms`)
 *    `TPG = 4 RF R' eta / ((RF + R' + Rse)^2 + (XF + X' + Xse)^2) = M / |Zse - c|^2`,
 *    `c = -(RF + R') + j T`, `T = -(XF + X')`: a disc around c in the impedance plane. Over a box of
 *    series options the largest TPG is `M / dist(c, box)^2`, so a tree of options sorted by X (or a
 *    pair of tree nodes, whose sums lie in the sum of their boxes) whose bound is below the k-th best
 *    fit can be skipped whole. Loss resistance is in the box (`Rse >= reMin`), so lossy parts are
 *    bounded as they are. Parallel pairs add admittances: their sum box is carried to the impedance
 *    plane by `invertBox`.
 * 2. Shunt options. For a shunt option, every series option lies in the wedge `R >= kappa |X|`
 *    (kappa = the kind's lowest R/|X|), so no fit with it beats `V = M / dist(c, wedge)^2`. For a box of
 *    shunt admittances: `eta <= GN/(GN + Gmin)`, `R'` lies in the inverted box of `YN + box`, and
 *    `dist^2 >= max((RF + R')^2, (RF + R' + kappa t+)^2/(1 + kappa^2))` (Cauchy-Schwarz) with t+ the
 *    smallest `s T` in the box clipped at 0, so `V <= 4 RF eta max R'/(...)`, each ratio unimodal in
 *    R' and maximised by clamping its peak into the box. Shunt options are taken best-first by these
 *    bounds from a priority queue (tier first), and the search stops when the best remaining bound
 *    cannot beat the k-th best fit.
 * 3. One-element networks are the same disc search in the element's own plane (shunt alone:
 *    `TPG = M / |Ysh - y0|^2`, `y0 = -(1/Zs + 1/ZL)`).
 * Pruning uses the rank order of fit-collector.ts (tier, then loss on a 1e-9 dB grid) and keeps
 * every candidate that could tie, so the tie rules see all tied fits.
 *
 * Reciprocity makes `shunt-at-source` the mirror of `shunt-at-load` (near and far ports swap), which
 * `seriesSearchTerms` and `twoElementTpg` already handle.
 */
import { seriesSearchTerms, type SeriesSearchTerms, twoElementTpg } from '../engine/abcd.js';
import type { Complex } from '../engine/complex.js';
import { BoundQueue } from './bound-queue.js';
import { type CollectorLimit, FitCollector } from './fit-collector.js';
import { boxDistanceSquared, invertBox, wedgeDistanceSquared } from './immittance-box.js';
import type { ImmittanceTree } from './immittance-tree.js';
import type { KindCandidates } from './kind-candidates.js';
import { type ArrangementCode, optionImmittance, PARALLEL_PAIR, type Plane, SERIES_PAIR, SINGLE } from './snap-option.js';
import type { SnapProblem } from './snap-problem.js';

/** Counters of one search (for the benchmark and tests). */
export interface SearchStats {
  /** Fits evaluated exactly. */
  fitsEvaluated: number;
  /** Shunt options whose series search ran. */
  shuntOptionsSearched: number;
  /** Tree nodes (or node pairs) whose bound was computed. */
  boundsComputed: number;
}

/** Queue item kinds of the shunt best-first search. */
const SHUNT_SINGLES = 0;
const SHUNT_PARALLEL = 1;
const SHUNT_SERIES = 2;
const SHUNT_OPTION = 3;
/** Spacing of tiers in queue keys (bounds are clipped to at most 1 + 1e-9 < 4). */
const TIER_KEY_STEP = 4;

class NominalSearch {
  readonly collector: FitCollector;
  readonly stats: SearchStats = { fitsEvaluated: 0, shuntOptionsSearched: 0, boundsComputed: 0 };
  private readonly box = new Float64Array(4);
  private readonly value: Complex = { re: 0, im: 0 };
  private readonly terms: SeriesSearchTerms = { targetReactanceOhm: 0, fixedResistanceOhm: 0, numerator: 0 };
  // The disc being searched: TPG = m / |E - c|^2 in the plane `natural`.
  private m = 0;
  private cRe = 0;
  private cIm = 0;
  private baseTier = 0;
  private natural: Plane = 'Z';
  private role: 'series' | 'shunt' = 'series';
  private candidates!: KindCandidates;
  // The shunt option fixed while the series element is searched (arrangement -1: none).
  private shuntArrangement: ArrangementCode | -1 = -1;
  private shuntFirst = -1;
  private shuntSecond = -1;
  private ysRe = 0;
  private ysIm = 0;

  constructor(
    private readonly problem: SnapProblem,
    capacity: number,
    limit: CollectorLimit | null,
  ) {
    this.collector = new FitCollector(problem, capacity, limit);
  }

  run(): void {
    const { shunt, series } = this.problem;
    if ((shunt && shunt.count === 0) || (series && series.count === 0) || (!shunt && !series)) return;
    if (shunt && series) this.searchBoth(shunt, series);
    else if (series) this.searchSeries(-1, -1, -1, 0, 0, 0);
    else this.searchShuntAlone(shunt!);
  }

  // ---- disc searches over one element ------------------------------------------------------

  /** Series element for a fixed shunt option (or none): the disc of point 1 above. */
  private searchSeries(arrangement: ArrangementCode | -1, first: number, second: number, yRe: number, yIm: number, tier: number): void {
    const p = this.problem;
    seriesSearchTerms(p.placement, p.source.re, p.source.im, p.load.re, p.load.im, yRe, yIm, this.terms);
    this.shuntArrangement = arrangement;
    this.shuntFirst = first;
    this.shuntSecond = second;
    this.ysRe = yRe;
    this.ysIm = yIm;
    this.m = this.terms.numerator;
    this.cRe = -this.terms.fixedResistanceOhm;
    this.cIm = this.terms.targetReactanceOhm;
    this.baseTier = tier;
    this.natural = 'Z';
    this.role = 'series';
    this.disc(p.series!);
  }

  /** Shunt element alone: `TPG = M/|Y - y0|^2` with `M = 4 Rs RL / |Zs ZL|^2`, `y0 = -(1/Zs + 1/ZL)`. */
  private searchShuntAlone(shunt: KindCandidates): void {
    const { source: s, load: l } = this.problem;
    const zz = { re: s.re * l.re - s.im * l.im, im: s.re * l.im + s.im * l.re };
    const sum = { re: s.re + l.re, im: s.im + l.im };
    const d = zz.re * zz.re + zz.im * zz.im;
    // y0 = -(Zs + ZL)/(Zs ZL)
    this.cRe = -(sum.re * zz.re + sum.im * zz.im) / d;
    this.cIm = -(sum.im * zz.re - sum.re * zz.im) / d;
    this.m = (4 * s.re * l.re) / d;
    this.baseTier = 0;
    this.natural = 'Y';
    this.role = 'shunt';
    this.disc(shunt);
  }

  private disc(c: KindCandidates): void {
    this.candidates = c;
    const own = this.natural === 'Z' ? c.zTree : c.yTree;
    const other = this.natural === 'Z' ? c.yTree : c.zTree;
    this.visitSingles(own, 1);
    if (!this.problem.combinations) return;
    const ownPair: ArrangementCode = this.natural === 'Z' ? SERIES_PAIR : PARALLEL_PAIR;
    const otherPair: ArrangementCode = this.natural === 'Z' ? PARALLEL_PAIR : SERIES_PAIR;
    this.visitPairs(own, 1, 1, false, ownPair);
    this.visitPairs(other, 1, 1, true, otherPair);
  }

  private discBound(reLo: number, reHi: number, imLo: number, imHi: number): number {
    this.stats.boundsComputed++;
    const d2 = boxDistanceSquared(this.cRe, this.cIm, reLo, reHi, imLo, imHi);
    return d2 > 0 ? this.m / d2 : Infinity;
  }

  private visitSingles(tree: ImmittanceTree, node: number): void {
    if (tree.count[node] === 0) return;
    const tier = Math.max(this.baseTier, tree.minTier[node]);
    const bound = this.discBound(tree.reMin[node], tree.reMax[node], tree.imMin[node], tree.imMax[node]);
    if (!this.collector.canBeat(tier, bound)) return;
    if (node >= tree.leafCount) {
      const i = tree.order[node - tree.leafCount];
      this.evaluate(SINGLE, i, -1);
      return;
    }
    const l = 2 * node;
    const r = l + 1;
    // Nearer child first: it raises the k-th best sooner, so the other is pruned more often.
    const bl = tree.count[l] ? this.discBound(tree.reMin[l], tree.reMax[l], tree.imMin[l], tree.imMax[l]) : -1;
    const br = tree.count[r] ? this.discBound(tree.reMin[r], tree.reMax[r], tree.imMin[r], tree.imMax[r]) : -1;
    if (bl >= br) {
      this.visitSingles(tree, l);
      this.visitSingles(tree, r);
    } else {
      this.visitSingles(tree, r);
      this.visitSingles(tree, l);
    }
  }

  /** Bound of the pair of nodes (a, b): their sum box, carried to the natural plane when `invert`. */
  private pairBound(tree: ImmittanceTree, a: number, b: number, invert: boolean): number {
    const reLo = tree.reMin[a] + tree.reMin[b];
    const reHi = tree.reMax[a] + tree.reMax[b];
    const imLo = tree.imMin[a] + tree.imMin[b];
    const imHi = tree.imMax[a] + tree.imMax[b];
    if (!invert) return this.discBound(reLo, reHi, imLo, imHi);
    const box = invertBox(reLo, reHi, imLo, imHi, this.box);
    return this.discBound(box[0], box[1], box[2], box[3]);
  }

  private visitPairs(tree: ImmittanceTree, a: number, b: number, invert: boolean, arrangement: ArrangementCode): void {
    if (tree.count[a] === 0 || tree.count[b] === 0) return;
    const tier = Math.max(this.baseTier, tree.minTier[a], tree.minTier[b]);
    if (!this.collector.canBeat(tier, this.pairBound(tree, a, b, invert))) return;
    if (a >= tree.leafCount) {
      const i = tree.order[a - tree.leafCount];
      const j = tree.order[b - tree.leafCount];
      if (a === b) {
        if (this.candidates.canDouble[i]) this.evaluate(arrangement, i, i);
      } else this.evaluate(arrangement, Math.min(i, j), Math.max(i, j));
      return;
    }
    const a0 = 2 * a;
    const a1 = a0 + 1;
    const b0 = 2 * b;
    const b1 = b0 + 1;
    if (a === b) {
      this.visitOrdered(tree, invert, arrangement, a0, a0, a0, a1, a1, a1, -1, -1);
    } else {
      this.visitOrdered(tree, invert, arrangement, a0, b0, a0, b1, a1, b0, a1, b1);
    }
  }

  /** Visits up to four child pairs, best bound first (a pair with `-1` is absent). */
  private visitOrdered(tree: ImmittanceTree, invert: boolean, arrangement: ArrangementCode, ...pairs: number[]): void {
    const bounds = [-1, -1, -1, -1];
    const n = pairs[6] < 0 ? 3 : 4;
    for (let k = 0; k < n; k++) {
      const a = pairs[2 * k];
      const b = pairs[2 * k + 1];
      if (tree.count[a] && tree.count[b]) bounds[k] = this.pairBound(tree, a, b, invert);
    }
    for (let done = 0; done < n; done++) {
      let best = -1;
      for (let k = 0; k < n; k++) if (bounds[k] >= 0 && (best < 0 || bounds[k] > bounds[best])) best = k;
      if (best < 0) return;
      bounds[best] = -1;
      this.visitPairs(tree, pairs[2 * best], pairs[2 * best + 1], invert, arrangement);
    }
  }

  private evaluate(arrangement: ArrangementCode, first: number, second: number): void {
    const c = this.candidates;
    optionImmittance(c, arrangement, first, second, this.natural, this.value);
    const tier = Math.max(this.baseTier, c.tier[first], second >= 0 ? c.tier[second] : 0);
    const p = this.problem;
    this.stats.fitsEvaluated++;
    if (this.role === 'series') {
      const tpg = twoElementTpg(p.placement, p.source.re, p.source.im, p.load.re, p.load.im, this.value.re, this.value.im, this.ysRe, this.ysIm);
      this.collector.offer(this.shuntArrangement, this.shuntFirst, this.shuntSecond, arrangement, first, second, tpg, tier);
    } else {
      const tpg = twoElementTpg(p.placement, p.source.re, p.source.im, p.load.re, p.load.im, 0, 0, this.value.re, this.value.im);
      this.collector.offer(arrangement, first, second, -1, -1, -1, tpg, tier);
    }
  }

  // ---- both elements: shunt options best-first -----------------------------------------------

  private nearG = 0;
  private nearB = 0;
  private farR = 0;
  private farX = 0;
  private kappa = 0;
  private sign: 1 | -1 = 1;

  /** Upper bound V of point 2 over shunt admittances in `[gLo, gHi] x [bLo, bHi]`. */
  private shuntBoxBound(gLo: number, gHi: number, bLo: number, bHi: number): number {
    this.stats.boundsComputed++;
    const g1 = Math.max(gLo, 0);
    const w = invertBox(this.nearG + g1, this.nearG + gHi, this.nearB + bLo, this.nearB + bHi, this.box);
    const rLo = w[0];
    const rHi = w[1];
    if (!(rHi > 0)) return 0;
    const eta = this.nearG / (this.nearG + g1);
    // T = -(XF + X'); t = s T; its smallest value over the box, clipped at 0.
    const tLo = this.sign > 0 ? -this.farX - w[3] : this.farX + w[2];
    const tPlus = Math.max(tLo, 0);
    const rf = this.farR;
    const peak1 = Math.min(Math.max(rf, rLo), rHi);
    const v1 = peak1 / ((rf + peak1) * (rf + peak1));
    const shift = rf + this.kappa * tPlus;
    const peak2 = Math.min(Math.max(shift, rLo), rHi);
    const v2 = ((1 + this.kappa * this.kappa) * peak2) / ((shift + peak2) * (shift + peak2));
    return 4 * rf * eta * Math.min(v1, v2);
  }

  /** Exact V of one shunt option with admittance (yRe, yIm). */
  private shuntOptionBound(yRe: number, yIm: number): number {
    const p = this.problem;
    seriesSearchTerms(p.placement, p.source.re, p.source.im, p.load.re, p.load.im, yRe, yIm, this.terms);
    const d2 = wedgeDistanceSquared(this.terms.fixedResistanceOhm, this.terms.targetReactanceOhm, this.sign, this.kappa);
    return this.terms.numerator / d2;
  }

  private searchBoth(shunt: KindCandidates, series: KindCandidates): void {
    const p = this.problem;
    const near = p.placement === 'shunt-at-load' ? p.load : p.source;
    const far = p.placement === 'shunt-at-load' ? p.source : p.load;
    const m2 = near.re * near.re + near.im * near.im;
    this.nearG = near.re / m2;
    this.nearB = -near.im / m2;
    this.farR = far.re;
    this.farX = far.im;
    this.kappa = series.kappa;
    this.sign = series.sign;
    const queue = new BoundQueue();
    const push = (bound: number, kind: number, a: number, b: number, c: number, tier: number) => {
      const clipped = Math.min(bound, 1 + 1e-9);
      queue.push(clipped - TIER_KEY_STEP * tier, bound, kind, a, b, c, tier);
    };
    const y = shunt.yTree;
    const z = shunt.zTree;
    const nodeBox = (tree: ImmittanceTree, node: number) => this.shuntBoxBound(tree.reMin[node], tree.reMax[node], tree.imMin[node], tree.imMax[node]);
    const pairBox = (tree: ImmittanceTree, a: number, b: number, invert: boolean) => {
      const reLo = tree.reMin[a] + tree.reMin[b];
      const reHi = tree.reMax[a] + tree.reMax[b];
      const imLo = tree.imMin[a] + tree.imMin[b];
      const imHi = tree.imMax[a] + tree.imMax[b];
      if (!invert) return this.shuntBoxBound(reLo, reHi, imLo, imHi);
      const box = invertBox(reLo, reHi, imLo, imHi, new Float64Array(4));
      return this.shuntBoxBound(box[0], box[1], box[2], box[3]);
    };
    const pushOption = (arrangement: ArrangementCode, first: number, second: number) => {
      optionImmittance(shunt, arrangement, first, second, 'Y', this.value);
      const tier = Math.max(shunt.tier[first], second >= 0 ? shunt.tier[second] : 0);
      push(this.shuntOptionBound(this.value.re, this.value.im), SHUNT_OPTION, arrangement, first, second, tier);
    };
    const pushNode = (node: number) => {
      if (y.count[node] === 0) return;
      if (node >= y.leafCount) pushOption(SINGLE, y.order[node - y.leafCount], -1);
      else push(nodeBox(y, node), SHUNT_SINGLES, node, 0, 0, y.minTier[node]);
    };
    const pushPair = (kind: number, a: number, b: number) => {
      const tree = kind === SHUNT_PARALLEL ? y : z;
      if (tree.count[a] === 0 || tree.count[b] === 0) return;
      const arrangement: ArrangementCode = kind === SHUNT_PARALLEL ? PARALLEL_PAIR : SERIES_PAIR;
      if (a >= tree.leafCount) {
        const i = tree.order[a - tree.leafCount];
        const j = tree.order[b - tree.leafCount];
        if (a === b) {
          if (shunt.canDouble[i]) pushOption(arrangement, i, i);
        } else pushOption(arrangement, Math.min(i, j), Math.max(i, j));
        return;
      }
      push(pairBox(tree, a, b, kind === SHUNT_SERIES), kind, a, b, 0, Math.max(tree.minTier[a], tree.minTier[b]));
    };
    pushNode(1);
    if (p.combinations) {
      pushPair(SHUNT_PARALLEL, 1, 1);
      pushPair(SHUNT_SERIES, 1, 1);
    }
    while (queue.size > 0) {
      const top = queue.peek();
      if (!this.collector.canBeat(queue.tier(top), queue.bound(top))) break;
      const slot = queue.pop();
      const kind = queue.kind(slot);
      const a = queue.a(slot);
      const b = queue.b(slot);
      const c = queue.c(slot);
      const tier = queue.tier(slot);
      if (kind === SHUNT_OPTION) {
        this.stats.shuntOptionsSearched++;
        optionImmittance(shunt, a as ArrangementCode, b, c, 'Y', this.value);
        this.searchSeries(a as ArrangementCode, b, c, this.value.re, this.value.im, tier);
      } else if (kind === SHUNT_SINGLES) {
        pushNode(2 * a);
        pushNode(2 * a + 1);
      } else if (a === b) {
        pushPair(kind, 2 * a, 2 * a);
        pushPair(kind, 2 * a, 2 * a + 1);
        pushPair(kind, 2 * a + 1, 2 * a + 1);
      } else {
        pushPair(kind, 2 * a, 2 * b);
        pushPair(kind, 2 * a, 2 * b + 1);
        pushPair(kind, 2 * a + 1, 2 * b);
        pushPair(kind, 2 * a + 1, 2 * b + 1);
      }
    }
  }
}

/** The best fits of a search, best first, with its counters. */
export interface SearchResult {
  fits: FitCollector['entries'];
  stats: SearchStats;
}

/**
 * The `capacity` best fits by nominal TPG at f0 (full models), exactly as an exhaustive search over
 * every candidate pair would rank them (see the module comment for the bounds). With `limit`, only
 * fits ranking at or before it are returned (the objective windows use this).
 */
export function searchNominal(problem: SnapProblem, capacity: number, limit: CollectorLimit | null = null): SearchResult {
  const search = new NominalSearch(problem, capacity, limit);
  search.run();
  search.stats.fitsEvaluated = search.collector.offered;
  return { fits: search.collector.entries, stats: search.stats };
}
