/** Request schemas of the build routes (api.md "Builds and shortfall lists"). */
import { z } from 'zod';
import { BUILD_STATUSES, MAX_MATCHES_PER_BUILD, SHORTFALL_STATUSES, type BuildStatus, type ShortfallStatus } from '../../../shared/api/builds.js';
import { MAX_BUILD_QUANTITY } from '../../../shared/engine/solve-request.js';

/** Most lines one receipt may carry. */
export const MAX_RECEIPT_LINES = 500;
/** Most addresses one send may name. */
export const MAX_RECIPIENTS = 10;

const positiveId = (what: string) =>
  z.number({ message: `${what} must be a number` }).int(`${what} must be a whole number`).positive(`${what} must be above 0`);

/** `POST /api/builds` body. */
export const createBuildSchema = z
  .object({
    name: z.string({ message: 'name is required' }).trim().min(1, 'name is required').max(200, 'name may have at most 200 characters'),
    quantity: z
      .number({ message: 'quantity must be a number of boards' })
      .int('quantity must be a whole number of boards')
      .min(1, 'quantity must be at least 1 board')
      .max(MAX_BUILD_QUANTITY, `quantity may be at most ${MAX_BUILD_QUANTITY} boards`),
    matchIds: z
      .array(positiveId('a match id'), { message: 'matchIds must be a list of saved match ids' })
      .min(1, 'give at least one saved match')
      .max(MAX_MATCHES_PER_BUILD, `a board may carry at most ${MAX_MATCHES_PER_BUILD} matches`)
      .refine((ids) => new Set(ids).size === ids.length, 'list each match once'),
    reserve: z.boolean({ message: 'reserve must be true or false' }).optional().default(true),
  })
  .strict();

/** `PATCH /api/builds/:id` body. */
export const buildStatusSchema = z.object({ status: z.enum(['built', 'cancelled'], { message: 'status must be "built" or "cancelled"' }) }).strict();

/** `PATCH /api/builds/:id/shortfall` body. */
export const shortfallStatusSchema = z
  .object({ status: z.enum(SHORTFALL_STATUSES as [ShortfallStatus, ...ShortfallStatus[]], { message: `status must be one of ${SHORTFALL_STATUSES.join(', ')}` }) })
  .strict();

/** `POST /api/builds/:id/shortfall/send` body: one address, or several separated by commas. */
export const sendShortfallSchema = z
  .object({
    to: z
      .string({ message: 'to must be an e-mail address' })
      .transform((text) => text.split(/[,;]/).map((a) => a.trim()).filter(Boolean))
      .pipe(
        z
          .array(z.email('each address must look like name@example.com').max(254))
          .min(1, 'to must name at least one address')
          .max(MAX_RECIPIENTS, `to may name at most ${MAX_RECIPIENTS} addresses`),
      ),
  })
  .strict();

/** `POST /api/builds/:id/shortfall/receive` body. */
export const receiveShortfallSchema = z
  .object({
    lines: z
      .array(
        z
          .object({
            lineId: positiveId('lineId'),
            quantity: z.number({ message: 'quantity must be a number' }).int('quantity must be a whole number').min(1, 'quantity must be at least 1').max(10_000_000, 'quantity is absurdly large'),
            partNumber: z.string({ message: 'partNumber is required' }).trim().min(1, 'partNumber is required').max(64, 'partNumber may have at most 64 characters'),
            location: z.string().trim().max(64, 'location may have at most 64 characters').optional(),
            srfHz: z.union([z.number(), z.string(), z.null()]).optional(),
          })
          .strict(),
        { message: 'lines must be a list' },
      )
      .min(1, 'receive at least one line')
      .max(MAX_RECEIPT_LINES, `a receipt may have at most ${MAX_RECEIPT_LINES} lines`),
  })
  .strict();

const pageNumber = (name: string, max: number, fallback: number) =>
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

/** `GET /api/builds?status=&search=&page=&pageSize=` (`search`: part of the name, any case). */
export const buildListQuerySchema = z.object({
  search: z.string().max(200, 'search is at most 200 characters').optional(),
  status: z.enum(BUILD_STATUSES as [BuildStatus, ...BuildStatus[]], { message: `status must be one of ${BUILD_STATUSES.join(', ')}` }).optional(),
  page: pageNumber('page', 1_000_000, 1),
  pageSize: pageNumber('pageSize', 200, 50),
});

/** `GET /api/shortfall?status=&search=&page=&pageSize=` (`search`: part of the build's name, any case). */
export const shortfallListQuerySchema = z.object({
  search: z.string().max(200, 'search is at most 200 characters').optional(),
  status: z.enum(SHORTFALL_STATUSES as [ShortfallStatus, ...ShortfallStatus[]], { message: `status must be one of ${SHORTFALL_STATUSES.join(', ')}` }).optional(),
  page: pageNumber('page', 1_000_000, 1),
  pageSize: pageNumber('pageSize', 200, 50),
});
