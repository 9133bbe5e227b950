/**
 * Shapes of the saved-match routes (api.md "Matches": `POST /api/matches`, `GET /api/matches`,
 * `GET /api/matches/:id`). api.md fixes the request body `{name, request, chosen}`; the answers
 * below are this server's, and they keep the field names the match workspace reads (`request`,
 * `chosen`, `fit`, `sweep.frequenciesHz/idealTpg/fitTpg`, `createdAt`, `createdBy`).
 */
import type { MatchNetwork, MeasuredPortReference, NetworkPlacement, Objective, SolveRequest } from '../api/matches.js';
import type { MatchSweep, MeasuredTrace, SmithPath } from './match-sweep.js';
import type { SnappedFit } from './snapped-fit.js';
import type { SnapPart } from './snap-part.js';

/** Which fit of which ideal network was chosen (rank as the solve answer numbered it). */
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

/** A saved match in the list (`GET /api/matches` items). */
/**
 * A saved request as the list shows it: as saved, but a measured port names its file without the
 * text (which can be most of a megabyte; `GET /api/matches/:id` has it).
 */
export type SavedRequestSummary = Omit<SolveRequest, 'loadTouchstone' | 'sourceTouchstone'> & {
  loadTouchstone?: MeasuredPortReference | null;
  sourceTouchstone?: MeasuredPortReference | null;
};

export interface SavedMatchSummary {
  id: number;
  name: string;
  request: SavedRequestSummary;
  chosen: ChosenFit;
  objective: Objective;
  /** ISO 8601. */
  createdAt: string;
  createdBy: { id: number; name: string; email: string } | null;
  frequencyHz: number;
  /** The chosen fit's parts, e.g. `["C0402-3p3 x1", "L0402-10n x1"]`. */
  partNumbers: string[];
  totalDb: number;
  worstCaseDb: number;
}

/** `GET /api/matches` answer, newest first. */
export interface SavedMatchListResponse {
  items: SavedMatchSummary[];
  total: number;
}

/** A part of the fit whose stock entry changed (or went) since the match was saved. */
export interface StockChange {
  partId: number;
  partNumber: string;
  /** `gone`: no longer in the stock list; `changed`: its model fields differ; `short`: fewer available now than the fit needs. */
  change: 'gone' | 'changed' | 'short';
}

/** `GET /api/matches/:id` (and `POST /api/matches`) answer. */
export interface SavedMatchDetail extends Omit<SavedMatchSummary, 'request'> {
  /** The request as saved, measured files whole. */
  request: SolveRequest;
  /** The ideal network of the chosen placement and solution (its `fits` holds the chosen fit only). */
  network: MatchNetwork;
  /** The chosen fit with its losses, TPG, flags and yield, as computed when saved. */
  fit: SnappedFit;
  /** The settings it was ranked and judged with. */
  settings: { usableSrfFraction: number; excludeAboveLimit: boolean; lossBudgetDb: number };
  /** The stocked parts as they were when saved (the numbers above come from these). */
  parts: SnapPart[];
  /** TPG of the ideal network and the fit over frequency. */
  sweep: MatchSweep;
  /** Smith paths at f0; `measured` holds each measured port's impedance over the sweep (empty for typed ports). */
  smith: { ideal: SmithPath; fit: SmithPath; measured: MeasuredTrace[] };
  /** What changed in the stock since (empty when nothing did); the saved numbers stay as saved. */
  stockChanges: StockChange[];
}
