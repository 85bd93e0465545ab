import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { hashPassword, hashPasswordSync, passwordWeakness, verifyPassword } from './passwords';
import { loadSigningKey, SIGNING_KEY_FILE } from './tokens';

describe('password hashes', () => {
  it('are scrypt with a fresh salt and their parameters, and verify only the right password', async () => {
    const first = await hashPassword('a ladder of copper gears', { log2N: 10 });
    const second = hashPasswordSync('a ladder of copper gears', { log2N: 11 });
    expect(first).toMatch(/^scrypt\$10\$8\$1\$[\w-]{22}\$[\w-]{43}$/);
    expect(second).toMatch(/^scrypt\$11\$8\$1\$/);
    expect(first.split('$')[4]).not.toBe(second.split('$')[4]);
    await expect(verifyPassword('a ladder of copper gears', first)).resolves.toBe(true);
    await expect(verifyPassword('a ladder of copper gears', second)).resolves.toBe(true);
    await expect(verifyPassword('a ladder of copper gearz', first)).resolves.toBe(false);
    await expect(verifyPassword('anything', 'plain text')).resolves.toBe(false);
  });
});

describe('passwordWeakness', () => {
  it.each([
    ['passwordpassword', /most common/],
    ['Correct Horse Battery Staple', /most common/],
    ['aaaaaaaaaaaaaaaa', /repeats/],
    ['abcabcabcabcabcabc', /repeats/],
    ['123456789012345678', /sequence|most common/],
    ['qwertyuiopasdfghj', /sequence|most common/],
    ['ines.halloway@shop.test', /e-mail address/],
    ['counterpoise2026', /name of the product/],
  ])('refuses %j', (password, reason) => {
    expect(passwordWeakness(password, { email: 'ines.halloway@shop.test' })?.message).toMatch(reason);
  });

  it('accepts a long phrase of any characters, without asking for digits or capitals', () => {
    expect(passwordWeakness('the mill wheel turns at dusk')).toBeNull();
    expect(passwordWeakness('schöne Grüße aus der Werkstatt 🛠')).toBeNull();
  });
});

describe('the signing key', () => {
  it('is generated once into the data folder, readable by its owner only, unless configured', () => {
    const folder = mkdtempSync(join(tmpdir(), 'counterpoise-key-'));
    try {
      const first = loadSigningKey(undefined, folder);
      const file = join(folder, SIGNING_KEY_FILE);
      expect(statSync(file).mode & 0o777).toBe(0o600);
      expect(first.length).toBe(readFileSync(file, 'utf8').trim().length);
      expect(loadSigningKey(undefined, folder)).toEqual(first);
      expect(new TextDecoder().decode(loadSigningKey('x'.repeat(40), folder))).toBe('x'.repeat(40));
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});
