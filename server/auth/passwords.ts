import bcrypt from 'bcryptjs';

// bcrypt with a work factor of 10, the minimum OWASP ASVS 2.4.4 accepts, which keeps sign-in fast on a shop PC.
export const BCRYPT_COST = 10;
export const MIN_PASSWORD_LENGTH = 10;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, BCRYPT_COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}
