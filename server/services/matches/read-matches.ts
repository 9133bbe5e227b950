/** Reading saved matches: the list (newest first, a page at a time) and one match with its plots. */
import { Op, type Sequelize, type Transaction } from 'sequelize';
import type { SavedMatchDetail, SavedMatchListResponse } from '../../../shared/snapping/saved-match.js';
import { notFound } from '../../errors.js';
import { Match, User } from '../../models/index.js';
import { containsPattern } from '../sql-like.js';
import { presentMatchDetail, presentMatchSummary } from './present-match.js';

async function usersById(ids: (number | null)[], transaction?: Transaction): Promise<Map<number, User>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  const users = wanted.length ? await User.findAll({ where: { id: wanted }, transaction }) : [];
  return new Map(users.map((u) => [u.id, u]));
}

/** A page of saved matches, newest first; with `search`, only those whose name holds it (any case). */
export async function listMatches(page: number, pageSize: number, search?: string): Promise<SavedMatchListResponse> {
  const text = search?.trim();
  const { rows, count } = await Match.findAndCountAll({
    where: text ? { name: { [Op.iLike]: containsPattern(text) } } : {},
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  const users = await usersById(rows.map((m) => m.createdBy));
  return { items: rows.map((m) => presentMatchSummary(m, m.createdBy === null ? null : (users.get(m.createdBy) ?? null))), total: count };
}

/**
 * One saved match.
 * @throws 404 when there is no match `id`
 */
export async function readMatch(sequelize: Sequelize, id: number): Promise<SavedMatchDetail> {
  const match = await Match.findByPk(id);
  if (!match) throw notFound(`Saved match ${id}`);
  const user = match.createdBy === null ? null : await User.findByPk(match.createdBy);
  return presentMatchDetail(sequelize, match, user);
}

/** Saved matches by id (for builds), in the order given; missing ids are left out. */
export async function readMatchesById(ids: readonly number[], transaction?: Transaction): Promise<Match[]> {
  if (ids.length === 0) return [];
  const found = await Match.findAll({ where: { id: [...ids] }, transaction });
  const byId = new Map(found.map((m) => [m.id, m]));
  return ids.map((id) => byId.get(id)).filter((m): m is Match => m !== undefined);
}
