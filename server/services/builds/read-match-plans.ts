/**
 * The saved matches a build is planned from, read as the allocation needs them: each match's
 * ports at f0, frequency, and per element of its chosen fit the ideal value, arrangement and the
 * stocked parts with how many one board needs (api.md "Matches": a saved match holds its request
 * and chosen fit).
 */
import type { Transaction } from 'sequelize';
import { HttpError } from '../../errors.js';
import type { PlanToAllocate } from './allocate-stock.js';

/**
 * The plans of `matchIds`, in the order given.
 * @throws 404 naming every id that is not a saved match
 */
export async function readMatchPlans(matchIds: readonly number[], _transaction?: Transaction): Promise<PlanToAllocate[]> {
  // Saved matches (server/models/match.ts) are not in the code base yet; until they are, say so plainly.
  throw new HttpError(503, 'matches_unavailable', `Saved matches cannot be read yet, so no build can be planned from ${matchIds.join(', ')}.`);
}
