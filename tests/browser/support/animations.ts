import type { Page } from 'playwright-core';

/**
 * Waits until the page's animations that end have ended, so that a screenshot shows where things come to
 * rest (the stepper's slide, a dialog's entrance). Spinners turn for ever and are not waited for; an
 * animation cancelled meanwhile (a dialog closing, a view leaving) rejects its promise, and there is
 * nothing left to wait for.
 */
export async function animationsSettled(page: Page): Promise<void> {
  await page.evaluate(() =>
    Promise.all(
      document
        .getAnimations()
        .filter((animation) => animation.effect?.getComputedTiming().iterations !== Infinity)
        .map((animation) => animation.finished.catch(() => undefined)),
    ),
  );
}
