import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, firstValueFrom } from 'rxjs';

import type { SolveRequest, SolveResponse } from '../../../shared/api/matches.js';
import type { ChosenFit, SaveMatchRequest, SavedMatch, SavedMatchSummary } from './saved-match.js';

/** The match routes of the API (api.md "Matches"): solve, save, list and open. */
@Injectable({ providedIn: 'root' })
export class MatchClient {
  private readonly http = inject(HttpClient);

  /** Ideal networks and their stocked fits for a request (`POST /api/matches/solve`; saves nothing). */
  solve(request: SolveRequest): Observable<SolveResponse> {
    return this.http.post<SolveResponse>('/api/matches/solve', request);
  }

  /** Saves a request with its chosen fit under a name (`POST /api/matches`). */
  save(name: string, request: SolveRequest, chosen: ChosenFit): Observable<SavedMatchSummary> {
    const body: SaveMatchRequest = { name, request, chosen };
    return this.http.post<SavedMatchSummary>('/api/matches', body);
  }

  /** The newest saved matches whose name holds `search` (any case; all when blank), with how many there are in all. */
  find(search: string): Observable<{ items: SavedMatchSummary[]; total: number }> {
    const params = search.trim() ? { search: search.trim() } : undefined;
    return this.http.get<{ items: SavedMatchSummary[]; total: number }>('/api/matches', { params });
  }

  /**
   * A saved match's network as a Touchstone 2-port file (`GET /api/matches/:id/touchstone`): the
   * fitted network with full part models, or the ideal one; with the file name the server gives.
   */
  async touchstone(id: number, network: 'fit' | 'ideal'): Promise<{ blob: Blob; fileName: string }> {
    const response = await firstValueFrom(
      this.http.get(`/api/matches/${encodeURIComponent(id)}/touchstone`, { params: { network }, responseType: 'blob', observe: 'response' }),
    );
    const named = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '');
    return { blob: response.body ?? new Blob([]), fileName: named?.[1] ?? `match-${id}-${network}.s2p` };
  }

  /** Deletes a saved match (the designer who saved it, or an admin); builds keep their own copy. */
  delete(id: number): Observable<void> {
    return this.http.delete<void>(`/api/matches/${encodeURIComponent(id)}`);
  }

  /** One saved match with its inputs, chosen fit, results and sweep (`GET /api/matches/:id`). */
  open(id: number | string): Observable<SavedMatch> {
    return this.http.get<SavedMatch>(`/api/matches/${encodeURIComponent(id)}`);
  }
}
