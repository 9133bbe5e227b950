/**
 * Cancelling a build (designer or admin): what it holds goes back to available stock (`reserved`
 * falls, on hand stays), in one transaction with the part rows locked; the reservations become
 * `released`.
 */
import type { Sequelize } from 'sequelize';
import { Reservation } from '../../models/index.js';
import { conflict } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { lockBuild, lockStockShared } from './build-lifecycle-lock.js';
import { lockHeldParts, takeFromParts } from './held-stock.js';

/**
 * Releases what build `buildId` holds and marks it cancelled.
 * @throws 404 unknown build; 409 when it is already built or cancelled
 */
export async function cancelBuild(sequelize: Sequelize, buildId: number, actorId: number | null): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const build = await lockBuild(transaction, buildId);
    if (build.status !== 'planned' && build.status !== 'reserved') {
      throw conflict(`Build ${buildId} is ${build.status}; only a planned or reserved build can be cancelled.`);
    }
    await lockStockShared(sequelize, transaction);
    const parts = await lockHeldParts(sequelize, transaction, buildId);
    await takeFromParts(sequelize, transaction, parts, { consume: false });
    await Reservation.update({ state: 'released' }, { where: { buildId, state: 'held' }, transaction });
    const before = { status: build.status };
    build.status = 'cancelled';
    build.cancelledAt = new Date();
    await build.save({ transaction });
    await recordAudit(
      {
        actorId,
        action: 'build.cancel',
        entityType: 'build',
        entityId: buildId,
        before,
        after: { status: build.status, released: parts.map((p) => ({ partId: p.partId, partNumber: p.partNumber, quantity: p.held })) },
      },
      transaction,
    );
  });
}
