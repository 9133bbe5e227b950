/**
 * One ideal network to snap: its placement, the ports at f0, and the candidates for each of its
 * elements (null when the ideal network has no such element). A fit is one option for each present
 * element (rf-engine.md "Snapping": "one candidate for the shunt element and one for the series
 * element of one ideal network"), evaluated at f0 with full part models.
 */
import { twoElementTpg } from '../engine/abcd.js';
import type { Complex } from '../engine/complex.js';
import type { Placement } from '../engine/part-kind.js';
import type { KindCandidates } from './kind-candidates.js';
import { type ArrangementCode, optionImmittance } from './snap-option.js';

/** What a search snaps. */
export interface SnapProblem {
  placement: Placement;
  /** Zs at f0, ohm. */
  source: Complex;
  /** ZL at f0, ohm. */
  load: Complex;
  frequencyHz: number;
  /** Candidates of the shunt element's kind; null when the network has no shunt element. */
  shunt: KindCandidates | null;
  /** Candidates of the series element's kind; null when the network has no series element. */
  series: KindCandidates | null;
  /** Whether two-part series and parallel options are allowed. */
  combinations: boolean;
}

const shuntScratch: Complex = { re: 0, im: 0 };
const seriesScratch: Complex = { re: 0, im: 0 };

/**
 * TPG at f0 of the fit made of the given options (arrangement -1: element absent), full models:
 * the L network's ABCD matrix into `TPG = 4 Rs RL / |A ZL + B + C Zs ZL + D Zs|^2`
 * (rf-engine.md "Evaluating a network"; abcd.ts `twoElementTpg`).
 */
export function fitTpgAtF0(
  problem: SnapProblem,
  shuntArrangement: ArrangementCode | -1,
  shuntFirst: number,
  shuntSecond: number,
  seriesArrangement: ArrangementCode | -1,
  seriesFirst: number,
  seriesSecond: number,
): number {
  let yRe = 0;
  let yIm = 0;
  let zRe = 0;
  let zIm = 0;
  if (shuntArrangement >= 0) {
    optionImmittance(problem.shunt!, shuntArrangement as ArrangementCode, shuntFirst, shuntSecond, 'Y', shuntScratch);
    yRe = shuntScratch.re;
    yIm = shuntScratch.im;
  }
  if (seriesArrangement >= 0) {
    optionImmittance(problem.series!, seriesArrangement as ArrangementCode, seriesFirst, seriesSecond, 'Z', seriesScratch);
    zRe = seriesScratch.re;
    zIm = seriesScratch.im;
  }
  const s = problem.source;
  const l = problem.load;
  return twoElementTpg(problem.placement, s.re, s.im, l.re, l.im, zRe, zIm, yRe, yIm);
}

/** The candidates of both kinds for one match, built once and shared by its networks. */
export interface CandidatesByKind {
  capacitor: KindCandidates;
  inductor: KindCandidates;
}

/**
 * The problem of snapping one ideal network: the shunt and series element kinds pick their candidate
 * sets; an absent element (a one-element network) has none.
 */
export function snapProblemFor(
  network: { placement: Placement; frequencyHz: number; elements: readonly { position: 'series' | 'shunt'; kind: 'capacitor' | 'inductor' }[] },
  source: Complex,
  load: Complex,
  candidates: CandidatesByKind,
  combinations: boolean,
): SnapProblem {
  const shunt = network.elements.find((e) => e.position === 'shunt');
  const series = network.elements.find((e) => e.position === 'series');
  return {
    placement: network.placement,
    source,
    load,
    frequencyHz: network.frequencyHz,
    shunt: shunt ? candidates[shunt.kind] : null,
    series: series ? candidates[series.kind] : null,
    combinations,
  };
}
