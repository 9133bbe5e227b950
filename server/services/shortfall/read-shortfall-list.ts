/** Reading shortfall lists: one build's (api.md `GET /api/builds/:id/shortfall`) and purchasing's list of lists. */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { ShortfallLine as ShortfallLineItem, ShortfallListResponse, ShortfallListsResponse, ShortfallStatus } from '../../../shared/api/builds.js';
import { toleranceOf } from '../stock/present-part.js';
import { Build, ShortfallLine, ShortfallList } from '../../models/index.js';
import { notFound } from '../../errors.js';
import { containsPattern } from '../sql-like.js';

/** The API face of a stored line. */
export function presentShortfallLine(line: ShortfallLine): ShortfallLineItem {
  return {
    kind: line.kind,
    idealValue: line.idealValue,
    buyValue: line.buyValue,
    series: line.series,
    quantity: line.quantity,
    minSrfHz: line.minSrfHz,
    tolerance: toleranceOf(line.toleranceKind, line.toleranceValue),
    package: line.package,
    reason: line.reason,
    id: Number(line.id),
    toleranceCode: line.toleranceCode,
    toleranceWithinBudget: line.toleranceWithinBudget,
    shortQuantity: line.shortQuantity,
    buyLossDb: line.buyLossDb,
    reasonText: line.reasonText,
    sources: line.sources,
    receivedQuantity: line.receivedQuantity,
  };
}

/** The lines of a list, in order. */
export async function shortfallLinesOf(listId: number, transaction?: Transaction): Promise<ShortfallLine[]> {
  return ShortfallLine.findAll({ where: { listId }, order: [['ordinal', 'ASC']], transaction });
}

/** The shortfall list of build `buildId` (empty lines and `list: null` when nothing is short). @throws 404 */
export async function readShortfallList(buildId: number, transaction?: Transaction): Promise<ShortfallListResponse> {
  const build = await Build.findByPk(buildId, { transaction });
  if (!build) throw notFound(`Build ${buildId}`);
  const list = await ShortfallList.findOne({ where: { buildId }, transaction });
  if (!list) return { lines: [], list: null };
  const lines = await shortfallLinesOf(list.id, transaction);
  return {
    lines: lines.map(presentShortfallLine),
    list: {
      id: list.id,
      buildId,
      buildName: build.name,
      status: list.status,
      attritionPercent: list.attritionPercent,
      lossBudgetDb: list.lossBudgetDb,
      createdAt: list.createdAt.toISOString(),
      updatedAt: list.updatedAt.toISOString(),
      sentTo: list.sentTo,
      sentAt: list.sentAt ? list.sentAt.toISOString() : null,
    },
  };
}

/** Every shortfall list, newest change first, optionally of one status and with `search` in its build's name (`GET /api/shortfall`). */
export async function listShortfallLists(sequelize: Sequelize, query: { status?: ShortfallStatus; search?: string; page: number; pageSize: number }): Promise<ShortfallListsResponse> {
  const search = query.search?.trim();
  const conditions = [query.status ? 'l.status = :status' : null, search ? 'b.name ILIKE :like' : null].filter((c) => c !== null);
  const where = conditions.length > 0 ? `WHERE ${conditions.join(' AND ')}` : '';
  const replacements = { status: query.status ?? null, like: search ? containsPattern(search) : null, limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
  const rows = await sequelize.query<{
    id: number;
    build_id: number;
    build_name: string;
    build_status: string;
    status: ShortfallStatus;
    line_count: string;
    quantity: string;
    received_quantity: string;
    sent_to: string | null;
    created_at: Date;
    updated_at: Date;
  }>(
    `SELECT l.id, l.build_id, b.name AS build_name, b.status AS build_status, l.status, l.sent_to, l.created_at, l.updated_at,
            COUNT(s.id) AS line_count, COALESCE(SUM(s.quantity), 0) AS quantity, COALESCE(SUM(s.received_quantity), 0) AS received_quantity
     FROM shortfall_lists l JOIN builds b ON b.id = l.build_id LEFT JOIN shortfall_lines s ON s.list_id = l.id
     ${where} GROUP BY l.id, b.id ORDER BY l.updated_at DESC, l.id DESC LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT },
  );
  const [{ total }] = await sequelize.query<{ total: string }>(`SELECT COUNT(*) AS total FROM shortfall_lists l JOIN builds b ON b.id = l.build_id ${where}`, { replacements, type: QueryTypes.SELECT });
  return {
    total: Number(total),
    items: rows.map((r) => ({
      id: r.id,
      buildId: r.build_id,
      buildName: r.build_name,
      buildStatus: r.build_status as ShortfallListsResponse['items'][number]['buildStatus'],
      status: r.status,
      lineCount: Number(r.line_count),
      quantity: Number(r.quantity),
      receivedQuantity: Number(r.received_quantity),
      sentTo: r.sent_to,
      createdAt: new Date(r.created_at).toISOString(),
      updatedAt: new Date(r.updated_at).toISOString(),
    })),
  };
}
