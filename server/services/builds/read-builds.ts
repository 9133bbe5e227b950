/** Reading builds: one with its lines and shortfall list (api.md `GET /api/builds/:id`), and the list. */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { BuildListResponse, BuildResponse, BuildStatus } from '../../../shared/api/builds.js';
import { Build, BuildMatch, Reservation, ShortfallList, User } from '../../models/index.js';
import { notFound } from '../../errors.js';
import { containsPattern } from '../sql-like.js';
import { presentShortfallLine, shortfallLinesOf } from '../shortfall/read-shortfall-list.js';

/** Build `buildId` as the API shows it. @throws 404 */
export async function readBuild(buildId: number, transaction?: Transaction): Promise<BuildResponse> {
  const build = await Build.findByPk(buildId, { transaction });
  if (!build) throw notFound(`Build ${buildId}`);
  const [matches, reservations, list, creator] = await Promise.all([
    BuildMatch.findAll({ where: { buildId }, order: [['ordinal', 'ASC']], transaction }),
    Reservation.findAll({ where: { buildId }, order: [['id', 'ASC']], transaction }),
    ShortfallList.findOne({ where: { buildId }, transaction }),
    build.createdBy ? User.findByPk(build.createdBy, { transaction }) : Promise.resolve(null),
  ]);
  const lines = list ? await shortfallLinesOf(list.id, transaction) : [];
  return {
    id: build.id,
    status: build.status,
    lines: reservations.map((r) => ({
      matchId: Number(r.matchId),
      position: r.position,
      partNumber: r.partNumber,
      needed: r.needed,
      reserved: r.state === 'released' ? 0 : r.quantity,
      kind: r.kind,
      location: r.location,
      movedFrom: r.movedFrom,
    })),
    shortfall: { lines: lines.map(presentShortfallLine) },
    name: build.name,
    quantity: build.quantity,
    matches: matches.map((m) => ({ matchId: Number(m.matchId), name: m.matchName, frequencyHz: m.design.frequencyHz })),
    moves: build.moves,
    shortfallStatus: list?.status ?? null,
    createdAt: build.createdAt.toISOString(),
    updatedAt: build.updatedAt.toISOString(),
    createdBy: creator ? { id: creator.id, name: creator.name } : null,
  };
}

/** Builds, newest first, optionally of one status and with `search` in their name (any case, `%` and `_` literal). */
export async function listBuilds(sequelize: Sequelize, query: { status?: BuildStatus; search?: string; page: number; pageSize: number }): Promise<BuildListResponse> {
  const search = query.search?.trim();
  const conditions = [query.status ? 'b.status = :status' : null, search ? 'b.name ILIKE :like' : null].filter((c) => c !== null);
  const where = conditions.length > 0 ? `WHERE ${conditions.join(' AND ')}` : '';
  const replacements = { status: query.status ?? null, like: search ? containsPattern(search) : null, limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
  const rows = await sequelize.query<{
    id: number;
    name: string;
    quantity: number;
    status: BuildStatus;
    match_count: string;
    shortfall_lines: string;
    shortfall_status: BuildListResponse['items'][number]['shortfallStatus'];
    created_at: Date;
    updated_at: Date;
  }>(
    `SELECT b.id, b.name, b.quantity, b.status, b.created_at, b.updated_at,
            (SELECT COUNT(*) FROM build_matches m WHERE m.build_id = b.id) AS match_count,
            (SELECT COUNT(*) FROM shortfall_lines s JOIN shortfall_lists l ON l.id = s.list_id WHERE l.build_id = b.id) AS shortfall_lines,
            (SELECT l.status FROM shortfall_lists l WHERE l.build_id = b.id) AS shortfall_status
     FROM builds b ${where} ORDER BY b.created_at DESC, b.id DESC LIMIT :limit OFFSET :offset`,
    { replacements, type: QueryTypes.SELECT },
  );
  const [{ total }] = await sequelize.query<{ total: string }>(`SELECT COUNT(*) AS total FROM builds b ${where}`, { replacements, type: QueryTypes.SELECT });
  return {
    total: Number(total),
    items: rows.map((r) => ({
      id: r.id,
      name: r.name,
      quantity: r.quantity,
      status: r.status,
      matchCount: Number(r.match_count),
      shortfallLines: Number(r.shortfall_lines),
      shortfallStatus: r.shortfall_status,
      createdAt: new Date(r.created_at).toISOString(),
      updatedAt: new Date(r.updated_at).toISOString(),
    })),
  };
}
