/**
 * Reserving a build: inside the caller's transaction, take the stock lock shared (so no stock
 * import runs meanwhile; see build-lifecycle-lock.ts), lock every part row the build could use
 * (`SELECT ... FOR UPDATE` in one statement, ordered by id, so two builds always lock in the same
 * order and never deadlock), share the stock out (allocate-stock.ts), hold what was granted
 * (reservation rows, and `parts.reserved` raised by the same amounts), and write the shortfall
 * list of what could not be met. Because every reservation reads `quantity - reserved` only under
 * those row locks, concurrent builds queue on the rows they share and none ever holds more than is
 * on hand.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { BuildMove } from '../../../shared/api/builds.js';
import type { PartSpec } from '../../../shared/engine/part-model.js';
import { type Build, BuildMatch, Reservation } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { PART_ROW_COLUMNS, toleranceOf, type PartRow } from '../stock/present-part.js';
import { allocateStock, SUBSTITUTE_VALUE_WINDOW, type Allocation, type PlanToAllocate, type StockRow } from './allocate-stock.js';
import { readBuildSettings, type BuildSettings } from './build-settings.js';
import { writeShortfallList } from '../shortfall/write-shortfall-list.js';
import { conflict } from '../../errors.js';
import { lockBuild, lockStockShared } from './build-lifecycle-lock.js';

/** A part row as the engine models it. */
export function partSpecOfRow(row: PartRow): PartSpec {
  return {
    kind: row.kind,
    valueSi: row.value_si,
    tolerance: toleranceOf(row.tolerance_kind, row.tolerance_value),
    srfHz: row.srf_hz,
    esrOhm: row.esr_ohm,
    q: row.q,
    qFrequencyHz: row.q_frequency_hz,
    voltageRatingV: row.voltage_rating_v,
    currentRatingA: row.current_rating_a,
    partNumber: row.part_number,
  };
}

/**
 * Locks, in one statement ordered by id, the rows of every part the chosen fits name (by row id and
 * by stock code) and every
 * part an element could be moved to (its kind, nominal value within {@link SUBSTITUTE_VALUE_WINDOW}
 * of the ideal value, at the match's location if it named one).
 */
