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

let dummy: Promise<string> | undefined;

/**
 * A hash of a random password at the same cost, compared against when the e-mail has no account
 * (or no password yet), so that such a sign-in costs the same bcrypt work as a real one.
 */
export function dummyPasswordHash(): Promise<string> {
  dummy ??= bcrypt.hash(crypto.randomUUID(), COST);
  return dummy;
}
