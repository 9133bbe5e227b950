/**
 * The organisation settings (`GET /api/settings` any role, `PUT /api/settings` admin; handbook
 * api.md extension). They decide how fits are chosen and judged across the organisation; a solve
 * request may override the first two for itself (`usableSrfFraction`, `excludeAboveLimit`).
 */
import type { Objective } from './matches.js';
import type { PartKind } from './stock.js';

/** IEC 60063 series names a buy-to value may be rounded to. */
export type PreferredSeries = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

/** Every series name, coarse to fine. */
export const PREFERRED_SERIES: readonly PreferredSeries[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

/** The settings. */
export interface OrganisationSettings {
  /**
   * Usable fraction of SRF: a part is "above limit" between this fraction of its SRF and its SRF
   * (default 0.5, a common rule of thumb, not a standard).
   */
  usableSrfFraction: number;
  /** Leave above-limit parts out of the search instead of ranking them after the rest. */
  excludeAboveLimit: boolean;
  /** Objective of a solve request that names none (api.md default `worst-case`). */
  defaultObjective: Objective;
  /** Worst-case loss budget, dB: the yield counts samples within it; a shortfall line must keep within it (default 0.5). */
  lossBudgetDb: number;
  /** E-series buy-to values are rounded to, per kind. */
  preferredSeries: Record<PartKind, PreferredSeries>;
  /** Extra parts a build reserves and buys for losses in assembly, percent (default 5). */
  attritionPercent: number;
}

/** `GET /api/settings` and `PUT /api/settings` answer. */
export interface OrganisationSettingsResponse extends OrganisationSettings {
  /** ISO 8601 time of the last change; null while the defaults stand. */
  updatedAt: string | null;
  updatedBy: { id: number; name: string; email: string } | null;
}

/** `PUT /api/settings` body: any subset of the settings (the rest stay as they are). */
export type OrganisationSettingsUpdate = Partial<Omit<OrganisationSettings, 'preferredSeries'>> & {
  preferredSeries?: Partial<Record<PartKind, PreferredSeries>>;
};

/** Limits a setting must keep, for forms and the server's checks alike. */
export const SETTINGS_LIMITS = Object.freeze({
  /** usableSrfFraction: above 0, at most 1. */
  usableSrfFraction: { min: 0, max: 1 },
  /** lossBudgetDb: above 0 dB, at most 20 dB. */
  lossBudgetDb: { min: 0, max: 20 },
  /** attritionPercent: 0 to 100. */
  attritionPercent: { min: 0, max: 100 },
});

/** The settings an organisation starts with. */
export const DEFAULT_ORGANISATION_SETTINGS: Readonly<OrganisationSettings> = Object.freeze({
  usableSrfFraction: 0.5,
  excludeAboveLimit: false,
  defaultObjective: 'worst-case' as Objective,
  lossBudgetDb: 0.5,
  preferredSeries: Object.freeze({ capacitor: 'E24', inductor: 'E12' }) as Record<PartKind, PreferredSeries>,
  attritionPercent: 5,
});
