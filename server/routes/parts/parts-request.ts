/** Request schema of `GET /api/parts`. */
import { z } from 'zod';
import { MAX_PART_PAGE_SIZE, PART_SORT_FIELDS } from '../../../shared/api/stock.js';

const KIND_WORDS: Record<string, 'capacitor' | 'inductor'> = { capacitor: 'capacitor', c: 'capacitor', cap: 'capacitor', inductor: 'inductor', l: 'inductor', ind: 'inductor' };

const wholeNumber = (name: string, min: number, max: number, fallback: number) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return fallback;
      const n = Number(v);
      if (!Number.isInteger(n) || n < min || n > max) {
        ctx.addIssue({ code: 'custom', message: `${name} must be a whole number from ${min} to ${max}, got "${v}"` });
        return z.NEVER;
      }
      return n;
    });

/** `?kind=&search=&location=&sort=&order=&page=&pageSize=`; blank means "not given". */
export const partListQuerySchema = z.object({
  kind: z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v.trim() === '') return undefined;
      const kind = KIND_WORDS[v.trim().toLowerCase()];
      if (!kind) {
        ctx.addIssue({ code: 'custom', message: `kind must be capacitor or inductor, got "${v}"` });
        return z.NEVER;
      }
      return kind;
    }),
  location: z.string().max(64, 'location is at most 64 characters').optional().transform((v) => (v?.trim() ? v.trim() : undefined)),
  search: z.string().max(100, 'search is at most 100 characters').optional(),
  sort: z
    .enum(PART_SORT_FIELDS, { message: `sort must be one of ${PART_SORT_FIELDS.join(', ')}` })
    .optional()
    .default('partNumber'),
  order: z.enum(['asc', 'desc'], { message: 'order must be asc or desc' }).optional().default('asc'),
  page: wholeNumber('page', 1, 1_000_000, 1),
  pageSize: wholeNumber('pageSize', 1, MAX_PART_PAGE_SIZE, 50),
});

/** `?location=` of the export. */
export const exportQuerySchema = z.object({
  location: z.string().max(64).optional().transform((v) => (v?.trim() ? v.trim() : undefined)),
});