async function lockCandidateRows(sequelize: Sequelize, transaction: Transaction, plans: readonly PlanToAllocate[]): Promise<PartRow[]> {
  const conditions: string[] = [];
  const replacements: Record<string, unknown> = {};
  plans.forEach((plan, p) => {
    const where = plan.design.location ? ` AND location = :loc${p}` : '';
    if (plan.design.location) replacements[`loc${p}`] = plan.design.location;
    const numbers = plan.design.elements.flatMap((e) => e.parts.map((part) => part.partNumber));
    if (numbers.length > 0) {
      conditions.push(`(part_number IN (:numbers${p})${where})`);
      replacements[`numbers${p}`] = numbers;
    }
    const ids = plan.design.elements.flatMap((e) => e.parts.flatMap((part) => (part.partId === undefined ? [] : [part.partId])));
    if (ids.length > 0) {
      conditions.push(`(id IN (:ids${p}))`);
      replacements[`ids${p}`] = ids;
    }
    plan.design.elements.forEach((element, e) => {
      conditions.push(`(kind = :kind${p}_${e} AND value_si BETWEEN :low${p}_${e} AND :high${p}_${e}${where})`);
      replacements[`kind${p}_${e}`] = element.kind;
      replacements[`low${p}_${e}`] = element.idealValue / SUBSTITUTE_VALUE_WINDOW;
      replacements[`high${p}_${e}`] = element.idealValue * SUBSTITUTE_VALUE_WINDOW;
    });
  });
  if (conditions.length === 0) return [];
  return sequelize.query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts WHERE ${conditions.join(' OR ')} ORDER BY id FOR UPDATE`, {
    replacements,
    type: QueryTypes.SELECT,
    transaction,
  });
}

/** What reserving did. */
export interface ReserveResult {
  allocation: Allocation;
  moves: BuildMove[];
  shortfallLines: number;
}

/**
 * Reserves stock for `build` (status `planned`) in `transaction`: locks, allocates, holds, writes
 * the shortfall list, sets the build `reserved` and records it all in the audit table.
 */
export async function reserveBuild(sequelize: Sequelize, transaction: Transaction, build: Build, actorId: number | null): Promise<ReserveResult> {
  const matches = await BuildMatch.findAll({ where: { buildId: build.id }, order: [['ordinal', 'ASC']], transaction });
  const plans: PlanToAllocate[] = matches.map((m) => ({ matchId: Number(m.matchId), matchName: m.matchName, design: m.design }));
  const settings: BuildSettings = await readBuildSettings(sequelize, transaction);
  await lockStockShared(sequelize, transaction);
  const locked = await lockCandidateRows(sequelize, transaction, plans);
  const rows: StockRow[] = locked.map((row) => ({
    id: row.id,
    partNumber: row.part_number,
    location: row.location,
    spec: partSpecOfRow(row),
    available: Math.max(0, row.quantity - row.reserved),
    package: row.package,
  }));
  const allocation = allocateStock(plans, build.quantity, rows, settings);

  const held = new Map<number, number>();
  const reservationRows = allocation.elements.flatMap((element) => {
    const match = matches[element.planIndex];
    const planned = match.design.elements[element.elementIndex];
    return element.parts.map((part) => {
      if (part.rowId !== null && part.reserved > 0) held.set(part.rowId, (held.get(part.rowId) ?? 0) + part.reserved);
      return {
        buildId: build.id,
        buildMatchId: match.id,
        matchId: Number(match.matchId),
        elementIndex: element.elementIndex,
        position: planned.position,
        kind: planned.kind,
        partId: part.rowId,
        partNumber: part.partNumber,
        location: part.location,
        perBoard: part.perBoard,
        needed: part.needed,
        quantity: part.reserved,
        state: 'held' as const,
        movedFrom: element.movedFrom,
      };
    });
  });
  await Reservation.bulkCreate(reservationRows, { transaction });
  if (held.size > 0) {
    const ids = [...held.keys()];
    const amounts = ids.map((id) => held.get(id) as number);
    await sequelize.query(
      `UPDATE parts SET reserved = parts.reserved + d.amount FROM unnest(ARRAY[:ids]::int[], ARRAY[:amounts]::int[]) AS d(id, amount) WHERE parts.id = d.id`,
      { replacements: { ids, amounts }, transaction },
    );
    // The allocation never grants more than `quantity - reserved` under the lock; this guards that promise.
    const oversold = await sequelize.query<{ id: number }>('SELECT id FROM parts WHERE id = ANY(ARRAY[:ids]::int[]) AND reserved > quantity', {
      replacements: { ids },
      type: QueryTypes.SELECT,
      transaction,
    });
    if (oversold.length > 0) throw new Error(`reserveBuild: parts ${oversold.map((r) => r.id).join(', ')} would be reserved beyond their quantity on hand`);
  }

  const moves: BuildMove[] = allocation.moves.map((move) => ({
    matchId: plans[move.planIndex].matchId,
    position: plans[move.planIndex].design.elements[move.elementIndex].position,
    from: move.from,
    to: move.to,
    fromWorstCaseDb: move.fromWorstCaseDb,
    toWorstCaseDb: move.toWorstCaseDb,
    message: move.message,
  }));
  const shortfallLines = await writeShortfallList(transaction, build.id, plans, allocation, settings);

  const before = { status: build.status };
  build.status = 'reserved';
  build.reservedAt = new Date();
  build.moves = moves;
  await build.save({ transaction });
  await recordAudit(
    {
      actorId,
      action: 'build.reserve',
      entityType: 'build',
      entityId: build.id,
      before,
      after: {
        status: build.status,
        held: [...held].map(([partId, quantity]) => ({ partId, quantity })),
        moves: moves.map((m) => m.message),
        shortfallLines,
      },
    },
    transaction,
  );
  return { allocation, moves, shortfallLines };
}

/**
 * Reserves a `planned` build by id (`POST /api/builds/:id/reserve`) in a transaction of its own.
 * @throws 404 for an unknown build, 409 unless it is planned
 */
export async function reservePlannedBuild(sequelize: Sequelize, buildId: number, actorId: number | null): Promise<ReserveResult> {
  return sequelize.transaction(async (transaction) => {
    const build = await lockBuild(transaction, buildId);
    if (build.status !== 'planned') throw conflict(`Build ${buildId} is ${build.status}; only a planned build can be reserved.`);
    return reserveBuild(sequelize, transaction, build, actorId);
  });
}
