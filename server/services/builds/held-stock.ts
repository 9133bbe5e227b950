/**
 * What a build holds, per part, with the part rows locked (one statement, ordered by id, the same
 * order every writer of `parts` uses).
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

/** One part a build holds. */
export interface HeldPart {
  partId: number;
  partNumber: string;
  location: string;
  /** Held by this build. */
  held: number;
  /** On hand. */
  quantity: number;
  /** Held by every build. */
  reserved: number;
}

/** The parts `buildId` holds, their rows locked for the rest of `transaction`. */
export async function lockHeldParts(sequelize: Sequelize, transaction: Transaction, buildId: number): Promise<HeldPart[]> {
  const held = await sequelize.query<{ part_id: number; held: string }>(
    `SELECT part_id, SUM(quantity) AS held FROM reservations WHERE build_id = :buildId AND state = 'held' AND part_id IS NOT NULL AND quantity > 0 GROUP BY part_id`,
    { replacements: { buildId }, type: QueryTypes.SELECT, transaction },
  );
  if (held.length === 0) return [];
  const ids = held.map((h) => h.part_id);
  const rows = await sequelize.query<{ id: number; part_number: string; location: string; quantity: number; reserved: number }>(
    'SELECT id, part_number, location, quantity, reserved FROM parts WHERE id = ANY(ARRAY[:ids]::int[]) ORDER BY id FOR UPDATE',
    { replacements: { ids }, type: QueryTypes.SELECT, transaction },
  );
  const heldById = new Map(held.map((h) => [h.part_id, Number(h.held)]));
  return rows.map((row) => ({ partId: row.id, partNumber: row.part_number, location: row.location, held: heldById.get(row.id) ?? 0, quantity: row.quantity, reserved: row.reserved }));
}

/** `UPDATE parts` by per-part amounts: `quantity -= consume`, `reserved -= release`. */
export async function takeFromParts(
  sequelize: Sequelize,
  transaction: Transaction,
  parts: readonly HeldPart[],
  what: { consume: boolean },
): Promise<void> {
  if (parts.length === 0) return;
  const ids = parts.map((p) => p.partId);
  const amounts = parts.map((p) => p.held);
  const quantity = what.consume ? 'quantity = parts.quantity - d.amount, updated_at = now(), ' : '';
  await sequelize.query(
    `UPDATE parts SET ${quantity}reserved = parts.reserved - d.amount FROM unnest(ARRAY[:ids]::int[], ARRAY[:amounts]::int[]) AS d(id, amount) WHERE parts.id = d.id`,
    { replacements: { ids, amounts }, transaction },
  );
}
