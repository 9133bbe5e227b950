import { HttpContextToken } from '@angular/common/http';

/**
 * Marks a request that checks credentials (sign-in): its 401 means "wrong e-mail or password",
 * not "session ended", so the interceptor leaves every failure of it to the sign-in page.
 */
export const CREDENTIAL_CHECK = new HttpContextToken<boolean>(() => false);
