import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable } from 'rxjs';

import type { OrganisationSettings, OrganisationSettingsResponse } from '../../../shared/api/settings.js';

export type { OrganisationSettings, OrganisationSettingsResponse } from '../../../shared/api/settings.js';

/** The settings routes of the API (`GET /api/settings` any role, `PUT /api/settings` admin). */
@Injectable({ providedIn: 'root' })
export class OrganisationSettingsClient {
  private readonly http = inject(HttpClient);

  /** The settings in force (`GET /api/settings`). */
  read(): Observable<OrganisationSettingsResponse> {
    return this.http.get<OrganisationSettingsResponse>('/api/settings');
  }

  /** Replaces the settings (`PUT /api/settings`) and returns them as stored. */
  write(settings: OrganisationSettings): Observable<OrganisationSettingsResponse> {
    return this.http.put<OrganisationSettingsResponse>('/api/settings', settings);
  }
}
