import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, firstValueFrom } from 'rxjs';

import type {
  BuildListResponse,
  BuildResponse,
  BuildStatus,
  BuildStatusChange,
  CreateBuildRequest,
  ReceiveLine,
  ReceiveShortfallResponse,
  SendShortfallResponse,
  ShortfallListResponse,
  ShortfallListsResponse,
  ShortfallStatus,
} from '../../../shared/api/builds.js';

/** How many builds (or shortfall lists) a page lists at once (the newest; the others are found by name or status). */
export const BUILD_LIST_PAGE_SIZE = 100;

/** The build and shortfall routes of the API (api.md "Builds and shortfall lists"). */
@Injectable({ providedIn: 'root' })
export class BuildClient {
  private readonly http = inject(HttpClient);

  /** The newest builds, optionally only those whose name holds `search` (any case) or of one status (`GET /api/builds`), with how many there are in all. */
  listBuilds(options: { pageSize?: number; search?: string; status?: BuildStatus } = {}): Observable<BuildListResponse> {
    let params = new HttpParams().set('pageSize', options.pageSize ?? BUILD_LIST_PAGE_SIZE);
    if (options.search?.trim()) params = params.set('search', options.search.trim());
    if (options.status) params = params.set('status', options.status);
    return this.http.get<BuildListResponse>('/api/builds', { params });
  }

  /** One build with its lines and shortfall list (`GET /api/builds/:id`). */
  getBuild(id: number): Observable<BuildResponse> {
    return this.http.get<BuildResponse>(`/api/builds/${encodeURIComponent(id)}`);
  }

  /** Plans a build and, unless told otherwise, reserves what stock allows (`POST /api/builds`). */
  createBuild(request: CreateBuildRequest): Observable<BuildResponse> {
    return this.http.post<BuildResponse>('/api/builds', request);
  }

  /** Reserves a planned build (`POST /api/builds/:id/reserve`). */
  reserveBuild(id: number): Observable<BuildResponse> {
    return this.http.post<BuildResponse>(`/api/builds/${encodeURIComponent(id)}/reserve`, {});
  }

  /** Marks a build built (stores) or cancelled (designers) (`PATCH /api/builds/:id`). */
  changeBuildStatus(id: number, status: BuildStatusChange['status']): Observable<BuildResponse> {
    return this.http.patch<BuildResponse>(`/api/builds/${encodeURIComponent(id)}`, { status });
  }

  /** The shortfall lists changed last, optionally only those of one status or whose build's name holds `search` (`GET /api/shortfall`), with how many there are in all. */
  listShortfallLists(options: { pageSize?: number; search?: string; status?: ShortfallStatus } = {}): Observable<ShortfallListsResponse> {
    let params = new HttpParams().set('pageSize', options.pageSize ?? BUILD_LIST_PAGE_SIZE);
    if (options.search?.trim()) params = params.set('search', options.search.trim());
    if (options.status) params = params.set('status', options.status);
    return this.http.get<ShortfallListsResponse>('/api/shortfall', { params });
  }

  /** A build's shortfall list (`GET /api/builds/:id/shortfall`). */
  getShortfall(buildId: number): Observable<ShortfallListResponse> {
    return this.http.get<ShortfallListResponse>(`/api/builds/${encodeURIComponent(buildId)}/shortfall`);
  }

  /** A build's shortfall list as CSV (`GET /api/builds/:id/shortfall.csv`). */
  exportShortfall(buildId: number): Promise<Blob> {
    return firstValueFrom(this.http.get(`/api/builds/${encodeURIComponent(buildId)}/shortfall.csv`, { responseType: 'blob' }));
  }

  /** E-mails a shortfall list with its CSV (`POST /api/builds/:id/shortfall/send`). */
  sendShortfall(buildId: number, to: string): Observable<SendShortfallResponse> {
    return this.http.post<SendShortfallResponse>(`/api/builds/${encodeURIComponent(buildId)}/shortfall/send`, { to });
  }

  /** Sets a shortfall list's status (`PATCH /api/builds/:id/shortfall`). */
  changeShortfallStatus(buildId: number, status: ShortfallStatus): Observable<ShortfallListResponse> {
    return this.http.patch<ShortfallListResponse>(`/api/builds/${encodeURIComponent(buildId)}/shortfall`, { status });
  }

  /** Receives bought parts into stock through the stock-list importer (`POST /api/builds/:id/shortfall/receive`). */
  receiveShortfall(buildId: number, lines: ReceiveLine[]): Observable<ReceiveShortfallResponse> {
    return this.http.post<ReceiveShortfallResponse>(`/api/builds/${encodeURIComponent(buildId)}/shortfall/receive`, { lines });
  }
}

/** Saves `blob` as a file called `fileName` through a temporary link (the browser's own download). */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.click();
  URL.revokeObjectURL(url);
}
