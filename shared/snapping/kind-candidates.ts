/**
 * The candidates of one part kind for one match (rf-engine.md "Snapping ideal networks to stock"):
 * stocked parts of the kind whose available quantity covers the need (build quantity per use), used
 * below their SRF, one candidate per electrical model (stock-index.ts; the members are the parts of
 * that model with enough stock), with their full-model impedance and admittance at f0 precomputed, and the two
 * sorted trees the searches walk (impedance plane: singles and series pairs of a series element;
 * admittance plane: singles and parallel pairs of a shunt element).
 *
 * Frequency limit (rf-engine.md "Part models"): at or above SRF a part is never used as its kind; between
 * `usableSrfFraction x SRF` and SRF it is used with tier 1 ("above limit", ranked after every fit
 * whose parts are all within their limits) unless the settings exclude such parts; without an SRF it
 * is tier 0 and flagged "limit unknown". A part whose full-model reactance at f0 has the other kind's
 * sign (a very lossy inductor just below SRF) does not behave as its kind either and is left out.
 */
import { angularFrequency, type PartKind } from '../engine/part-kind.js';
import { frequencyStatus, partImpedance, type PartModel } from '../engine/part-model.js';
import { buildImmittanceTree, type ImmittanceTree } from './immittance-tree.js';
import type { SnapPart } from './snap-part.js';
import type { MemberTable, StockIndex } from './stock-index.js';

/** What decides which parts are candidates. */
export interface CandidateRules {
  frequencyHz: number;
  /** Usable fraction of SRF (organisation setting, default 0.5). */
  usableSrfFraction: number;
  /** Leave out parts between the limit and SRF instead of ranking them last. */
  excludeAboveLimit: boolean;
  /** Boards to build: every use of a part needs this many. */
  buildQuantity: number;
}

/** Tier of a part used within its limit (or with an unknown limit). */
export const TIER_WITHIN = 0;
/** Tier bit of a part used between its limit and its SRF. */
export const TIER_ABOVE_LIMIT = 1;
/** Tier bit of a fit that needs more of a part than is available (a part used in both elements). */
export const TIER_SHORT_STOCK = 2;

/** Why stocked parts of the kind were not candidates (for the answer's notes). */
export interface ExcludedCounts {
  /** Available quantity below the build quantity. */
  shortStock: number;
  /** f0 at or above SRF. */
  atOrAboveSrf: number;
  /** Above the usable fraction of SRF while the settings exclude such parts. */
  aboveLimitExcluded: number;
  /** Reactance at f0 of the other kind's sign. */
  notItsKind: number;
}

/** The candidates of one kind; arrays are indexed by candidate index `0 .. count - 1`. */
export interface KindCandidates {
  readonly kind: PartKind;
  readonly count: number;
  /** A part of each candidate's model (every member shares its model fields). */
  readonly parts: readonly SnapPart[];
  readonly models: readonly PartModel[];
  /** Full-model impedance at f0, ohm. */
  readonly zRe: Float64Array;
  readonly zIm: Float64Array;
  /** Full-model admittance at f0 (`1/Z`), siemens. */
  readonly yRe: Float64Array;
  readonly yIm: Float64Array;
  /** {@link TIER_WITHIN} or {@link TIER_ABOVE_LIMIT}. */
  readonly tier: Uint8Array;
  /** f0/SRF, Infinity when SRF is unknown (ranks after every known margin). */
  readonly frequencyRatio: Float64Array;
  /** Whether the model may fill both places of a pair: one member with 2 x build quantity, or two with one each. */
  readonly canDouble: Uint8Array;
  /**
   * Members of candidate i: entries `memberStart[i] .. memberEnd[i] - 1` of `members` (ordered by unit
   * cost, then tie key), of which those with `available >= buildQuantity` may be used.
   */
  readonly memberStart: Int32Array;
  readonly memberEnd: Int32Array;
  readonly members: MemberTable;
  /** `min R/|X|` at f0 over the candidates (0 when any is lossless): every element of the kind has `R >= kappa |X|`. */
  readonly kappa: number;
  /** Sign of the reactance at f0: +1 inductors, -1 capacitors. */
  readonly sign: 1 | -1;
  /** Impedance-plane tree (sorted by X). */
  readonly zTree: ImmittanceTree;
  /** Admittance-plane tree (sorted by B). */
  readonly yTree: ImmittanceTree;
  readonly excluded: ExcludedCounts;
  readonly buildQuantity: number;
}

