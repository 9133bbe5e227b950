/**
 * The saved matches a build is planned from, read as the allocation needs them: each match's
 * ports at f0, frequency, and per element of its chosen fit the ideal value, arrangement and the
 * stocked parts with how many one board needs (api.md "Matches": a saved match holds its request
 * and chosen fit).
 */
import type { Transaction } from 'sequelize';
import type { Fit, NetworkPlacement, SolveRequest } from '../../../shared/api/matches.js';
import { isEngineInputError } from '../../../shared/engine/engine-input-error.js';
import { solveLNetworks } from '../../../shared/engine/l-network.js';
import { parseSolveRequest } from '../../../shared/engine/solve-request.js';
import { HttpError, unprocessable } from '../../errors.js';
import type { PlannedElement } from '../../models/build-match.js';
import type { PlanToAllocate } from './allocate-stock.js';

const article = (kind: string) => `${/^[aeiou]/.test(kind) ? 'an' : 'a'} ${kind}`;

/** A saved match as far as a build needs it. */
export interface SavedMatchForPlan {
  id: number;
  name: string;
  request: SolveRequest;
  chosen: { placement: NetworkPlacement; solution: 1 | 2; rank: number };
  /** The chosen fit as it was saved (its elements with parts and arrangement). */
  fit: Pick<Fit, 'elements'>;
}

/**
 * The plan of one saved match: ports and frequency from its request, the ideal network of its chosen
 * placement and solution solved again by the engine (rf-engine.md "Ideal L networks"), in ladder
 * order, each element with the chosen fit's parts for that position (`quantity` per element is
 * what one board needs).
 * @throws 422 naming the match when its request no longer reads or its fit does not fit the network
 */
export function planOfSavedMatch(saved: SavedMatchForPlan): PlanToAllocate {
  const refuse = (why: string) => unprocessable(`Saved match ${saved.id} (${saved.name}) cannot be planned: ${why}.`, [{ field: 'matchIds', value: saved.id, message: why }]);
  let input;
  try {
    input = parseSolveRequest(saved.request);
  } catch (error) {
    if (isEngineInputError(error)) throw refuse(`its request does not read (${error.message})`);
    throw error;
  }
  const network = solveLNetworks(input.source, input.load, input.frequencyHz).networks.find(
    (n) => n.placement === saved.chosen.placement && n.solution === saved.chosen.solution,
  );
  if (!network) throw refuse(`it has no ${saved.chosen.placement} network ${saved.chosen.solution}`);
  const elements: PlannedElement[] = network.elements.map((ideal) => {
    const fitted = saved.fit.elements.find((e) => e.position === ideal.position);
    if (!fitted) throw refuse(`its fit has no ${ideal.position} element`);
    if (fitted.kind !== ideal.kind) throw refuse(`its fit's ${ideal.position} element is ${article(fitted.kind)}, the network needs ${article(ideal.kind)}`);
    return {
      position: ideal.position,
      kind: ideal.kind,
      idealValue: ideal.value,
      arrangement: fitted.arrangement,
      parts: fitted.parts.map((p) => ({ partNumber: p.partNumber, perBoard: p.quantity })),
    };
  });
  return {
    matchId: saved.id,
    matchName: saved.name,
    design: {
      source: input.source,
      load: input.load,
      frequencyHz: input.frequencyHz,
      elements,
      location: input.location,
      usableSrfFraction: input.usableSrfFraction,
      excludeAboveLimit: input.excludeAboveLimit,
    },
  };
}

/**
 * The plans of `matchIds`, in the order given.
 * @throws 404 naming every id that is not a saved match
 */
export async function readMatchPlans(matchIds: readonly number[], _transaction?: Transaction): Promise<PlanToAllocate[]> {
  // Saved matches (server/models/match.ts) are not in the code base yet; until they are, say so plainly.
  throw new HttpError(503, 'matches_unavailable', `Saved matches cannot be read yet, so no build can be planned from ${matchIds.join(', ')}.`);
}
