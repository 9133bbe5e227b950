/**
 * A whole `POST /api/matches/solve` answer: the ideal networks (engine solve-ideal.ts) with their
 * stocked fits filled in (api.md "Matches"), for a stock index and the organisation's settings.
 * Pure: the server loads the stock and the settings and calls {@link snapMatch}.
 */
import type { Objective, SolveResponse } from '../api/matches.js';
import { solveLNetworks } from '../engine/l-network.js';
import { bandAround } from '../engine/losses.js';
import { DEFAULT_USABLE_SRF_FRACTION } from '../engine/part-model.js';
import { solveIdeal } from '../engine/solve-ideal.js';
import type { SolveInput } from '../engine/solve-request.js';
import { buildKindCandidates, type KindCandidates } from './kind-candidates.js';
import { rankByObjective } from './objective-window.js';
import { type ReportContext, reportFit } from './fit-report.js';
import { type CandidatesByKind, snapProblemFor } from './snap-problem.js';
import type { SnappedFit } from './snapped-fit.js';
import type { StockIndex } from './stock-index.js';

/** The organisation settings the snapper reads (shared/api/settings.ts holds them all). */
export interface SnapSettings {
  /** Usable fraction of SRF, default 0.5 (a common rule of thumb). */
  usableSrfFraction: number;
  excludeAboveLimit: boolean;
  /** Objective when a request names none. */
  defaultObjective: Objective;
  /** Loss budget for the yield, dB (default 0.5). */
  lossBudgetDb: number;
}

/** Settings when the organisation has changed none. */
export const DEFAULT_SNAP_SETTINGS: Readonly<SnapSettings> = Object.freeze({
  usableSrfFraction: DEFAULT_USABLE_SRF_FRACTION,
  excludeAboveLimit: false,
  defaultObjective: 'worst-case',
  lossBudgetDb: 0.5,
});

/** Monte Carlo samples per fit in a solve answer (a saved match keeps the same figure). */
export const SOLVE_YIELD_SAMPLES = 2000;

/** Options of {@link snapMatch}. */
export interface SnapMatchOptions {
  /** Whether the request named its objective (else the settings' default applies). */
  objectiveGiven?: boolean;
  /** Where the stock was limited to, for the notes. */
  location?: string | null;
  yieldSamples?: number;
}

/** What the snapper did, beyond api.md (extension `snapping` of the answer). */
export interface SnappingSummary {
  objective: Objective;
  usableSrfFraction: number;
  excludeAboveLimit: boolean;
  buildQuantity: number;
  combinations: boolean;
  /** Stocked parts searched, and how many electrical models they form. */
  stockParts: number;
  candidates: { capacitor: number; inductor: number };
  excluded: { capacitor: KindCandidates['excluded']; inductor: KindCandidates['excluded'] };
  /** Fits scored by the objective per network (the window; equals the fits found for `nominal`). */
  windows: { placement: string; solution: number; size: number; truncated: boolean }[];
}

/** The solve answer with the snapping extension. */
export interface SnappedSolveResponse extends SolveResponse {
  networks: (Omit<SolveResponse['networks'][number], 'fits'> & { fits: SnappedFit[] })[];
  snapping: SnappingSummary;
}

const KIND_WORD = { capacitor: 'capacitors', inductor: 'inductors' } as const;

function describeShortage(c: KindCandidates, buildQuantity: number): string {
  const why: string[] = [];
  const e = c.excluded;
  if (e.shortStock) why.push(`${e.shortStock} have fewer than ${buildQuantity} available`);
  if (e.atOrAboveSrf) why.push(`${e.atOrAboveSrf} have their SRF at or below the frequency`);
  if (e.aboveLimitExcluded) why.push(`${e.aboveLimitExcluded} are above the usable fraction of their SRF, which the settings exclude`);
  if (e.notItsKind) why.push(`${e.notItsKind} do not behave as ${KIND_WORD[c.kind]} at the frequency`);
  return why.length ? ` (of the stocked ${KIND_WORD[c.kind]}, ${why.join('; ')})` : '';
}

