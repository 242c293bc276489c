/**
 * Password hashing with Node's scrypt (memory-hard). Stored as
 * `scrypt$N$r$p$saltB64$hashB64` so the cost can be raised later without breaking old hashes: a
 * sign-in with a hash of other parameters stores a fresh one (isCurrentHash).
 */
import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';

// N = 2^15, r = 8 uses 32 MiB per hash: OWASP's scrypt minimum (2^17 with 128 MiB would
// make sign-in tests and a 2-core server needlessly slow).
const N = 2 ** 15;
const R = 8;
const P = 1;
const KEY_BYTES = 32;
const MAX_MEM = 64 * 1024 * 1024;

function derive(password: string, salt: Buffer, n: number, r: number, p: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(password, salt, KEY_BYTES, { N: n, r, p, maxmem: MAX_MEM }, (err, key) =>
      err ? reject(err) : resolve(key),
    );
  });
}

export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await derive(password, salt, N, R, P);
  return ['scrypt', N, R, P, salt.toString('base64'), key.toString('base64')].join('$');
}

/** Whether a stored hash was made with today's parameters; if not, sign-in stores a new one. */
export function isCurrentHash(stored: string): boolean {
  const [scheme, n, r, p] = stored.split('$');
  return scheme === 'scrypt' && Number(n) === N && Number(r) === R && Number(p) === P;
}

let dummyHash: Promise<string> | null = null;

/**
 * A hash of a random password nobody knows, made once per process with today's parameters.
 * Sign-in verifies against it when the e-mail has no account, so an unknown address costs the
 * same scrypt work as a wrong password and the answer's timing tells nothing.
 */
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword(randomBytes(32).toString('base64'));
  return dummyHash;
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, n, r, p, saltB64, keyB64] = stored.split('$');
  if (scheme !== 'scrypt' || !n || !r || !p || !saltB64 || !keyB64) return false;
  const expected = Buffer.from(keyB64, 'base64');
  const key = await derive(
    password,
    Buffer.from(saltB64, 'base64'),
    Number(n),
    Number(r),
    Number(p),
  );
  return key.length === expected.length && timingSafeEqual(key, expected);
}
