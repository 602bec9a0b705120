import crypto from 'node:crypto';
import { promisify } from 'node:util';
import type { PasswordHashCost } from '../config';

const scrypt = promisify(crypto.scrypt) as (
  password: crypto.BinaryLike,
  salt: crypto.BinaryLike,
  keylen: number,
  options: crypto.ScryptOptions,
) => Promise<Buffer>;

const KEY_LENGTH = 32;
/** At most this many hashes at once: each OWASP-strength hash holds about 128 MiB. */
const MAX_CONCURRENT = 2;
let running = 0;
const waiting: Array<() => void> = [];

async function withSlot<T>(fn: () => Promise<T>): Promise<T> {
  if (running >= MAX_CONCURRENT) await new Promise<void>((resolve) => waiting.push(resolve));
  running++;
  try {
    return await fn();
  } finally {
    running--;
    waiting.shift()?.();
  }
}

function derive(password: string, salt: Buffer, cost: PasswordHashCost) {
  return withSlot(() =>
    scrypt(password.normalize('NFKC'), salt, KEY_LENGTH, {
      N: cost.N,
      r: cost.r,
      p: cost.p,
      maxmem: 128 * cost.N * cost.r * 2 + 1024 * 1024,
    }),
  );
}

/**
 * Hashes a password with scrypt. The parameters travel inside the stored string, so
 * a later change of cost still verifies old hashes.
 */
export async function hashPassword(password: string, cost: PasswordHashCost): Promise<string> {
  const salt = crypto.randomBytes(16);
  const key = await derive(password, salt, cost);
  return `scrypt$${cost.N}$${cost.r}$${cost.p}$${salt.toString('base64')}$${key.toString('base64')}`;
}

/** Checks a password against a stored hash in constant time. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return false;
  const [, n, r, p, salt, key] = parts;
  const expected = Buffer.from(key, 'base64');
  const actual = await derive(password, Buffer.from(salt, 'base64'), {
    N: Number(n),
    r: Number(r),
    p: Number(p),
  });
  return expected.length === actual.length && crypto.timingSafeEqual(expected, actual);
}

let commonPasswords: Set<string> | null = null;
async function loadCommonPasswords(): Promise<Set<string>> {
  if (!commonPasswords) {
    const { dictionary } = await import('@zxcvbn-ts/language-common');
    commonPasswords = new Set(dictionary['passwords-common'] as string[]);
  }
  return commonPasswords;
}

export const MIN_PASSWORD_LENGTH = 10;

/**
 * Returns a sentence saying what is wrong with a new password, or null when it is fine.
 * Very common passwords are refused whatever their length (NIST SP 800-63B, 5.1.1.2).
 */
export async function passwordProblem(
  password: string,
  context: string[] = [],
): Promise<string | null> {
  if (password.length < MIN_PASSWORD_LENGTH)
    return `The password must be at least ${MIN_PASSWORD_LENGTH} characters long.`;
  if (password.length > 200) return 'The password must be at most 200 characters long.';
  const lower = password.toLowerCase();
  const common = await loadCommonPasswords();
  if (common.has(lower) || /^(.)\1+$/.test(password))
    return 'That password is one of the most common ones and easy to guess; please choose another.';
  for (const word of context) {
    if (word && word.length >= 4 && lower.includes(word.toLowerCase()))
      return 'The password must not contain your e-mail address or display name.';
  }
  return null;
}
