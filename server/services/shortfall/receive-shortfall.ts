/**
 * Receiving bought parts into stock (purchasing, stores or admin). The parts enter stock through
 * the stock-list importer, exactly as an upload would, so the import history shows the receipt with
 * each part's quantity before and after: a part already stocked under the given number gets its
 * quantity raised by what arrived (every other field written back as it is, so only the quantity
 * changes), a new number is created to the line's buy-to spec. Then the lines count what they
 * received, and a list whose every line is covered is marked received.
 *
 * The new on-hand quantity (stocked + received) is computed from a read of the stock and written
 * back through the importer, so the whole receipt is one transaction that holds, from before that
 * read until the lines are updated, the on-hand change lock (builds/build-lifecycle-lock.ts) and
 * the stock lock every import takes: a build marked built or a stores upload meanwhile waits and
 * then sees the receipt, so neither is overwritten. The import runs inside that transaction, so a
 * receipt that fails at any step leaves stock, lines and history as they were.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import type { ReceiveLine, ReceiveShortfallResponse } from '../../../shared/api/builds.js';
import { isEngineInputError } from '../../../shared/engine/engine-input-error.js';
import { parseValue } from '../../../shared/engine/value-parse.js';
import { ShortfallLine, ShortfallList } from '../../models/index.js';
import { badRequest, notFound, unprocessable } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { lockOnHandChanges } from '../builds/build-lifecycle-lock.js';
import { csvCell, stockCsvCells } from '../stock/export-stock-list.js';
import { importStockList, lockStockQuantities } from '../stock/import-stock-list.js';
import { PART_ROW_COLUMNS, type PartRow } from '../stock/present-part.js';
import { DEFAULT_LOCATION, STOCK_COLUMNS } from '../stock/stock-columns.js';
import { readShortfallList } from './read-shortfall-list.js';

/** Relative difference below which a stocked part's value counts as the line's buy-to value. */
const SAME_VALUE_RELATIVE = 1e-9;

/** One stock row the receipt writes, keyed by part number and location. */
interface ReceiptRow {
  partNumber: string;
  location: string;
  received: number;
  existing: PartRow | null;
  line: ShortfallLine;
  srfHz: number | null;
}

function fail(index: number, field: string, message: string): never {
  throw badRequest(`lines.${index}.${field}: ${message}`, [{ field: `lines.${index}.${field}`, message }]);
}

/** The stock row of a new part made to `line`'s spec, in the import schema's column order. */
function newPartRow(row: ReceiptRow, buildId: number, listId: number): PartRow {
  const line = row.line;
  return {
    id: 0,
    part_number: row.partNumber,
    location: row.location,
    kind: line.kind,
    value_si: line.buyValue,
    tolerance_kind: line.toleranceKind,
    tolerance_value: line.toleranceValue,
    srf_hz: row.srfHz,
    q: null,
    q_frequency_hz: null,
    esr_ohm: null,
    quantity: row.received,
    reserved: 0,
    package: line.package,
    voltage_rating_v: null,
    current_rating_a: null,
    series: line.series,
    unit_cost: null,
    manufacturer_part: null,
    description: `Received for build ${buildId} (shortfall list ${listId})`,
  };
}

/**
 * Receives `lines` for the shortfall list of build `buildId`.
 * @throws 400 for a line not on the list or a part that does not fit it; 404 unknown build or no list;
 * 422 when the importer refused the receipt (nothing changed)
 */
