/**
 * The next-best stocked part for one element of a match when its chosen parts are short: the
 * element is snapped again, alone, against what stock remains, with the match's other elements kept
 * as built. This is the snapper's rule set (rf-engine.md "Snapping ideal networks to stock") for a
 * single element and single parts: candidates of the element's kind whose available quantity covers
 * the need, never a part at or above its SRF, above-limit parts ranked after every part within its
 * limit (or left out when the setting says so), ranked by worst-case loss at f0, ties broken by
 * larger SRF margin, more stock, then part number. Only substitutes whose worst case is within the
 * loss budget are offered.
 */
import type { FitLosses } from '../engine/losses.js';
import { DEFAULT_USABLE_SRF_FRACTION, frequencyStatus, partModel, type PartSpec } from '../engine/part-model.js';
import { designLosses, type MatchDesign } from './match-design.js';
import { DEFAULT_LOSS_BUDGET_DB } from './tolerance-needed.js';

/** A stocked part that might stand in. */
export interface StockCandidate {
  /** The part's row id. */
  id: number;
  partNumber: string;
  location: string;
  spec: PartSpec;
  /** On hand minus reserved, after what this allocation has already taken. */
  available: number;
  package: string | null;
}

/** Rules of the search (the organisation settings). */
export interface SubstituteRules {
  usableSrfFraction: number;
  excludeAboveLimit: boolean;
  lossBudgetDb: number;
}

/** Default rules: usable fraction 0.5, above-limit parts allowed (ranked last), 0.5 dB budget. */
export const DEFAULT_SUBSTITUTE_RULES: SubstituteRules = {
  usableSrfFraction: DEFAULT_USABLE_SRF_FRACTION,
  excludeAboveLimit: false,
  lossBudgetDb: DEFAULT_LOSS_BUDGET_DB,
};

/** The part found, with the match's losses when it stands in. */
export interface Substitute {
  candidate: StockCandidate;
  losses: FitLosses;
  /** Whether the part is used between its limit and its SRF. */
  aboveLimit: boolean;
}

/** SRF margin `SRF / f0` for ranking (unknown SRF ranks after every known one). */
function srfMargin(spec: PartSpec, frequencyHz: number): number {
  return spec.srfHz ? spec.srfHz / frequencyHz : 0;
}

/**
 * The best single stocked part to stand in for element `elementIndex` of `design`, or null when no
 * candidate with `partsNeeded` available keeps the worst case within the budget.
 * @param partsNeeded parts the build needs of the substitute (boards, one part per board)
 * @param exclude part ids not to consider (the short ones)
 */
export function bestSubstitute(
  design: MatchDesign,
  elementIndex: number,
  candidates: readonly StockCandidate[],
  partsNeeded: number,
  rules: SubstituteRules = DEFAULT_SUBSTITUTE_RULES,
  exclude: ReadonlySet<number> = new Set(),
): Substitute | null {
  const element = design.elements[elementIndex];
  if (!element) throw new RangeError(`bestSubstitute: the design has no element ${elementIndex}`);
  const f0 = design.frequencyHz;
  let best: Substitute | null = null;
  for (const candidate of candidates) {
    if (exclude.has(candidate.id) || candidate.spec.kind !== element.kind || candidate.available < partsNeeded) continue;
    const status = frequencyStatus(partModel(candidate.spec, candidate.partNumber), f0, rules.usableSrfFraction);
    if (status === 'at-or-above-srf') continue;
    const aboveLimit = status === 'above-limit';
    if (aboveLimit && rules.excludeAboveLimit) continue;
    const losses = designLosses(design, new Map([[elementIndex, candidate.spec]]));
    if (!(losses.worstCaseDb <= rules.lossBudgetDb)) continue;
    const trial: Substitute = { candidate, losses, aboveLimit };
    if (!best || ranksBefore(trial, best, f0)) best = trial;
  }
  return best;
}

function ranksBefore(a: Substitute, b: Substitute, frequencyHz: number): boolean {
  if (a.aboveLimit !== b.aboveLimit) return !a.aboveLimit;
  if (a.losses.worstCaseDb !== b.losses.worstCaseDb) return a.losses.worstCaseDb < b.losses.worstCaseDb;
  const marginA = srfMargin(a.candidate.spec, frequencyHz);
  const marginB = srfMargin(b.candidate.spec, frequencyHz);
  if (marginA !== marginB) return marginA > marginB;
  if (a.candidate.available !== b.candidate.available) return a.candidate.available > b.candidate.available;
  return a.candidate.partNumber < b.candidate.partNumber;
}
