import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { animationsSettled } from './animations';

/** What axe checks besides its defaults. */
export interface AccessibleOptions {
  /**
   * Also the enhanced contrast rule (`color-contrast-enhanced`, WCAG 2.2 AAA 1.4.6): text at 7:1 against its
   * background, large text at 4.5:1. axe leaves it off by default; the high-contrast scheme must pass it.
   */
  readonly enhancedContrast?: boolean;
}

/**
 * axe's `region` rule (all content inside a landmark) counts a dialog as a region of its own, wherever it sits.
 * Material's other pop-ups (a menu, a select's or an autocomplete's list of options) sit in the same overlay
 * container at the end of the body, outside every landmark, only while they are open and tied to the control
 * that opened them (`aria-controls`): they are counted as dialogs are, and the rule still runs on the rest.
 */
const REGION_MATCHER = 'dialog, [role=dialog], [role=alertdialog], svg, [role=menu], [role=listbox]';

/** axe-core as @axe-core/playwright injects it, configured as above. */
const AXE_SOURCE =
  readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8') +
  `;axe.configure(${JSON.stringify({ checks: [{ id: 'region', options: { regionMatcher: REGION_MATCHER } }] })});`;

/**
 * Runs axe (Deque's accessibility engine) on the page once its animations and transitions have come to
 * rest (a colour halfway through a transition is no contrast to judge, and a busy machine stretches them),
 * and fails with each violation's rule, its help text and the elements at fault. `what` names the page
 * state in the failure message.
 */
export async function expectAccessible(
  page: Page,
  what: string,
  options: AccessibleOptions = {},
): Promise<void> {
  await animationsSettled(page);
  const builder = new AxeBuilder({ page, axeSource: AXE_SOURCE });
  if (options.enhancedContrast) builder.options({ rules: { 'color-contrast-enhanced': { enabled: true } } });
  const results = await builder.analyze();
  const violations = results.violations.map(
    (violation) =>
      `${violation.id} (${violation.impact ?? 'unrated'}): ${violation.help} — ` +
      violation.nodes.map((node) => node.target.join(' ')).join(', '),
  );
  expect(violations, `axe on ${what}`).toEqual([]);
}
