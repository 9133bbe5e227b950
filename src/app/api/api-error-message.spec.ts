import { HttpErrorResponse } from '@angular/common/http';

import { apiErrorCode, apiErrorDetails, apiErrorMessage } from './api-error-message.js';

describe('apiErrorMessage', () => {
  it('takes the message of the API error shape (api.md)', () => {
    const error = new HttpErrorResponse({
      status: 409,
      error: { error: { code: 'email_taken', message: 'That e-mail is in use.', details: [{ field: 'email', message: 'in use' }] } },
    });
    expect(apiErrorMessage(error, 'fallback')).toBe('That e-mail is in use.');
    expect(apiErrorCode(error)).toBe('email_taken');
    expect(apiErrorDetails(error)).toEqual([{ field: 'email', message: 'in use' }]);
  });

  it('falls back when the body is not the API error shape (e.g. a proxy page)', () => {
    const error = new HttpErrorResponse({ status: 502, error: '<html>Bad gateway</html>' });
    expect(apiErrorMessage(error, 'fallback')).toBe('fallback');
    expect(apiErrorDetails(error)).toEqual([]);
    expect(apiErrorCode(error)).toBeNull();
  });

  it('says the server was not reached when there was no answer', () => {
    expect(apiErrorMessage(new HttpErrorResponse({ status: 0 }), 'fallback')).toMatch(/Cannot reach the Shelfmatch server/);
  });
});
