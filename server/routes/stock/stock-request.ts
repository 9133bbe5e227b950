/** Request schemas of the stock import routes. */
import { z } from 'zod';
import { STOCK_IMPORT_MODES, type StockImportMode } from '../../../shared/api/stock.js';

const flag = (name: string) =>
  z
    .enum(['true', 'false'], { message: `${name} must be "true" or "false"` })
    .optional()
    .transform((v) => v === 'true');

/** The form fields sent with the file. */
export const importFieldsSchema = z
  .object({
    mode: z
      .enum(STOCK_IMPORT_MODES as [StockImportMode, ...StockImportMode[]], { message: `mode must be ${STOCK_IMPORT_MODES.join(' or ')}` })
      .optional()
      .default('merge'),
    dryRun: flag('dryRun'),
    skipInvalid: flag('skipInvalid'),
  })
  .strict();

const positiveInt = (name: string, max: number, fallback: number) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return fallback;
      const n = Number(v);
      if (!Number.isInteger(n) || n < 1 || n > max) {
        ctx.addIssue({ code: 'custom', message: `${name} must be a whole number from 1 to ${max}, got "${v}"` });
        return z.NEVER;
      }
      return n;
    });

/** `?page=&pageSize=` of the history list. */
export const historyQuerySchema = z.object({ page: positiveInt('page', 1_000_000, 1), pageSize: positiveInt('pageSize', 200, 25) });

/** `?page=&pageSize=&change=` of one import's changes. */
export const changesQuerySchema = z.object({
  page: positiveInt('page', 1_000_000, 1),
  pageSize: positiveInt('pageSize', 1000, 200),
  change: z.enum(['created', 'updated', 'zeroed'], { message: 'change must be created, updated or zeroed' }).optional(),
});