export async function receiveShortfall(sequelize: Sequelize, buildId: number, lines: readonly ReceiveLine[], userId: number | null): Promise<ReceiveShortfallResponse> {
  const outcome = await sequelize.transaction(async (transaction) => {
    await lockOnHandChanges(sequelize, transaction);
    await lockStockQuantities(sequelize, transaction);
    const list = await ShortfallList.findOne({ where: { buildId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!list) throw notFound(`A shortfall list of build ${buildId}`);
    const listLines = await ShortfallLine.findAll({ where: { listId: list.id }, transaction });
    const byId = new Map(listLines.map((l) => [Number(l.id), l]));

    const rows = new Map<string, ReceiptRow>();
    const keys = lines.map((input, index) => {
      const line = byId.get(input.lineId);
      if (!line) fail(index, 'lineId', `line ${input.lineId} is not on the shortfall list of build ${buildId}`);
      const location = input.location?.trim() || DEFAULT_LOCATION;
      let srfHz: number | null = null;
      if (input.srfHz !== undefined && input.srfHz !== null && input.srfHz !== '') {
        try {
          srfHz = parseValue(input.srfHz, 'frequency', { field: `lines.${index}.srfHz` });
        } catch (error) {
          if (isEngineInputError(error)) fail(index, 'srfHz', error.message);
          throw error;
        }
      }
      const key = `${input.partNumber}\u0000${location}`;
      const row = rows.get(key);
      if (row) {
        if (row.line.kind !== line.kind || row.line.buyValue !== line.buyValue) {
          fail(index, 'partNumber', `${input.partNumber} at ${location} already takes the parts of line ${row.line.id}, which are another value`);
        }
        row.received += input.quantity;
      } else {
        rows.set(key, { partNumber: input.partNumber, location, received: input.quantity, existing: null, line, srfHz });
      }
      return { index, key };
    });

    const stocked = await sequelize.query<PartRow>(
      `SELECT ${PART_ROW_COLUMNS} FROM parts WHERE (part_number, location) IN (${[...rows.keys()].map((_, i) => `(:n${i}, :l${i})`).join(', ')})`,
      {
        replacements: Object.fromEntries([...rows.values()].flatMap((r, i) => [[`n${i}`, r.partNumber], [`l${i}`, r.location]])),
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    for (const part of stocked) {
      const row = rows.get(`${part.part_number}\u0000${part.location}`);
      if (row) row.existing = part;
    }
    for (const { index, key } of keys) {
      const row = rows.get(key)!;
      const part = row.existing;
      if (!part) continue;
      const line = row.line;
      if (part.kind !== line.kind) fail(index, 'partNumber', `${part.part_number} at ${part.location} is a stocked ${part.kind}; this line buys a ${line.kind}`);
      if (Math.abs(part.value_si / line.buyValue - 1) > SAME_VALUE_RELATIVE) {
        fail(index, 'partNumber', `${part.part_number} at ${part.location} is stocked at another value than this line's buy-to value; receive under a new part number`);
      }
      if (row.srfHz !== null) fail(index, 'srfHz', `${part.part_number} at ${part.location} is already stocked with its own SRF; give an SRF only for a new part`);
    }

    const csv = [
      STOCK_COLUMNS.join(','),
      ...[...rows.values()].map((row) => {
        const part = row.existing ? { ...row.existing, quantity: row.existing.quantity + row.received } : newPartRow(row, buildId, list.id);
        return stockCsvCells(part).map(csvCell).join(',');
      }),
    ].join('\r\n');
    const receipt = {
      bytes: Buffer.from(`${csv}\r\n`, 'utf8'),
      fileName: `receipt-build-${buildId}-shortfall-${list.id}.csv`,
      mode: 'merge',
      dryRun: false,
      skipInvalid: false,
      userId,
    } as const;
    const imported = await importStockList(sequelize, receipt, transaction);
    if (imported.status !== 200 || imported.report.importId === null) {
      const first = imported.report.rejected[0];
      throw unprocessable(
        `The stock list refused the receipt, so nothing was received: ${first ? `${first.column}: ${first.message}` : 'the file was refused'}.`,
        imported.report.rejected.map((p) => ({ field: p.column, value: p.value, message: p.message })),
      );
    }

    const received = new Map<number, number>();
    for (const input of lines) received.set(input.lineId, (received.get(input.lineId) ?? 0) + input.quantity);
    for (const [lineId, quantity] of received) {
      const line = byId.get(lineId)!;
      line.receivedQuantity += quantity;
      await line.save({ transaction });
    }
    const before = { status: list.status };
    if (listLines.every((l) => l.receivedQuantity >= l.quantity)) list.status = 'received';
    list.receipts = [
      ...list.receipts,
      {
        importId: imported.report.importId,
        userId,
        at: new Date().toISOString(),
        lines: lines.map((l) => ({ lineId: l.lineId, quantity: l.quantity, partNumber: l.partNumber, location: l.location?.trim() || DEFAULT_LOCATION })),
      },
    ];
    list.changed('receipts', true);
    await list.save({ transaction });
    await recordAudit(
      {
        actorId: userId,
        action: 'shortfall.receive',
        entityType: 'shortfall_list',
        entityId: list.id,
        before,
        after: { status: list.status, importId: imported.report.importId, received: [...received].map(([lineId, quantity]) => ({ lineId, quantity })) },
      },
      transaction,
    );
    return { importId: imported.report.importId, created: imported.report.created, updated: imported.report.updated };
  });
  return { ...outcome, list: await readShortfallList(buildId) };
}
