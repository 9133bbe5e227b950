/** The organisation settings as the API shows them, read inside the caller's transaction. */
import type { Transaction } from 'sequelize';
import { DEFAULT_ORGANISATION_SETTINGS, type OrganisationSettingsResponse } from '../../../shared/api/settings.js';
import { OrganisationSetting, User } from '../../models/index.js';

/** The row as the API shape (defaults when the row is somehow missing). */
export function presentSettings(row: OrganisationSetting | null, updatedBy: User | null): OrganisationSettingsResponse {
  if (!row) return { ...DEFAULT_ORGANISATION_SETTINGS, preferredSeries: { ...DEFAULT_ORGANISATION_SETTINGS.preferredSeries }, updatedAt: null, updatedBy: null };
  return {
    usableSrfFraction: row.usableSrfFraction,
    excludeAboveLimit: row.excludeAboveLimit,
    defaultObjective: row.defaultObjective,
    lossBudgetDb: row.lossBudgetDb,
    preferredSeries: { capacitor: row.preferredSeriesCapacitor, inductor: row.preferredSeriesInductor },
    attritionPercent: row.attritionPercent,
    updatedAt: row.updatedAt ? row.updatedAt.toISOString() : null,
    updatedBy: updatedBy ? { id: updatedBy.id, name: updatedBy.name, email: updatedBy.email } : null,
  };
}

/**
 * The settings in force (api.md extension `GET /api/settings`); other services (solving, builds,
 * shortfall lists) read them through this too.
 */
export async function readSettings(transaction?: Transaction): Promise<OrganisationSettingsResponse> {
  const row = await OrganisationSetting.findByPk(1, { transaction });
  const updatedBy = row?.updatedBy ? await User.findByPk(row.updatedBy, { transaction }) : null;
  return presentSettings(row, updatedBy);
}