/**
 * Solves the ideal networks of `input` and snaps each to the stock in `index`: candidates of each
 * kind (available quantity covering build quantity per use, frequency limits, combinations when
 * asked), the best `fitsPerNetwork` fits by the objective (exact for `nominal`, objective-window.ts
 * for the others), each reported with its losses, flags and yield (fit-report.ts). An empty stock
 * gives networks with empty fits and a note, never an error.
 * @throws EngineInputError for bad ports, frequency or power (as solve-ideal.ts)
 */
export function snapMatch(input: SolveInput, index: StockIndex, settings: SnapSettings, options: SnapMatchOptions = {}): SnappedSolveResponse {
  const ideal = solveIdeal(input);
  const solution = solveLNetworks(input.source, input.load, input.frequencyHz);
  const usableSrfFraction = input.usableSrfFraction ?? settings.usableSrfFraction;
  const excludeAboveLimit = input.excludeAboveLimit ?? settings.excludeAboveLimit;
  const notes = [...(ideal.notes ?? [])];
  let objective: Objective = options.objectiveGiven === false ? settings.defaultObjective : input.objective;
  if (objective === 'band' && input.bandwidthHz === null) {
    notes.push('The default objective is "band" but the request gives no bandwidth, so fits are ranked by worst case.');
    objective = 'worst-case';
  }
  const rules = { frequencyHz: input.frequencyHz, usableSrfFraction, excludeAboveLimit, buildQuantity: input.buildQuantity };
  const candidates: CandidatesByKind = {
    capacitor: buildKindCandidates(index, 'capacitor', rules),
    inductor: buildKindCandidates(index, 'inductor', rules),
  };
  // Typed ports are R with the L or C of their X at f0; measured ones follow their file (solve-request.ts).
  const source = input.sourcePort;
  const load = input.loadPort;
  const band = input.bandwidthHz === null ? null : bandAround(input.frequencyHz, input.bandwidthHz);
  const context: ReportContext = {
    source,
    load,
    frequencyHz: input.frequencyHz,
    band,
    powerW: input.powerW,
    usableSrfFraction,
    buildQuantity: input.buildQuantity,
    budgetDb: settings.lossBudgetDb,
    yieldSamples: options.yieldSamples ?? SOLVE_YIELD_SAMPLES,
  };
  const where = options.location ? ` at location ${options.location}` : '';
  if (index.partCount === 0) {
    notes.push(`The stock list${where} holds no parts, so no network can be fitted from stock: import a stock list, or choose another location.`);
  }
  const windows: SnappingSummary['windows'] = [];
  const networks = ideal.networks.map((network) => {
    const idealNetwork = solution.networks.find((n) => n.placement === network.placement && n.solution === network.solution)!;
    const problem = snapProblemFor(idealNetwork, input.source, input.load, candidates, input.combinations);
    const ranking = rankByObjective(problem, input.fitsPerNetwork, { objective, source, load, frequencyHz: input.frequencyHz, band });
    windows.push({ placement: network.placement, solution: network.solution, size: ranking.windowSize, truncated: ranking.windowTruncated });
    if (ranking.windowTruncated) {
      notes.push(
        `${network.placement} solution ${network.solution}: more fits came close than the ${objective} ranking scores, so it ranked the best ${ranking.windowSize} by nominal loss.`,
      );
    }
    const fits = ranking.fits.map((scored, i) => reportFit(problem, scored.fit, i + 1, scored.objectiveDb, context));
    if (fits.length === 0 && index.partCount > 0) {
      const missing = network.elements
        .filter((e) => candidates[e.kind].count === 0)
        .map((e) => `no stocked ${e.kind} can serve as the ${e.position} element${describeShortage(candidates[e.kind], input.buildQuantity)}`);
      notes.push(`${network.placement} solution ${network.solution}: no fit from stock${where}: ${missing.join('; ') || 'no candidate pair qualifies'}.`);
    }
    return { ...network, fits };
  });
  return {
    ...ideal,
    networks,
    notes,
    snapping: {
      objective,
      usableSrfFraction,
      excludeAboveLimit,
      buildQuantity: input.buildQuantity,
      combinations: input.combinations,
      stockParts: index.partCount,
      candidates: { capacitor: candidates.capacitor.count, inductor: candidates.inductor.count },
      excluded: { capacitor: candidates.capacitor.excluded, inductor: candidates.inductor.excluded },
      windows,
    },
  };
}
