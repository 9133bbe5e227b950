/**
 * `POST /api/matches` (api.md): solve the request again against the stock as it is now, take the fit
 * the client chose (placement, solution, rank), and save it with its inputs, results, the settings in
 * force and a snapshot of its parts, in one transaction with its audit entry.
 */
import type { Sequelize } from 'sequelize';
import type { SavedMatchDetail, SaveMatchRequest } from '../../../shared/snapping/saved-match.js';
import { HttpError, conflict } from '../../errors.js';
import { Match, User } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { presentMatchDetail } from './present-match.js';
import { solveMatch } from './solve-match.js';

/**
 * Saves a match by `actorId`.
 * @throws 400 for a bad request; 409 when the chosen network or rank is not in the answer now (the
 *   stock changed since the client solved, or the rank was never there)
 */
export async function saveMatch(sequelize: Sequelize, actorId: number, body: SaveMatchRequest): Promise<SavedMatchDetail> {
  return sequelize.transaction(async (transaction) => {
    const solved = await solveMatch(sequelize, body.request, transaction).catch((error: unknown) => {
      // The request sits under `request` in this body: say so in every detail's field.
      if (error instanceof HttpError && error.code === 'invalid_input' && error.details) {
        throw new HttpError(
          error.status,
          error.code,
          error.message,
          error.details.map((d) => ('field' in d && typeof d.field === 'string' ? { ...d, field: `request.${d.field}` } : d)),
        );
      }
      throw error;
    });
    const { placement, solution, rank } = body.chosen;
    const network = solved.response.networks.find((n) => n.placement === placement && n.solution === solution);
    const where = [{ field: 'chosen', value: body.chosen, message: '' }];
    if (!network) {
      const known = solved.response.networks.map((n) => `${n.placement} ${n.solution}`).join(', ') || 'none';
      throw conflict(`The request has no ${placement} network ${solution} (it has: ${known}).`, [{ ...where[0], message: `no ${placement} network ${solution}` }]);
    }
    const fit = network.fits.find((f) => f.rank === rank);
    if (!fit) {
      throw conflict(
        `The ${placement} network ${solution} has ${network.fits.length} fit(s) from the stock now, so there is no fit ranked ${rank}: solve again and choose from the new answer.`,
        [{ ...where[0], message: `no fit ranked ${rank}` }],
      );
    }
    const partIds = [...new Set(fit.elements.flatMap((e) => e.parts.map((p) => p.partId)))];
    const byId = new Map(solved.parts.map((p) => [p.id, p]));
    const { fits: _fits, ...idealNetwork } = network;
    const match = await Match.create(
      {
        name: body.name,
        createdBy: actorId,
        request: body.request,
        placement,
        solution,
        rank,
        objective: solved.response.snapping.objective,
        fit,
        network: idealNetwork,
        settings: {
          usableSrfFraction: solved.response.snapping.usableSrfFraction,
          excludeAboveLimit: solved.response.snapping.excludeAboveLimit,
          lossBudgetDb: solved.settings.lossBudgetDb,
        },
        parts: partIds.map((id) => byId.get(id)!),
        partIds,
      },
      { transaction },
    );
    await recordAudit(
      { actorId, action: 'match.create', entityType: 'match', entityId: match.id, after: { name: match.name, placement, solution, rank, partIds } },
      transaction,
    );
    const user = await User.findByPk(actorId, { transaction });
    return presentMatchDetail(sequelize, match, user, transaction);
  });
}
