import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, forkJoin, map, of } from 'rxjs';

import type { Fit, FitPart } from '../../../shared/api/matches.js';
import type { PartListResponse } from '../../../shared/api/stock.js';
import { type StockedPartModelData } from './tpg-sweep.js';

/**
 * Looks up the stocked parts of a fit (`GET /api/parts?search=`), so the workspace can sweep the fit
 * with the engine's part models before it is saved (a saved match brings its own sweep).
 */
@Injectable({ providedIn: 'root' })
export class FitParts {
  private readonly http = inject(HttpClient);

  /**
   * The fit's parts by part number; a part number the stock list no longer has is left out (the
   * caller says the curve cannot be drawn).
   */
  partsOf(fit: Fit): Observable<Map<string, StockedPartModelData>> {
    // The solve answer names each part's stock row (`partId`, an extension); a part number stocked
    // at two locations is then the right row, else the first row with that number.
    const wanted = new Map<string, number | null>();
    for (const element of fit.elements) {
      for (const part of element.parts as (FitPart & { partId?: number })[]) wanted.set(part.partNumber, part.partId ?? null);
    }
    if (wanted.size === 0) return of(new Map());
    return forkJoin(
      [...wanted].map(([partNumber, partId]) =>
        this.http
          .get<PartListResponse>('/api/parts', { params: { search: partNumber, pageSize: 50 } })
          .pipe(
            map(
              (answer) =>
                answer.items.find((item) => item.id === partId) ?? answer.items.find((item) => item.partNumber === partNumber) ?? null,
            ),
          ),
      ),
    ).pipe(
      map((found) => {
        const parts = new Map<string, StockedPartModelData>();
        for (const item of found) if (item) parts.set(item.partNumber, item);
        return parts;
      }),
    );
  }
}
