/** Purchasing moves a shortfall list through draft, sent, ordered and received (and back, to correct a slip); each change is audited. */
import type { Sequelize } from 'sequelize';
import type { ShortfallStatus } from '../../../shared/api/builds.js';
import { ShortfallList } from '../../models/index.js';
import { conflict, notFound } from '../../errors.js';
import { recordAudit } from '../audit.js';

/**
 * Sets the status of build `buildId`'s shortfall list.
 * @throws 404 unknown build or no list; 409 when it already has that status
 */
export async function changeShortfallStatus(sequelize: Sequelize, buildId: number, status: ShortfallStatus, actorId: number | null): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const list = await ShortfallList.findOne({ where: { buildId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!list) throw notFound(`A shortfall list of build ${buildId}`);
    if (list.status === status) throw conflict(`The shortfall list of build ${buildId} is already ${status}.`);
    const before = { status: list.status };
    list.status = status;
    await list.save({ transaction });
    await recordAudit({ actorId, action: 'shortfall.status', entityType: 'shortfall_list', entityId: list.id, before, after: { status } }, transaction);
  });
}
