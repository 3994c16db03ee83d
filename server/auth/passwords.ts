import bcrypt from 'bcryptjs';
import { PASSWORD_MIN_LENGTH } from '../../shared/session-types';

// bcrypt with a work factor of 10, the minimum OWASP ASVS 2.4.4 accepts, which keeps sign-in fast on a shop PC.
export const BCRYPT_COST = 10;
// At least 12 characters (OWASP ASVS 4.0.3 V2.1.1); one number for the forms and the routes.
export const MIN_PASSWORD_LENGTH = PASSWORD_MIN_LENGTH;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}
