/** The Outbox (admin only): `GET /api/outbox` and `GET /api/outbox/:id`, the e-mail Shelfmatch sent. */
import { Router } from 'express';
import { z } from 'zod';
import { MAIL_PURPOSES, MAIL_STATUSES, type MailPurpose, type MailStatus } from '../../../shared/api/outbox.js';
import type { AppContext } from '../../app-context.js';
import { requireRole } from '../../auth/passport.js';
import { parseRequest } from '../../validation.js';
import { badRequest } from '../../errors.js';
import { listOutbox, readOutboxMessage } from '../../services/mail/read-outbox.js';

/** Largest page the list gives. */
const MAX_PAGE_SIZE = 200;

const wholeNumber = (name: string, min: number, max: number) =>
  z.coerce
    .number({ message: `${name} must be a number` })
    .int(`${name} must be a whole number`)
    .min(min, `${name} must be at least ${min}`)
    .max(max, `${name} must be at most ${max}`);

const listSchema = z
  .object({
    status: z.enum(MAIL_STATUSES as [MailStatus, ...MailStatus[]], { message: `status must be one of ${MAIL_STATUSES.join(', ')}` }).optional(),
    purpose: z.enum(MAIL_PURPOSES as [MailPurpose, ...MailPurpose[]], { message: `purpose must be one of ${MAIL_PURPOSES.join(', ')}` }).optional(),
    page: wholeNumber('page', 1, 1_000_000).default(1),
    pageSize: wholeNumber('pageSize', 1, MAX_PAGE_SIZE).default(25),
  })
  .strict();

/** The Outbox routes; every one needs the admin role. */
export function outboxRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(ctx.requireSignIn, requireRole('admin'));

  router.get('/', async (req, res) => {
    const query = parseRequest(listSchema, req.query, 'Outbox query');
    res.json(await listOutbox(query));
  });

  router.get('/:id', async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id <= 0) {
      throw badRequest(`Outbox id must be a positive whole number, got "${req.params.id}".`, [{ field: 'id', message: 'not a positive whole number' }]);
    }
    res.json(await readOutboxMessage(id));
  });
  return router;
}
