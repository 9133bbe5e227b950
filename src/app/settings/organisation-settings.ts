import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable } from 'rxjs';

import type { Objective } from '../../../shared/api/matches.js';
import type { ESeriesName } from '../../../shared/engine/index.js';

/**
 * The organisation's settings as `GET /api/settings` sends them and `PUT /api/settings` takes them
 * (issue 5, rf-engine.md "Frequency limit", "Losses"). When shared/api/ gains its own settings type,
 * this becomes an alias of it.
 */
export interface OrganisationSettings {
  /** Share of a part's SRF it may be used up to without the "above limit" flag (0 < f <= 1; default 0.5). */
  usableSrfFraction: number;
  /** Whether parts between their limit and SRF are left out of fits altogether. */
  excludeAboveLimit: boolean;
  /** The objective a solve uses when the request names none. */
  defaultObjective: Objective;
  /** Worst-case loss a fit may have and still count towards yield and shortfall specs, dB (default 0.5). */
  lossBudgetDb: number;
  /** E-series buy-to values are taken from, per part kind. */
  preferredSeries: { capacitor: ESeriesName; inductor: ESeriesName };
  /** Extra parts bought on top of a shortfall for losses in assembly, percent (default 5). */
  attritionPercent: number;
}

/** The admin-only settings route of the API. */
@Injectable({ providedIn: 'root' })
export class OrganisationSettingsClient {
  private readonly http = inject(HttpClient);

  /** The settings in force (`GET /api/settings`). */
  read(): Observable<OrganisationSettings> {
    return this.http.get<OrganisationSettings>('/api/settings');
  }

  /** Replaces the settings (`PUT /api/settings`) and returns them as stored. */
  write(settings: OrganisationSettings): Observable<OrganisationSettings> {
    return this.http.put<OrganisationSettings>('/api/settings', settings);
  }
}
