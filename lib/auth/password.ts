import { randomBytes, scrypt, timingSafeEqual } from "node:crypto";

// scrypt (Percival 2009, RFC 7914); N = 2^15, r = 8, p = 1 follows the RFC's interactive-login guidance.
const N = 32768;
const R = 8;
const P = 1;
const KEY_LENGTH = 32;
const MAX_MEM = 64 * 1024 * 1024;

function derive(password: string, salt: Buffer, n: number, r: number, p: number): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scrypt(password, salt, KEY_LENGTH, { N: n, r, p, maxmem: MAX_MEM }, (err, key) => (err ? reject(err) : resolve(key))),
  );
}

/** Hashes a password as `scrypt$N$r$p$salt$key` (base64 salt and key). */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await derive(password, salt, N, R, P);
  return `scrypt$${N}$${R}$${P}$${salt.toString("base64")}$${key.toString("base64")}`;
}

/** Checks a password against a stored hash in constant time; false for any malformed hash. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parts = stored.split("$");
  if (parts.length !== 6 || parts[0] !== "scrypt") return false;
  const [n, r, p] = parts.slice(1, 4).map(Number);
  if (![n, r, p].every(Number.isSafeInteger)) return false;
  const expected = Buffer.from(parts[5], "base64");
  if (expected.length !== KEY_LENGTH) return false;
  let actual: Buffer;
  try {
    actual = await derive(password, Buffer.from(parts[4], "base64"), n, r, p);
  } catch (err) {
    // Node refuses scrypt parameters it cannot use (N not a power of two, too much memory, out of range) with a RangeError.
    if (err instanceof RangeError) return false;
    throw err;
  }
  return timingSafeEqual(actual, expected);
}
