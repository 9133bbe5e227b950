/**
 * Locks shared by the build lifecycle and receiving into stock.
 *
 * The stock-list importer holds the stock lock (`lockStockQuantities`) exclusively for its whole
 * transaction and updates part rows in no particular order. So everything here that locks part
 * rows takes that same advisory lock first: shared for reserving and releasing (which change only
 * `reserved`, and may run side by side, queueing on the rows they share), exclusive for marking
 * built (which lowers on-hand quantities, as an import writes them). Then an import never waits
 * for a part row held by a build, and no deadlock can form between them.
 *
 * Receiving computes each received part's new on-hand quantity (current + received) and enters it
 * through the stock-list importer inside its own transaction. Marking a build built lowers on-hand
 * quantities. Both take this transaction-level advisory lock first and then the stock lock
 * exclusively (always in that order, so they cannot deadlock), so neither a build consumed nor a
 * stores upload between receiving's read and its import can be overwritten by the import.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { Build } from '../../models/index.js';
import { notFound } from '../../errors.js';
import { STOCK_IMPORT_LOCK_KEY, lockStockQuantities } from '../stock/import-stock-list.js';

/** Advisory lock key of on-hand quantity changes made outside the importer ("SMRECV" in ASCII). */
export const ON_HAND_CHANGE_LOCK_KEY = 0x534d52454356;

/** Takes the on-hand change lock for the rest of `transaction`. */
export async function lockOnHandChanges(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: ON_HAND_CHANGE_LOCK_KEY }, transaction });
}

/** Takes the stock lock shared (side by side with other builds, never with an import) for the rest of `transaction`. */
export async function lockStockShared(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  await sequelize.query('SELECT pg_advisory_xact_lock_shared(:key)', { replacements: { key: STOCK_IMPORT_LOCK_KEY }, transaction });
}

/** Takes the stock lock exclusively (as an import does) for the rest of `transaction`. */
export async function lockStockExclusive(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  await lockStockQuantities(sequelize, transaction);
}

/** The build row, locked for the rest of `transaction` (so two status changes of one build queue). @throws 404 */
export async function lockBuild(transaction: Transaction, buildId: number): Promise<Build> {
  const build = await Build.findByPk(buildId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!build) throw notFound(`Build ${buildId}`);
  return build;
}
