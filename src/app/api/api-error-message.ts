import { HttpErrorResponse } from '@angular/common/http';

import type { ApiErrorBody, ApiErrorDetail } from '../../../shared/api/errors.js';

/** Whether `body` has the `{error: {code, message}}` shape every API route sends (api.md). */
export function isApiErrorBody(body: unknown): body is ApiErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) return false;
  const inner = (body as { error: unknown }).error;
  return (
    typeof inner === 'object' &&
    inner !== null &&
    typeof (inner as { message?: unknown }).message === 'string' &&
    typeof (inner as { code?: unknown }).code === 'string'
  );
}

/**
 * The sentence to show a person for a failed request: the server's own `error.message` when the
 * answer has the API's error shape, else `fallback`. A request that never reached the server
 * (status 0) always gets a message saying so, since there is no server message to show.
 */
export function apiErrorMessage(error: unknown, fallback: string): string {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0) return 'Cannot reach the Shelfmatch server. Check that it is running.';
    if (isApiErrorBody(error.error)) return error.error.error.message;
  }
  return fallback;
}

/** The located problems (`details`) of a failed request, or an empty list when there are none. */
export function apiErrorDetails(error: unknown): ApiErrorDetail[] {
  if (error instanceof HttpErrorResponse && isApiErrorBody(error.error)) {
    return error.error.error.details ?? [];
  }
  return [];
}

/** The stable snake_case `error.code` of a failed request, or null when the answer has none. */
export function apiErrorCode(error: unknown): string | null {
  if (error instanceof HttpErrorResponse && isApiErrorBody(error.error)) return error.error.error.code;
  return null;
}
