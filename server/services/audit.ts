/** Writes audit entries inside the caller's transaction, so a change and its record land together. */
import type { Transaction } from 'sequelize';
import { AuditEntry } from '../models/index.js';

/** What one audit entry says. */
export interface AuditRecord {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: string | number | null;
  before?: object | null;
  after?: object | null;
}

/** Records `entry` in `transaction`. */
export async function recordAudit(entry: AuditRecord, transaction?: Transaction): Promise<void> {
  await AuditEntry.create(
    {
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId === null ? null : String(entry.entityId),
      before: entry.before ?? null,
      after: entry.after ?? null,
    },
    { transaction },
  );
}
