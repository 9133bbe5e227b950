/**
 * Locks shared by the build lifecycle and receiving into stock.
 *
 * Receiving computes each received part's new on-hand quantity (current + received) and enters it
 * through the stock-list importer, which runs in a transaction of its own. Marking a build built
 * lowers on-hand quantities. Both take this transaction-level advisory lock first, so a build
 * consumed between receiving's read and its import cannot be overwritten by the import.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { Build } from '../../models/index.js';
import { notFound } from '../../errors.js';

/** Advisory lock key of on-hand quantity changes made outside the importer ("SMRECV" in ASCII). */
export const ON_HAND_CHANGE_LOCK_KEY = 0x534d52454356;

/** Takes the on-hand change lock for the rest of `transaction`. */
export async function lockOnHandChanges(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: ON_HAND_CHANGE_LOCK_KEY }, transaction });
}

/** The build row, locked for the rest of `transaction` (so two status changes of one build queue). @throws 404 */
export async function lockBuild(transaction: Transaction, buildId: number): Promise<Build> {
  const build = await Build.findByPk(buildId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!build) throw notFound(`Build ${buildId}`);
  return build;
}
