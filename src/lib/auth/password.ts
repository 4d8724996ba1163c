import 'server-only';
import bcrypt from 'bcryptjs';

/**
 * bcrypt cost factor. 11 takes ~150 ms per hash in pure JavaScript on this class of machine:
 * slow enough to hurt offline guessing, fast enough for a sign-in.
 */
const BCRYPT_COST = 11;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

export function verifyPassword(password: string, passwordHash: string): Promise<boolean> {
  return bcrypt.compare(password, passwordHash);
}

/**
 * A hash of a random string, compared against when the e-mail is unknown so that a sign-in for an
 * unknown address takes as long as one for a known address (no account enumeration by timing).
 */
let decoyHash: Promise<string> | undefined;
export function decoyPasswordHash(): Promise<string> {
  decoyHash ??= bcrypt.hash(`decoy-${Math.random()}`, BCRYPT_COST);
  return decoyHash;
}
