import bcrypt from 'bcryptjs';

// Cost 10 keeps a sign-in near 50 ms on this class of machine while staying above the
// common-practice minimum for bcrypt.
const COST = 10;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, COST);
}

export function checkPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}
