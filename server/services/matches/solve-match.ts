/**
 * `POST /api/matches/solve` (api.md "Matches"): read the request, the settings and the stock, and let
 * the snapper fill the fits (shared/snapping/snap-match.ts) on a solve thread. Saves nothing.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { type EngineInputProblem, isEngineInputError } from '../../../shared/engine/engine-input-error.js';
import { parseSolveRequest, type SolveInput } from '../../../shared/engine/solve-request.js';
import type { SnappedSolveResponse, SnapSettings } from '../../../shared/snapping/snap-match.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import { badRequest } from '../../errors.js';
import { readSettings } from '../settings/read-settings.js';
import { loadSolveStock } from './load-stock-index.js';
import { snapOnThread } from './solve-pool.js';

/** A solved request with everything a save needs. */
export interface SolvedMatch {
  input: SolveInput;
  settings: SnapSettings;
  response: SnappedSolveResponse;
  parts: SnapPart[];
}

/** One problem as a 400's detail; `line` when it is inside an uploaded file. */
function detailOf(d: EngineInputProblem): { field: string; value: unknown; message: string; line?: number } {
  return d.line === undefined ? { field: d.field, value: d.value, message: d.message } : { field: d.field, value: d.value, message: d.message, line: d.line };
}

/**
 * The request checked into SI numbers.
 * @throws 400 `invalid_input` whose details name each bad field (engine solve-request.ts)
 */
export function readSolveRequest(body: unknown, what = 'solve request'): SolveInput {
  try {
    return parseSolveRequest(body);
  } catch (error) {
    if (!isEngineInputError(error)) throw error;
    throw badRequest(
      `The ${what} is not valid: ${error.message}`,
      error.details.map(detailOf),
    );
  }
}

/**
 * Solves `body` against the stock as it is now; `signal` gives the solve up (its caller went away).
 * @throws the signal's reason once `signal` has fired
 */
export async function solveMatch(sequelize: Sequelize, body: unknown, transaction?: Transaction, signal?: AbortSignal): Promise<SolvedMatch> {
  const input = readSolveRequest(body);
  const objectiveGiven = typeof body === 'object' && body !== null && (body as { objective?: unknown }).objective != null;
  const org = await readSettings(transaction);
  const settings: SnapSettings = {
    usableSrfFraction: org.usableSrfFraction,
    excludeAboveLimit: org.excludeAboveLimit,
    defaultObjective: org.defaultObjective,
    lossBudgetDb: org.lossBudgetDb,
  };
  const { parts, key, fingerprint } = await loadSolveStock(sequelize, { location: input.location }, transaction);
  let response: SnappedSolveResponse;
  try {
    // On a solve thread (solve-pool.ts), so a long snap holds up no other request.
    response = await snapOnThread(input, settings, { objectiveGiven, location: input.location }, { key, fingerprint, parts }, signal);
  } catch (error) {
    if (isEngineInputError(error)) throw badRequest(`The solve request is not valid: ${error.message}`, error.details.map(detailOf));
    throw error;
  }
  if (input.location && parts.length === 0) {
    response.notes = [...(response.notes ?? []), `No part of the stock list is at location "${input.location}"; check its spelling (GET /api/parts/locations lists them).`];
  }
  return { input, settings, response, parts };
}
