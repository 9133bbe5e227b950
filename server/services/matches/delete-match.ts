/**
 * Deleting a saved match. Builds keep their own snapshot of each match they carry (migration 0005),
 * so a build planned with it still reads, reserves and lists its shortfall as before.
 */
import type { Sequelize } from 'sequelize';
import { Match, type User } from '../../models/index.js';
import { forbidden, notFound } from '../../errors.js';
import { recordAudit } from '../audit.js';

/**
 * Deletes saved match `id` for `actor`: the designer who saved it, or an admin. The audit keeps
 * what it was (name, chosen fit, parts).
 * @throws 404 when there is no such match; 403 when `actor` neither saved it nor is an admin
 */
export async function deleteMatch(sequelize: Sequelize, actor: Pick<User, 'id' | 'role'>, id: number): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const match = await Match.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!match) throw notFound(`Saved match ${id}`);
    if (actor.role !== 'admin' && match.createdBy !== actor.id) {
      throw forbidden('Only the designer who saved this match, or an admin, may delete it.');
    }
    await recordAudit(
      {
        actorId: actor.id,
        action: 'match.delete',
        entityType: 'match',
        entityId: match.id,
        before: { name: match.name, createdBy: match.createdBy, placement: match.placement, solution: match.solution, rank: match.rank, partIds: match.partIds },
      },
      transaction,
    );
    await match.destroy({ transaction });
  });
}
