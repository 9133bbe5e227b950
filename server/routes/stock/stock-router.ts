/**
 * Stock-list imports (api.md "Stock"): `POST /api/stock/imports` (stores or admin) uploads a CSV;
 * `GET /api/stock/imports` and `GET /api/stock/imports/:id` show the history (any signed-in role).
 */
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { badRequest, tooLarge } from '../../errors.js';
import { parseRequest } from '../../validation.js';
import { importStockList } from '../../services/stock/import-stock-list.js';
import { getStockImport, listStockImports } from '../../services/stock/stock-import-history.js';
import { changesQuerySchema, historyQuerySchema, importFieldsSchema } from './stock-request.js';

/** Largest stock-list file accepted (stock-csv.md: 20 MB). */
export const MAX_STOCK_FILE_BYTES = 20 * 1024 * 1024;

/** Longest file name kept in the history. */
const MAX_FILE_NAME = 255;

/** multer in memory, one `file` field; its limit errors become our 400/413. */
function receiveStockFile(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MAX_STOCK_FILE_BYTES, files: 1, fields: 10, fieldSize: 1024, parts: 12 },
    defParamCharset: 'utf8',
  } as multer.Options).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(tooLarge(`The file is larger than ${MAX_STOCK_FILE_BYTES / 1024 / 1024} MB, the most one upload may be; nothing was applied. Split it by location.`));
        }
        if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(badRequest(`Send the CSV in the form field "file" (got "${err.field}").`, [{ field: err.field ?? 'file', message: 'unexpected file field' }]));
        return next(badRequest(`The upload is not a form this route reads: ${err.message}.`, [{ field: err.field ?? 'file', message: err.message }]));
      }
      next(err);
    });
  };
}

function positiveId(raw: string, what: string): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) throw badRequest(`${what} id must be a positive whole number, got "${raw}".`, [{ field: 'id', message: 'not a positive whole number' }]);
  return id;
}

/** The stock import routes. */
export function stockRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn);

  router.post('/imports', requireRole('stores', 'admin'), receiveStockFile(), async (req, res) => {
    const fields = parseRequest(importFieldsSchema, req.body ?? {}, 'upload form');
    if (!req.file) {
      throw badRequest('No file was uploaded: send multipart/form-data with the CSV in the field "file".', [{ field: 'file', message: 'required' }]);
    }
    const outcome = await importStockList(ctx.sequelize, {
      bytes: req.file.buffer,
      fileName: (req.file.originalname || 'upload.csv').slice(0, MAX_FILE_NAME),
      mode: fields.mode,
      dryRun: fields.dryRun,
      skipInvalid: fields.skipInvalid,
      userId: req.currentUser!.id,
    });
    const { report } = outcome;
    if (outcome.status === 200) {
      res.json(report);
      return;
    }
    const first = report.rejected[0];
    const message =
      report.rejectedRows > 0
        ? `${report.rejectedRows} row(s) were rejected, so nothing was applied: fix them and upload again${fields.skipInvalid ? '' : ', or choose to skip invalid rows'}.`
        : `The file was refused, so nothing was applied: line ${first?.line ?? 1}: ${first?.message ?? 'unreadable'}.`;
    res.status(422).json({ ...report, error: { code: 'rejected', message, details: report.rejected } });
  });

  router.get('/imports', async (req, res) => {
    const query = parseRequest(historyQuerySchema, req.query, 'query');
    res.json(await listStockImports(ctx.sequelize, query.page, query.pageSize));
  });

  router.get('/imports/:id', async (req, res) => {
    const id = positiveId(req.params.id, 'Import');
    const query = parseRequest(changesQuerySchema, req.query, 'query');
    res.json(await getStockImport(ctx.sequelize, id, query));
  });
  return router;
}
