import { HttpClient, HttpEvent, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, firstValueFrom, map } from 'rxjs';

import type {
  PartListQuery,
  PartListResponse,
  PartLocationsResponse,
  PartChangeKind,
  StockImportDetail,
  StockImportListResponse,
  StockImportMode,
  StockImportReport,
} from '../../../shared/api/stock.js';

/** The choices sent with a stock-list file. */
export interface StockUploadChoices {
  mode: StockImportMode;
  dryRun: boolean;
  skipInvalid: boolean;
}

/** The stock routes of the API (api.md "Stock"): the parts list, its export, uploads and their history. */
@Injectable({ providedIn: 'root' })
export class StockClient {
  private readonly http = inject(HttpClient);

  /** A page of parts (`GET /api/parts`); empty filters are left out. */
  listParts(query: PartListQuery): Observable<PartListResponse> {
    let params = new HttpParams();
    for (const [key, value] of Object.entries(query)) {
      if (value !== undefined && value !== null && value !== '') params = params.set(key, String(value));
    }
    return this.http.get<PartListResponse>('/api/parts', { params });
  }

  /** Every location that holds parts (`GET /api/parts/locations`). */
  listLocations(): Observable<string[]> {
    return this.http.get<PartLocationsResponse>('/api/parts/locations').pipe(map((answer) => answer.items));
  }

  /**
   * Uploads a stock-list file (`POST /api/stock/imports`, multipart) with upload progress events.
   * A 422 (rows rejected, nothing applied) arrives as an `HttpErrorResponse` whose `error` is the report.
   */
  uploadStockList(file: File, choices: StockUploadChoices): Observable<HttpEvent<StockImportReport>> {
    const form = new FormData();
    form.append('mode', choices.mode);
    form.append('dryRun', String(choices.dryRun));
    form.append('skipInvalid', String(choices.skipInvalid));
    form.append('file', file, file.name);
    return this.http.post<StockImportReport>('/api/stock/imports', form, { observe: 'events', reportProgress: true });
  }

  /** A page of the import history, newest first (`GET /api/stock/imports`). */
  listImports(page: number, pageSize: number): Observable<StockImportListResponse> {
    const params = new HttpParams().set('page', page).set('pageSize', pageSize);
    return this.http.get<StockImportListResponse>('/api/stock/imports', { params });
  }

  /** One import with a page of its per-part changes (`GET /api/stock/imports/:id`). */
  getImport(id: number, page: number, pageSize: number, change?: PartChangeKind): Observable<StockImportDetail> {
    let params = new HttpParams().set('page', page).set('pageSize', pageSize);
    if (change) params = params.set('change', change);
    return this.http.get<StockImportDetail>(`/api/stock/imports/${encodeURIComponent(id)}`, { params });
  }

  /** The stock as a CSV in the import schema (`GET /api/parts/export.csv`), optionally of one location. */
  exportStockList(location?: string): Promise<Blob> {
    const params = location ? new HttpParams().set('location', location) : undefined;
    return firstValueFrom(this.http.get('/api/parts/export.csv', { params, responseType: 'blob' }));
  }
}
