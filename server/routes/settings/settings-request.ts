/** The body of `PUT /api/settings` (shared/api/settings.ts), checked with zod. */
import { z } from 'zod';
import { PREFERRED_SERIES, type PreferredSeries, SETTINGS_LIMITS } from '../../../shared/api/settings.js';

const series = z.enum(PREFERRED_SERIES as [PreferredSeries, ...PreferredSeries[]], {
  message: `must be one of ${PREFERRED_SERIES.join(', ')}`,
});
const L = SETTINGS_LIMITS;

/** Any subset of the settings; unknown fields are refused so a typo is not silently ignored. */
export const settingsUpdateSchema = z
  .object({
    usableSrfFraction: z
      .number({ message: 'must be a number' })
      .gt(L.usableSrfFraction.min, `must be above ${L.usableSrfFraction.min}`)
      .lte(L.usableSrfFraction.max, `must be at most ${L.usableSrfFraction.max} (0.5 is the usual rule of thumb)`)
      .optional(),
    excludeAboveLimit: z.boolean({ message: 'must be true or false' }).optional(),
    defaultObjective: z.enum(['worst-case', 'nominal', 'band'], { message: 'must be one of worst-case, nominal, band' }).optional(),
    lossBudgetDb: z
      .number({ message: 'must be a number of dB' })
      .gt(L.lossBudgetDb.min, `must be above ${L.lossBudgetDb.min} dB`)
      .lte(L.lossBudgetDb.max, `must be at most ${L.lossBudgetDb.max} dB`)
      .optional(),
    preferredSeries: z.object({ capacitor: series.optional(), inductor: series.optional() }).strict().optional(),
    attritionPercent: z
      .number({ message: 'must be a number of percent' })
      .gte(L.attritionPercent.min, `must be at least ${L.attritionPercent.min} %`)
      .lte(L.attritionPercent.max, `must be at most ${L.attritionPercent.max} %`)
      .optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'give at least one setting to change');
