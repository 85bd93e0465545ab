import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { publicSurface } from './public-surface';

/**
 * The library's public API is a promise to dealers: every entry point exports what a page needs
 * (components, harnesses, tokens, providers, the types of inputs and outputs) and nothing more. This
 * holds the exports to the reviewed list; after a deliberate change, `npm run api:surface` rewrites it.
 */
describe('the public surface of @counterpoise/ng', () => {
  const surface = publicSurface();

  it('is the reviewed list in public-surface.txt', () => {
    const reviewed = readFileSync(new URL('./public-surface.txt', import.meta.url), 'utf8')
      .split('\n')
      .filter((line) => line !== '');
    expect(surface).toEqual(reviewed);
  });
});
