/**
 * The fit as `POST /api/matches/solve` answers it: api.md's `Fit` (shared/api/matches.ts) with
 * extensions the contract allows (api.md: "extend it, do not break it"): each part's id, location
 * and available quantity, the yield within the loss budget, and the tie-rule figures.
 */
import type { Fit, FitElement, FitPart } from '../api/matches.js';

/** A stocked part of a fit element (extension fields after api.md's `partNumber` and `quantity`). */
export interface SnappedFitPart extends FitPart {
  partId: number;
  location: string;
  /** On hand minus reserved when solved. */
  available: number;
  /** Decimal string, or null when the stock list gives none. */
  unitCost: string | null;
}

/** A fit element with {@link SnappedFitPart}s. */
export interface SnappedFitElement extends FitElement {
  parts: SnappedFitPart[];
}

/** A fit with the extensions of this module. */
export interface SnappedFit extends Fit {
  elements: SnappedFitElement[];
  /** Share of Monte Carlo samples whose total loss stays within `yieldBudgetDb` (0..1). */
  yield: number;
  yieldBudgetDb: number;
  yieldSamples: number;
  /** The loss the fits were ranked by (the objective's), dB. */
  objectiveDb: number;
  /** How many times over the stock covers the build quantity (the "more stock" tie rule). */
  stockCover: number;
  /** Unit costs x quantities per build, decimal string; null when a part's cost is unknown. */
  costPerBuild: string | null;
}
