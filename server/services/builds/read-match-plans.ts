/**
 * The saved matches a build is planned from, read as the allocation needs them: each match's
 * ports at f0, frequency, and per element of its chosen fit the ideal value, arrangement and the
 * stocked parts with how many one board needs (api.md "Matches": a saved match holds its request
 * and chosen fit).
 */
import type { Transaction } from 'sequelize';
import type { Fit, NetworkElement, NetworkPlacement, SolveRequest } from '../../../shared/api/matches.js';
import { isEngineInputError } from '../../../shared/engine/engine-input-error.js';
import { solveLNetworks } from '../../../shared/engine/l-network.js';
import { parseSolveRequest } from '../../../shared/engine/solve-request.js';
import { HttpError, unprocessable } from '../../errors.js';
import { Match } from '../../models/index.js';
import type { PlannedElement } from '../../models/build-match.js';
import type { PlanToAllocate } from './allocate-stock.js';

const article = (kind: string) => `${/^[aeiou]/.test(kind) ? 'an' : 'a'} ${kind}`;

/** A saved match as far as a build needs it. */
export interface SavedMatchForPlan {
  id: number;
  name: string;
  request: SolveRequest;
  chosen: { placement: NetworkPlacement; solution: 1 | 2; rank: number };
  /** The chosen fit as it was saved (its elements with parts and arrangement; parts may carry their row id and location). */
  fit: Pick<Fit, 'elements'>;
  /** The ideal network as it was saved; solved again from the request when absent. */
  network?: { elements: Pick<NetworkElement, 'position' | 'kind' | 'value'>[] };
}

/** A fit part as saved, with the row id and location the snapper adds. */
type SavedPart = Fit['elements'][number]['parts'][number] & { partId?: number; location?: string };

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
  const network =
    saved.network ??
    solveLNetworks(input.source, input.load, input.frequencyHz).networks.find((n) => n.placement === saved.chosen.placement && n.solution === saved.chosen.solution);
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
      parts: (fitted.parts as SavedPart[]).map((p) => ({
        partNumber: p.partNumber,
        perBoard: p.quantity,
        ...(p.partId !== undefined ? { partId: p.partId } : {}),
        ...(p.location !== undefined ? { location: p.location } : {}),
      })),
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
 * The plans of `matchIds`, in the order given, from the saved matches (server/models/match.ts: the
 * request, the chosen fit with its parts, and the ideal network it belongs to).
 * @throws 404 naming every id that is not a saved match; 422 for a match that cannot be planned
 */
export async function readMatchPlans(matchIds: readonly number[], transaction?: Transaction): Promise<PlanToAllocate[]> {
  const found = await Match.findAll({ where: { id: [...matchIds] }, transaction });
  const byId = new Map(found.map((m) => [Number(m.id), m]));
  const missing = matchIds.filter((id) => !byId.has(id));
  if (missing.length > 0) {
    throw new HttpError(
      404,
      'not_found',
      `Saved match${missing.length > 1 ? 'es' : ''} ${missing.join(', ')} ${missing.length > 1 ? 'were' : 'was'} not found.`,
      missing.map((id) => ({ field: 'matchIds', value: id, message: 'no saved match has this id' })),
    );
  }
  return matchIds.map((id) => {
    const match = byId.get(id)!;
    return planOfSavedMatch({
      id,
      name: match.name,
      request: match.request,
      chosen: { placement: match.placement, solution: match.solution, rank: match.rank },
      fit: match.fit,
      network: match.network,
    });
  });
}
