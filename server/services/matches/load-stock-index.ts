/**
 * The stock a match is snapped to: every part (of one location, when the request names one), read in
 * one query and grouped by electrical model (shared/snapping/stock-index.ts). Parts whose available
 * quantity does not cover the build are read too: the snapper leaves them out and says how many.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { buildStockIndex, type StockIndex } from '../../../shared/snapping/stock-index.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import { PART_ROW_COLUMNS, presentPart, type PartRow } from '../stock/present-part.js';

/** The stock index for a solve, and the parts it holds. */
export async function loadStockIndex(
  sequelize: Sequelize,
  options: { location: string | null },
  transaction?: Transaction,
): Promise<{ index: StockIndex; parts: SnapPart[] }> {
  const rows = await sequelize.query<PartRow>(
    `SELECT ${PART_ROW_COLUMNS} FROM parts ${options.location ? 'WHERE location = :location' : ''} ORDER BY kind, value_si, id`,
    { type: QueryTypes.SELECT, replacements: { location: options.location }, transaction },
  );
  const parts: SnapPart[] = rows.map(presentPart);
  return { index: buildStockIndex(parts), parts };
}

