/** Where Debian's Chromium lives; `CHROME_PATH` points elsewhere. */
export const CHROMIUM_PATH = process.env['CHROME_PATH'] ?? '/usr/bin/chromium';

/**
 * Flags for a headless Chromium on a machine without outside network: no background traffic, and
 * every host but localhost unresolvable so that nothing waits on a look-up that cannot succeed. Used by
 * the browser tests and by the Storybook project in vitest.config.ts.
 */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE localhost, EXCLUDE 127.0.0.1',
];
