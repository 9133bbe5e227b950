/**
 * The saved-match shapes the workspace reads (api.md "Matches": `POST /api/matches`,
 * `GET /api/matches`, `GET /api/matches/:id`). api.md fixes the request body; the answers here are
 * the fields the workspace relies on. When shared/api/matches.ts gains its own saved-match types,
 * these become aliases of them.
 */
import type { Fit, NetworkPlacement, SolveRequest, SolveResponse } from '../../../shared/api/matches.js';

/** Which fit of which ideal network was chosen. */
export interface ChosenFit {
  placement: NetworkPlacement;
  solution: 1 | 2;
  rank: number;
}

/** `POST /api/matches` body. */
export interface SaveMatchRequest {
  name: string;
  request: SolveRequest;
  chosen: ChosenFit;
}

/** A saved match as the list shows it. */
export interface SavedMatchSummary {
  id: number;
  name: string;
  request?: SolveRequest;
  chosen?: ChosenFit;
  createdAt?: string;
  /** Who saved it, when the server says. */
  createdBy?: string | { name?: string; email?: string } | null;
}

/** Sweep data for the plots: TPG of the ideal network and of the chosen fit over frequency. */
export interface MatchSweep {
  frequenciesHz: number[];
  idealTpg?: number[];
  fitTpg?: number[];
}

/** `GET /api/matches/:id`. */
export interface SavedMatch extends SavedMatchSummary {
  request: SolveRequest;
  chosen: ChosenFit;
  /** The chosen fit with its losses and TPG. */
  fit?: Fit;
  /** The solve answer as it was when saved, when the server keeps it. */
  result?: SolveResponse;
  sweep?: MatchSweep;
}
