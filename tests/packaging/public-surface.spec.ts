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
  it('exports no helper under its own name: functions are providers, the rest is internal with a _', () => {
    // Geometry, layout, form and request builders stay inside the library; what another entry point
    // needs goes out with a leading underscore (Angular Material's mark of an internal export).
    const helpers = surface.filter((line) => / function (?!provide)[a-z]/.test(line));
    expect(helpers).toEqual([]);
  });

  it('keeps the internal (_) exports to the entry points other entries build on', () => {
    const internalFrom = new Set(
      surface.filter((line) => / {2}\S+ _/.test(line)).map((line) => line.split('  ')[0]),
    );
    expect([...internalFrom].sort()).toEqual(['@counterpoise/ng/core', '@counterpoise/ng/solver']);
  });
});
