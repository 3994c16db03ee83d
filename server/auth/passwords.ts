import { PASSWORD_MIN_LENGTH } from '../../shared/session-types';
import { hashPool } from './hash-pool';

// bcrypt with a work factor of 10, the minimum OWASP ASVS 2.4.4 accepts, which keeps sign-in fast on a shop PC.
export const BCRYPT_COST = 10;
// At least 12 characters (OWASP ASVS 4.0.3 V2.1.1); one number for the forms and the routes.
export const MIN_PASSWORD_LENGTH = PASSWORD_MIN_LENGTH;

/** Hashes in a worker thread, so the main thread keeps answering while bcrypt works. */
export function hashPassword(plain: string): Promise<string> {
  return hashPool.run<string>({ op: 'hash', plain, cost: BCRYPT_COST });
}

/** Compares in a worker thread; rejects with HashQueueFull when too many are already waiting. */
export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return hashPool.run<boolean>({ op: 'compare', plain, hash });
}
