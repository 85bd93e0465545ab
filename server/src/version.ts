import { readFileSync } from 'node:fs';

/** The version of Counterpoise, from the root package.json. */
export const VERSION: string = (
  JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }
).version;
