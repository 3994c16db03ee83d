import { HttpContextToken } from '@angular/common/http';

/**
 * Set on a request whose 401 answer means something other than "signed out" (a wrong password
 * at sign-in or on the password form), so the sign-out interceptor leaves that answer to the caller.
 */
export const HANDLES_OWN_401 = new HttpContextToken<boolean>(() => false);
