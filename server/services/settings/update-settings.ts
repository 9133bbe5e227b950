/**
 * Changing the organisation settings (admin, `PUT /api/settings`): the given fields replace the
 * stored ones, in one transaction with its audit entry (before and after).
 */
import type { Sequelize } from 'sequelize';
import type { OrganisationSettingsResponse, OrganisationSettingsUpdate } from '../../../shared/api/settings.js';
import { OrganisationSetting } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import { readSettings } from './read-settings.js';

/** Applies `change` by `actorId`; returns the settings now in force. */
export async function updateSettings(sequelize: Sequelize, actorId: number, change: OrganisationSettingsUpdate): Promise<OrganisationSettingsResponse> {
  return sequelize.transaction(async (transaction) => {
    // The row lock makes two admins' changes apply one after the other.
    await OrganisationSetting.findOrCreate({ where: { id: 1 }, defaults: { id: 1 } as never, transaction });
    const row = (await OrganisationSetting.findByPk(1, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const before = await readSettings(transaction);
    if (change.usableSrfFraction !== undefined) row.usableSrfFraction = change.usableSrfFraction;
    if (change.excludeAboveLimit !== undefined) row.excludeAboveLimit = change.excludeAboveLimit;
    if (change.defaultObjective !== undefined) row.defaultObjective = change.defaultObjective;
    if (change.lossBudgetDb !== undefined) row.lossBudgetDb = change.lossBudgetDb;
    if (change.preferredSeries?.capacitor !== undefined) row.preferredSeriesCapacitor = change.preferredSeries.capacitor;
    if (change.preferredSeries?.inductor !== undefined) row.preferredSeriesInductor = change.preferredSeries.inductor;
    if (change.attritionPercent !== undefined) row.attritionPercent = change.attritionPercent;
    row.updatedBy = actorId;
    row.updatedAt = new Date();
    await row.save({ transaction });
    const after = await readSettings(transaction);
    const strip = ({ updatedAt: _a, updatedBy: _b, ...rest }: OrganisationSettingsResponse) => rest;
    await recordAudit({ actorId, action: 'settings.update', entityType: 'settings', entityId: 1, before: strip(before), after: strip(after) }, transaction);
    return after;
  });
}
