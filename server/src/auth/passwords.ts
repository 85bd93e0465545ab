import { randomBytes, scrypt, scryptSync, timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import type { FieldError } from '@counterpoise/api';

/**
 * scrypt's cost parameters: N = 2^cost, r = 8, p = 1. They are stored with each hash, so that raising
 * the cost later leaves the old hashes readable. The default cost (15, 32 MiB per hash) follows the
 * OWASP password-storage guidance for scrypt; tests lower it to stay fast.
 */
export interface ScryptCost {
  readonly log2N: number;
}

const BLOCK_SIZE = 8;
const PARALLELISM = 1;
const SALT_BYTES = 16;
const HASH_BYTES = 32;

function derive(password: string, salt: Buffer, log2N: number, r: number, p: number): Promise<Buffer> {
  const N = 2 ** log2N;
  return new Promise((resolve, reject) => {
    // maxmem must exceed 128·N·r, or Node refuses the larger costs.
    scrypt(password.normalize('NFKC'), salt, HASH_BYTES, { N, r, p, maxmem: 256 * N * r }, (error, key) =>
      error ? reject(error) : resolve(key),
    );
  });
}

/** Hashes a password with a fresh random salt: `scrypt$log2N$r$p$salt$hash`, base64url parts. */
export async function hashPassword(password: string, cost: ScryptCost): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const hash = await derive(password, salt, cost.log2N, BLOCK_SIZE, PARALLELISM);
  return [
    'scrypt',
    cost.log2N,
    BLOCK_SIZE,
    PARALLELISM,
    salt.toString('base64url'),
    hash.toString('base64url'),
  ].join('$');
}

/**
 * The same hash, computed synchronously: for the demo seed and the CLI, which run outside any request
 * and inside a database transaction.
 */
export function hashPasswordSync(password: string, cost: ScryptCost): string {
  const salt = randomBytes(SALT_BYTES);
  const N = 2 ** cost.log2N;
  const hash = scryptSync(password.normalize('NFKC'), salt, HASH_BYTES, {
    N,
    r: BLOCK_SIZE,
    p: PARALLELISM,
    maxmem: 256 * N * BLOCK_SIZE,
  });
  return [
    'scrypt',
    cost.log2N,
    BLOCK_SIZE,
    PARALLELISM,
    salt.toString('base64url'),
    hash.toString('base64url'),
  ].join('$');
}

/** Whether a password matches a stored hash, compared in constant time. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, log2N, r, p, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt' || !log2N || !r || !p || !salt || !hash) return false;
  const expected = Buffer.from(hash, 'base64url');
  const actual = await derive(password, Buffer.from(salt, 'base64url'), Number(log2N), Number(r), Number(p));
  return actual.length === expected.length && timingSafeEqual(actual, expected);
}

/**
 * A hash of no one's password, checked when the address is unknown, so that a sign-in takes as long
 * whether or not the address has an account.
 */
export async function decoyHash(cost: ScryptCost): Promise<string> {
  return hashPassword(randomBytes(24).toString('base64url'), cost);
}

/**
 * The most commonly chosen passwords that the length rule alone would let through (15 characters or
 * more), one a line, lower case. Compiled by hand from the top of the widely published lists of leaked
 * passwords (`common practice`); it catches the obvious, not every weak choice.
 */
const COMMON_PASSWORDS: ReadonlySet<string> = new Set(
  readFileSync(new URL('./common-passwords.txt', import.meta.url), 'utf8')
    .split('\n')
    .map((line) => line.trim().toLowerCase())
    .filter((line) => line !== '' && !line.startsWith('#')),
);

const SEQUENCES = [
  '01234567890123456789012345678901234567890',
  '09876543210987654321098765432109876543210',
  'abcdefghijklmnopqrstuvwxyzabcdefghijklmnopqrstuvwxyz',
  'zyxwvutsrqponmlkjihgfedcbazyxwvutsrqponmlkjihgfedcba',
  'qwertyuiopasdfghjklzxcvbnmqwertyuiopasdfghjklzxcvbnm',
];

/**
 * What NIST SP 800-63B (section 3.1.1.2) asks a verifier to check beyond length: the password is not a
 * commonly used one, not a run of one character or a keyboard or alphabet sequence, and not made of
 * the context (the person's address, the product's name). Composition rules (a digit, a capital) are
 * deliberately absent. Returns the field error to show, or null.
 */
export function passwordWeakness(password: string, context: { email?: string } = {}): FieldError | null {
  const lower = password.normalize('NFKC').toLowerCase();
  const compact = lower.replace(/\s+/g, '');
  const refuse = (message: string): FieldError => ({ path: 'password', message });
  if (COMMON_PASSWORDS.has(lower) || COMMON_PASSWORDS.has(compact)) {
    return refuse('This password is on the list of the most common ones. Choose another.');
  }
  if (/^(.)\1*$/u.test(compact) || /^(.{1,4})\1+$/u.test(compact)) {
    return refuse('This password repeats the same few characters. Choose another.');
  }
  if (SEQUENCES.some((sequence) => sequence.includes(compact))) {
    return refuse('This password is a sequence from the keyboard or the alphabet. Choose another.');
  }
  const email = context.email?.toLowerCase();
  const local = email?.split('@')[0];
  if (email && (compact.includes(email) || (local && local.length >= 4 && compact === local.repeat(2)))) {
    return refuse('This password is made of your e-mail address. Choose another.');
  }
  if (compact.replace(/\d+$/, '') === 'counterpoise' || compact.startsWith('counterpoise1234')) {
    return refuse('This password is made of the name of the product. Choose another.');
  }
  return null;
}
