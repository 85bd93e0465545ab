/*
 * Accounts in the browser: a technician sees a technician's navigation and signs out; an owner invites a
 * person and finds the invitation in the Outbox with its link masked, and the new person accepts it from
 * the message they got and signs in. The server is the real one over a fresh database with the demo
 * data, with its local mail server on a free port.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MASKED_SECRET } from '@counterpoise/api';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { type AccountsServer, startAccountsServer } from './support/accounts-server';
import { type Browser, launchChromium } from './support/chromium';
import { expectAccessible } from './support/axe';
import { requireBuiltWorkbench } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const NEW_PERSON = { email: 'ines.halloway@ridgeline-rotor.test', name: 'Ines Halloway' };
const NEW_PASSWORD = 'three herons over the weir';

let server: AccountsServer;
let url: string;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  requireBuiltWorkbench();
  mkdirSync(SCREENS_DIR, { recursive: true });
  server = await startAccountsServer();
  url = server.url;
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize({ width: 1024, height: 768 });
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const navigation = () => page.getByRole('navigation', { name: 'Main' });

async function signInAs(email: string, password: string): Promise<void> {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await expectAccessible(page, 'the sign-in page, filled in');
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
}

async function signOut(): Promise<void> {
  await page.getByRole('button', { name: /^Your account: / }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.getByText('You have signed out.').waitFor();
  await expectAccessible(page, 'the sign-in page after signing out');
}

describe('accounts in the workbench', () => {
  it('shows a technician the technician’s navigation, then signs them out', async () => {
    await signInAs('technician@ridgeline-rotor.test', DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Your account: Tomasz Wrenfield' }).waitFor();
    for (const label of ['Home', 'Safety', 'API reference']) {
      await navigation().getByRole('link', { name: label, exact: true }).waitFor();
    }
    for (const label of ['People', 'API keys', 'Outbox']) {
      expect(await navigation().getByRole('link', { name: label, exact: true }).count(), label).toBe(0);
    }
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-technician.png') });
    await expectAccessible(page, 'the technician’s home');

    await signOut();
    expect(await page.getByRole('button', { name: /^Your account: / }).count()).toBe(0);
    // The session is gone on the server too: a reload restores nothing.
    await page.reload();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
  });

  it('lets an owner invite someone, who finds the link masked in the Outbox, accepts and signs in', async () => {
    await signInAs('owner@ridgeline-rotor.test', DEMO_PASSWORD);
    for (const label of ['People', 'API keys', 'Outbox']) {
      await navigation().getByRole('link', { name: label }).waitFor();
    }

    await navigation().getByRole('link', { name: 'People' }).click();
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    await page.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = page.getByRole('dialog', { name: 'Invite someone' });
    await dialog.getByLabel('E-mail address').fill(NEW_PERSON.email);
    await dialog.getByRole('combobox', { name: 'Role' }).click();
    await page.getByRole('option', { name: 'Technician' }).click();
    await dialog.getByLabel('Name (optional)').fill(NEW_PERSON.name);
    await expectAccessible(page, 'the invitation dialog');
    await dialog.getByRole('button', { name: 'Send the invitation' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByRole('table', { name: 'Pending invitations' }).getByText(NEW_PERSON.email).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-people.png'), fullPage: true });
    await expectAccessible(page, 'People with a pending invitation');

    await navigation().getByRole('link', { name: 'Outbox' }).click();
    await page.getByRole('heading', { level: 1, name: 'Outbox' }).waitFor();
    await page
      .getByRole('navigation', { name: 'Messages' })
      .getByRole('link', { name: /invites you to Ridgeline Rotor Service/ })
      .click();
    const message = page.getByRole('article');
    await message
      .getByText(`To${NEW_PERSON.email}`)
      .or(message.getByText(NEW_PERSON.email))
      .first()
      .waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-outbox.png'), fullPage: true });
    await expectAccessible(page, 'the Outbox with a message open');

    // The Outbox shows that the invitation went out, but no link in it works.
    await message.getByText(`${url}/accept-invitation?token=${MASKED_SECRET}`).waitFor();
    expect(await message.getByRole('link', { name: /accept-invitation/ }).count()).toBe(0);
    await message.getByText(/without the secret part of its links/).waitFor();
    const [sent] = server.sentMail.listTo(NEW_PERSON.email);
    const href = new RegExp(`${url}/accept-invitation\\?token=[A-Za-z0-9_-]{43}`).exec(sent!.text)?.[0];
    expect(href).toBeDefined();
    const token = new URL(href!).searchParams.get('token')!;
    expect(await page.content()).not.toContain(token);
    await signOut();

    // The invitee follows the link from the message they got.
    await page.goto(href!);
    await page.getByRole('heading', { level: 1, name: 'Join your shop on Counterpoise' }).waitFor();
    await page.getByText(NEW_PERSON.email).first().waitFor();
    await page.getByLabel('Your name').fill(NEW_PERSON.name);
    await page.getByLabel('Password', { exact: true }).fill(NEW_PASSWORD);
    await expectAccessible(page, 'the invitation’s page, filled in');
    await page.getByRole('button', { name: 'Join and sign in' }).click();
    await page.getByRole('button', { name: `Your account: ${NEW_PERSON.name}` }).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-joined.png') });
    await expectAccessible(page, 'the home of someone who has just joined');

    await signOut();
    await signInAs(NEW_PERSON.email, NEW_PASSWORD);
    await page.getByRole('button', { name: `Your account: ${NEW_PERSON.name}` }).waitFor();
    expect(await navigation().getByRole('link', { name: 'People' }).count()).toBe(0);
  });
});
