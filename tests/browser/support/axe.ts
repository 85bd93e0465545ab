import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';

/**
 * Runs axe (Deque's accessibility engine) on the page as it stands and fails with each violation's rule,
 * its help text and the elements at fault. `what` names the page state in the failure message.
 */
export async function expectAccessible(page: Page, what: string): Promise<void> {
  const results = await new AxeBuilder({ page }).analyze();
  const violations = results.violations.map(
    (violation) =>
      `${violation.id} (${violation.impact ?? 'unrated'}): ${violation.help} — ` +
      violation.nodes.map((node) => node.target.join(' ')).join(', '),
  );
  expect(violations, `axe on ${what}`).toEqual([]);
}
