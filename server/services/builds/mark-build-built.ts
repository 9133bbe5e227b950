/**
 * Marking a build built (stores or admin): the parts it holds leave stock: on-hand quantity and
 * reserved both fall by what the build held, in one transaction with the part rows locked, and the
 * reservations become `consumed`.
 */
import type { Sequelize } from 'sequelize';
import { Reservation } from '../../models/index.js';
import { conflict } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { lockBuild, lockOnHandChanges, lockStockExclusive } from './build-lifecycle-lock.js';
import { lockHeldParts, takeFromParts } from './held-stock.js';

/**
 * Consumes what build `buildId` holds.
 * @throws 404 unknown build; 409 unless it is reserved, or when a stock import has since counted
 * fewer on hand than the build holds (the details name each such part)
 */
export async function markBuildBuilt(sequelize: Sequelize, buildId: number, actorId: number | null): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const build = await lockBuild(transaction, buildId);
    if (build.status !== 'reserved') throw conflict(`Build ${buildId} is ${build.status}; only a reserved build can be marked built.`);
    await lockOnHandChanges(sequelize, transaction);
    await lockStockExclusive(sequelize, transaction);
    const parts = await lockHeldParts(sequelize, transaction, buildId);
    const missing = parts.filter((p) => p.quantity < p.held);
    if (missing.length > 0) {
      throw conflict(
        `The stock list now counts fewer on hand than build ${buildId} holds, so it cannot be marked built: ${missing.map((p) => `${p.partNumber} at ${p.location} has ${p.quantity} for ${p.held} held`).join('; ')}. Correct the stock list first.`,
        missing.map((p) => ({ field: 'partNumber', value: p.partNumber, message: `${p.quantity} on hand, ${p.held} held by this build` })),
      );
    }
    await takeFromParts(sequelize, transaction, parts, { consume: true });
    await Reservation.update({ state: 'consumed' }, { where: { buildId, state: 'held' }, transaction });
    const before = { status: build.status };
    build.status = 'built';
    build.builtAt = new Date();
    await build.save({ transaction });
    await recordAudit(
      {
        actorId,
        action: 'build.built',
        entityType: 'build',
        entityId: buildId,
        before,
        after: { status: build.status, consumed: parts.map((p) => ({ partId: p.partId, partNumber: p.partNumber, quantity: p.held, onHandBefore: p.quantity, onHandAfter: p.quantity - p.held })) },
      },
      transaction,
    );
  });
}
