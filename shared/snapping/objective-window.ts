/**
 * Ranking by the `worst-case` and `band` objectives (rf-engine.md "Snapping": "For the other
 * objectives say how the candidate window is chosen").
 *
 * Neither objective has the disc structure the nominal search prunes with, so they are ranked over a
 * window of fits that the exact nominal search delivers, chosen so it holds every fit that can enter
 * the top k by the objective:
 *
 * 1. The nominal search gives the best `k0 = max(4k, 12)` fits; each is scored by the objective.
 *    When fewer than k0 fits exist at all, that is every fit, and the ranking is exact.
 * 2. Otherwise let `o_k` be the k-th best objective loss among them (tier first). The k best fits by
 *    objective overall are no worse than that, and each objective is bounded below by the nominal
 *    loss: the band loss is the largest loss over a band grid that includes f0 (`total <= band`),
 *    and the worst-case loss is the largest over tolerance corners, which is at least the nominal
 *    loss when the loss is quasi-convex in each part value (true for a part whose impedance moves
 *    along a line as its value moves: every capacitor, and inductors without Cp; an inductor with
 *    Cp moves along a short circle arc, where it holds near enough that {@link WINDOW_MARGIN_DB}
 *    covers it). So every fit of the top k has nominal loss `<= o_k + margin`.
 * 3. The nominal search runs again with that limit (tier first) and returns every such fit, up to
 *    {@link MAX_WINDOW_FITS} (the best by nominal loss if there are more; the answer then says so),
 *    and they are ranked by the objective with the usual tie rules.
 *
 * The property test checks the window against exhaustive search by each objective on random small
 * stock lists.
 */
import type { Objective } from '../api/matches.js';
import { lossDb } from '../engine/abcd.js';
import { bandLoss, type Band, worstCaseLoss } from '../engine/losses.js';
import type { PortModel } from '../engine/port-model.js';
import { compareFits, type FitCandidate, lossKeyOfDb, withLossKey } from './fit-collector.js';
import { fitModelLadder } from './fit-report.js';
import { searchNominal } from './nominal-search.js';
import type { SnapProblem } from './snap-problem.js';

/** Slack on "objective >= nominal" in the window rule, dB. */
export const WINDOW_MARGIN_DB = 0.01;
/** Most fits one window scores by the objective. */
export const MAX_WINDOW_FITS = 2000;

/** What an objective needs to score a fit. */
export interface ObjectiveContext {
  objective: Objective;
  source: PortModel;
  load: PortModel;
  frequencyHz: number;
  band: Band | null;
}

/** A fit with its objective loss. */
export interface ScoredFit {
  fit: FitCandidate;
  objectiveDb: number;
}

/** The result of a ranking: the best fits with their objective losses, and whether a window was cut short. */
export interface ObjectiveRanking {
  fits: ScoredFit[];
  /** Fits scored by the objective. */
  windowSize: number;
  /** True when more fits qualified for the window than {@link MAX_WINDOW_FITS}. */
  windowTruncated: boolean;
}

/**
 * The objective loss of one fit, dB: `nominal` the full-model loss at f0 (`-10 log10 TPG`),
 * `worst-case` the largest over all 2^k tolerance corners, `band` the largest over the band grid
 * (losses.ts).
 */
export function objectiveLossDb(problem: SnapProblem, fit: FitCandidate, context: ObjectiveContext): number {
  if (context.objective === 'nominal') return lossDb(fit.tpg);
  const ladder = fitModelLadder(problem, fit);
  if (context.objective === 'worst-case') return worstCaseLoss(ladder, context.source, context.load, context.frequencyHz).lossDb;
  if (!context.band) throw new Error('objectiveLossDb: the band objective needs a band');
  return bandLoss(ladder, context.source, context.load, context.band);
}

function score(problem: SnapProblem, fits: readonly FitCandidate[], context: ObjectiveContext): ScoredFit[] {
  return fits
    .map((fit) => {
      const objectiveDb = objectiveLossDb(problem, fit, context);
      return { fit: withLossKey(fit, lossKeyOfDb(objectiveDb)), objectiveDb };
    })
    .sort((a, b) => compareFits(a.fit, b.fit));
}

/** The `k` best fits by the context's objective (exact for `nominal`; the window above otherwise). */
export function rankByObjective(problem: SnapProblem, k: number, context: ObjectiveContext): ObjectiveRanking {
  if (context.objective === 'nominal') {
    const fits = searchNominal(problem, k).fits;
    return { fits: fits.map((fit) => ({ fit, objectiveDb: lossDb(fit.tpg) })), windowSize: fits.length, windowTruncated: false };
  }
  const k0 = Math.max(4 * k, 12);
  const first = searchNominal(problem, k0).fits;
  if (first.length < k0) {
    const scored = score(problem, first, context);
    return { fits: scored.slice(0, k), windowSize: first.length, windowTruncated: false };
  }
  const kth = score(problem, first, context)[k - 1];
  const limit = { tier: kth.fit.tier, lossKey: lossKeyOfDb(kth.objectiveDb + WINDOW_MARGIN_DB) };
  const window = searchNominal(problem, MAX_WINDOW_FITS, limit).fits;
  const scored = score(problem, window, context);
  return { fits: scored.slice(0, k), windowSize: window.length, windowTruncated: window.length >= MAX_WINDOW_FITS };
}