/**
 * Picks and prepares the candidates of `kind` from a stock index. Full models at f0: capacitor
 * `Z = ESR + j(w ESL - 1/(w C))`, inductor `Z = 1/(1/(R + j w L) + j w Cp)` (rf-engine.md "Part
 * models"), `Y = 1/Z`. O(groups log groups + parts).
 */
export function buildKindCandidates(index: StockIndex, kind: PartKind, rules: CandidateRules): KindCandidates {
  const omega = angularFrequency(rules.frequencyHz);
  const sign: 1 | -1 = kind === 'inductor' ? 1 : -1;
  const q = rules.buildQuantity;
  const excluded: ExcludedCounts = { shortStock: 0, atOrAboveSrf: 0, aboveLimitExcluded: 0, notItsKind: 0 };
  const kept: SnapPart[] = [];
  const models: PartModel[] = [];
  const z = { re: 0, im: 0 };
  const zRe: number[] = [];
  const zIm: number[] = [];
  const tiers: number[] = [];
  const doubles: number[] = [];
  const memberStart: number[] = [];
  const memberEnd: number[] = [];
  const table = index.members[kind];
  const available = table.available;
  for (const group of index.groups[kind]) {
    let eligible = 0;
    let uses = 0;
    for (let k = group.start; k < group.end; k++) {
      if (available[k] >= q) {
        eligible++;
        uses += Math.floor(available[k] / q);
      }
    }
    excluded.shortStock += group.end - group.start - eligible;
    if (eligible === 0) continue;
    const model = group.partModel;
    const status = frequencyStatus(model, rules.frequencyHz, rules.usableSrfFraction);
    if (status === 'at-or-above-srf') {
      excluded.atOrAboveSrf += eligible;
      continue;
    }
    if (status === 'above-limit' && rules.excludeAboveLimit) {
      excluded.aboveLimitExcluded += eligible;
      continue;
    }
    partImpedance(model, omega, z);
    if (!(sign * z.im > 0) || !Number.isFinite(z.re)) {
      excluded.notItsKind += eligible;
      continue;
    }
    kept.push(group.model);
    models.push(model);
    zRe.push(z.re);
    zIm.push(z.im);
    tiers.push(status === 'above-limit' ? TIER_ABOVE_LIMIT : TIER_WITHIN);
    doubles.push(uses >= 2 ? 1 : 0);
    memberStart.push(group.start);
    memberEnd.push(group.end);
  }
  const n = kept.length;
  const yRe = new Float64Array(n);
  const yIm = new Float64Array(n);
  const frequencyRatio = new Float64Array(n);
  const zr = Float64Array.from(zRe);
  const zi = Float64Array.from(zIm);
  let kappa = Infinity;
  for (let i = 0; i < n; i++) {
    const d = zr[i] * zr[i] + zi[i] * zi[i];
    yRe[i] = zr[i] / d;
    yIm[i] = -zi[i] / d;
    const srf = kept[i].srfHz;
    frequencyRatio[i] = srf === null ? Infinity : rules.frequencyHz / srf;
    kappa = Math.min(kappa, zr[i] / Math.abs(zi[i]));
  }
  // A shade under the smallest ratio, so rounding in sums of two parts never leaves the wedge.
  kappa = n === 0 ? 0 : Math.max(0, kappa * (1 - 1e-9));
  const tier = Uint8Array.from(tiers);
  return {
    kind,
    count: n,
    parts: kept,
    models,
    zRe: zr,
    zIm: zi,
    yRe,
    yIm,
    tier,
    frequencyRatio,
    canDouble: Uint8Array.from(doubles),
    memberStart: Int32Array.from(memberStart),
    memberEnd: Int32Array.from(memberEnd),
    members: table,
    kappa,
    sign,
    zTree: buildImmittanceTree(zr, zi, tier, n),
    yTree: buildImmittanceTree(yRe, yIm, tier, n),
    excluded,
    buildQuantity: q,
  };
}
