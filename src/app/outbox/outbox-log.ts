import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';

import type { MailStatus, OutboxMessage, OutboxPage } from '../../../shared/api/outbox.js';

/** Which Outbox entries to fetch; `page` counts from 1, as the API does. */
export interface OutboxRequest {
  status?: MailStatus;
  page: number;
  pageSize: number;
}

/** The e-mail Shelfmatch sent or tried to send, through the admin-only `/api/outbox` routes. */
@Injectable({ providedIn: 'root' })
export class OutboxLog {
  private readonly http = inject(HttpClient);

  /** One page of entries, newest first (`GET /api/outbox`). */
  list(request: OutboxRequest): Promise<OutboxPage> {
    let params = new HttpParams().set('page', request.page).set('pageSize', request.pageSize);
    if (request.status) params = params.set('status', request.status);
    return firstValueFrom(this.http.get<OutboxPage>('/api/outbox', { params }));
  }

  /** One message with its plain and HTML bodies (`GET /api/outbox/:id`). */
  read(id: number): Promise<OutboxMessage> {
    return firstValueFrom(this.http.get<OutboxMessage>(`/api/outbox/${encodeURIComponent(id)}`));
  }
}
