/**
 * The organisation settings builds and shortfall lists are computed with: usable fraction of SRF,
 * whether above-limit parts are excluded, the worst-case loss budget, the preferred E-series per
 * kind for buy-to values, and the attrition allowance.
 */
import type { Sequelize, Transaction } from 'sequelize';
import type { ShortfallSettings } from '../../../shared/shortfall/shortfall-lines.js';
import { readSettings } from '../settings/read-settings.js';

/** Everything a reservation and its shortfall list need from the settings. */
export interface BuildSettings extends ShortfallSettings {
  excludeAboveLimit: boolean;
}

/** The organisation settings in force (server/services/settings), read inside `transaction`. */
export async function readBuildSettings(_sequelize: Sequelize, transaction?: Transaction): Promise<BuildSettings> {
  const settings = await readSettings(transaction);
  return {
    preferredSeries: { capacitor: settings.preferredSeries.capacitor, inductor: settings.preferredSeries.inductor },
    usableSrfFraction: settings.usableSrfFraction,
    lossBudgetDb: settings.lossBudgetDb,
    attritionPercent: settings.attritionPercent,
    excludeAboveLimit: settings.excludeAboveLimit,
  };
}
