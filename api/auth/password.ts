/**
 * Password hashing with Node's scrypt (memory-hard; RFC 7914): "scrypt$N$r$p$salt$hash", salt
 * and hash base64. Verification is constant-time.
 */
import { randomBytes, scrypt as scryptCallback, timingSafeEqual, type ScryptOptions } from 'node:crypto';

/** Minimum password length (the server's rule). */
export const MIN_PASSWORD_LENGTH = 12;
/** scrypt cost parameters: N = 2^14, r = 8, p = 1 (common practice for interactive sign-in). */
const COST = { N: 16384, r: 8, p: 1 };
const KEY_LENGTH = 32;

function scrypt(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scryptCallback(password.normalize('NFKC'), salt, KEY_LENGTH, options, (error, key) => (error ? reject(error) : resolve(key))),
  );
}

export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, COST);
  return ['scrypt', COST.N, COST.r, COST.p, salt.toString('base64'), key.toString('base64')].join('$');
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, n, r, p, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt' || !salt || !hash) return false;
  const expected = Buffer.from(hash, 'base64');
  const key = await scrypt(password, Buffer.from(salt, 'base64'), { N: Number(n), r: Number(r), p: Number(p) });
  return key.length === expected.length && timingSafeEqual(key, expected);
}

/** A hash of a random password, compared against when the account does not exist (same timing). */
export const DUMMY_HASH_PROMISE = hashPassword(randomBytes(16).toString('hex'));
