/**
 * The stock browser's query (`GET /api/parts`): filter by kind, location and a search text, sort by a
 * whitelisted column, one page at a time, all in PostgreSQL.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import type { PartItem, PartKind, PartListResponse, PartSortField } from '../../../shared/api/stock.js';
import { parseValue } from '../../../shared/engine/value-parse.js';
import { notFound } from '../../errors.js';
import { PART_ROW_COLUMNS, presentPart, type PartRow } from './present-part.js';
import { containsPattern } from '../sql-like.js';

/** A checked query of {@link listParts}. */
export interface PartQuery {
  kind?: PartKind;
  location?: string;
  search?: string;
  sort: PartSortField;
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

/** SQL expression of each sort field (a whitelist: never user text in ORDER BY). */
const SORT_SQL: Readonly<Record<PartSortField, string>> = {
  partNumber: 'part_number',
  kind: 'kind',
  value: 'value_si',
  quantity: 'quantity',
  available: 'GREATEST(quantity - reserved, 0)',
  location: 'location',
  srfHz: 'srf_hz',
  package: 'package',
  unitCost: 'unit_cost',
};

/** Relative slack when a search text that reads as a value is matched against stored doubles. */
const VALUE_MATCH_RELATIVE = 1e-9;


/** The value a search text names, when it reads as one (`4p7`, `12nH`, `2.2 pF`); needs a digit. */
function searchValue(text: string, kind: PartKind): number | null {
  if (!/\d/.test(text)) return null;
  try {
    return parseValue(text, kind === 'capacitor' ? 'capacitance' : 'inductance');
  } catch {
    return null;
  }
}

/** A page of parts with the total that matches the filters. */
export async function listParts(sequelize: Sequelize, query: PartQuery): Promise<PartListResponse> {
  const conditions: string[] = [];
  const replacements: Record<string, unknown> = {
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  };
  if (query.kind) {
    conditions.push('kind = :kind');
    replacements.kind = query.kind;
  }
  if (query.location) {
    conditions.push('location = :location');
    replacements.location = query.location;
  }
  const search = query.search?.trim();
  if (search) {
    const alternatives = ["part_number ILIKE :like", "manufacturer_part ILIKE :like", "description ILIKE :like", "package ILIKE :like"];
    replacements.like = containsPattern(search);
    for (const kind of ['capacitor', 'inductor'] as const) {
      const value = searchValue(search, kind);
      if (value === null) continue;
      alternatives.push(`(kind = '${kind}' AND value_si BETWEEN :${kind}Low AND :${kind}High)`);
      replacements[`${kind}Low`] = value * (1 - VALUE_MATCH_RELATIVE);
      replacements[`${kind}High`] = value * (1 + VALUE_MATCH_RELATIVE);
    }
    conditions.push(`(${alternatives.join(' OR ')})`);
  }
  const where = conditions.length ? `WHERE ${conditions.join(' AND ')}` : '';
  const direction = query.order === 'desc' ? 'DESC' : 'ASC';
  const orderBy = `${SORT_SQL[query.sort]} ${direction} NULLS LAST, part_number ASC, location ASC, id ASC`;
  const rows = await sequelize.query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts ${where} ORDER BY ${orderBy} LIMIT :limit OFFSET :offset`, {
    replacements,
    type: QueryTypes.SELECT,
  });
  const [{ total }] = await sequelize.query<{ total: string }>(`SELECT count(*) AS total FROM parts ${where}`, { replacements, type: QueryTypes.SELECT });
  return { items: rows.map(presentPart), total: Number(total) };
}

/** Every location that holds parts, in order. */
export async function listPartLocations(sequelize: Sequelize): Promise<string[]> {
  const rows = await sequelize.query<{ location: string }>('SELECT DISTINCT location FROM parts ORDER BY location', { type: QueryTypes.SELECT });
  return rows.map((row) => row.location);
}

/**
 * One part by id.
 * @throws HttpError 404 when there is none
 */
export async function getPart(sequelize: Sequelize, id: number): Promise<PartItem> {
  const [row] = await sequelize.query<PartRow>(`SELECT ${PART_ROW_COLUMNS} FROM parts WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
  if (!row) throw notFound(`Part ${id}`);
  return presentPart(row);
}
