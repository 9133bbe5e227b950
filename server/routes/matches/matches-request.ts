/** Bodies and queries of the match routes, checked with zod (the solve request itself by the engine). */
import { z } from 'zod';

/** `POST /api/matches` body; `request` is checked by the engine's solve-request reader. */
export const saveMatchSchema = z
  .object({
    name: z.string({ message: 'name is required' }).trim().min(1, 'name is required').max(200, 'name is at most 200 characters'),
    request: z.record(z.string(), z.unknown(), { message: 'request must be a solve request object' }),
    chosen: z
      .object({
        placement: z.enum(['shunt-at-load', 'shunt-at-source'], { message: 'placement must be shunt-at-load or shunt-at-source' }),
        solution: z.union([z.literal(1), z.literal(2)], { message: 'solution must be 1 or 2' }),
        rank: z.number({ message: 'rank must be a whole number from 1' }).int('rank must be a whole number from 1').min(1, 'rank must be a whole number from 1'),
      })
      .strict(),
  })
  .strict();

/** Largest page of `GET /api/matches`. */
export const MAX_MATCH_PAGE_SIZE = 200;

/** `GET /api/matches?page=&pageSize=&search=` (`search`: part of the name, any case). */
export const listMatchesSchema = z
  .object({
    search: z.string().max(200, 'search is at most 200 characters').optional(),
    page: z.coerce.number({ message: 'page must be a whole number from 1' }).int().min(1).default(1),
    pageSize: z.coerce.number({ message: `pageSize must be a whole number from 1 to ${MAX_MATCH_PAGE_SIZE}` }).int().min(1).max(MAX_MATCH_PAGE_SIZE).default(50),
  })
  .strict();
