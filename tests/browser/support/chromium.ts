import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './chromium-flags';

export { CHROMIUM_PATH } from './chromium-flags';

/** A headless Chromium with a fresh profile; `close()` also removes the profile. */
export interface Browser {
  readonly context: BrowserContext;
  close(): Promise<void>;
}

/** How the context is started; Playwright's defaults when absent. */
export interface LaunchOptions {
  /** `block` keeps service workers from registering, so that the page's own requests are all it makes. */
  readonly serviceWorkers?: 'allow' | 'block';
}

/** Starts Chromium, or fails with the one line that installs it. */
export async function launchChromium(options: LaunchOptions = {}): Promise<Browser> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `Chromium is not installed at ${CHROMIUM_PATH}. The browser tests drive Debian's Chromium: ` +
        'install it with `apt-get install -y chromium` (or set CHROME_PATH to a Chromium binary).',
    );
  }
  const profile = mkdtempSync(join(tmpdir(), 'counterpoise-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1024, height: 768 },
    ...options,
  });
  return {
    context,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
