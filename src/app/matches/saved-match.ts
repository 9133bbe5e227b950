/**
 * The saved-match shapes the workspace reads (api.md "Matches": `POST /api/matches`,
 * `GET /api/matches`, `GET /api/matches/:id`), as the server defines them in
 * shared/snapping/saved-match.ts, under the names the workspace uses.
 */
export type {
  ChosenFit,
  SaveMatchRequest,
  SavedMatchDetail as SavedMatch,
  SavedMatchListResponse,
  SavedMatchSummary,
  StockChange,
} from '../../../shared/snapping/saved-match.js';
export type { MatchSweep } from '../../../shared/snapping/match-sweep.js';
