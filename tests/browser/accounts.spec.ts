/*
 * Accounts in the browser: a technician sees a technician's navigation and signs out; an owner invites a
 * person, reads the invitation in the Outbox, and the new person accepts it and signs in. The server is
 * the real one over a fresh database with the demo data, with its local mail server on a free port.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname, join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/src/app';
import { DEMO_PASSWORD } from '../../server/src/auth/accounts.seed';
import { DEMO_SEEDERS } from '../../server/src/db/demo-seeders';
import { seedDemoData } from '../../server/src/db/seed';
import { smtpMailer } from '../../server/src/mail/mailer';
import { type SmtpCapture, startSmtpCapture } from '../../server/src/mail/smtp-capture';
import { openTemporaryDatabase, type TemporaryDatabase } from '../../server/src/testing/temporary-database';
import { UsageLog } from '../../server/src/usage/usage-log';
import { type Browser, launchChromium } from './support/chromium';
import { WORKBENCH_DIR } from './support/server';

const SCREENS_DIR = join(process.cwd(), 'test-results', 'screens');
const NEW_PERSON = { email: 'ines.halloway@ridgeline-rotor.test', name: 'Ines Halloway' };
const NEW_PASSWORD = 'three herons over the weir';

let temporary: TemporaryDatabase;
let capture: SmtpCapture;
let usageLog: UsageLog;
let server: Server;
let url: string;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  if (!existsSync(join(WORKBENCH_DIR, 'index.html'))) {
    throw new Error(`The workbench is not built in ${WORKBENCH_DIR}: run \`npm run build\` first.`);
  }
  mkdirSync(SCREENS_DIR, { recursive: true });
  temporary = openTemporaryDatabase();
  seedDemoData(temporary.database, new Date(), DEMO_SEEDERS, { dataDir: dirname(temporary.path) });
  capture = await startSmtpCapture({
    database: temporary.database,
    clock: { now: () => new Date() },
    port: 0,
  });
  usageLog = new UsageLog(temporary.database);
  // Listening first, so that the links in the e-mails can name the server's own address.
  server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const app = createApp({
    database: temporary.database,
    staticDir: WORKBENCH_DIR,
    usageLog,
    log: () => undefined,
    accounts: {
      signingKey: randomBytes(48),
      publicUrl: url,
      mailer: smtpMailer({ from: 'Counterpoise <no-reply@counterpoise.test>', localPort: capture.port }),
    },
  });
  server.on('request', app);
  browser = await launchChromium();
  page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize({ width: 1024, height: 768 });
});

afterAll(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
  await capture?.close();
  usageLog?.close();
  temporary?.dispose();
});

const navigation = () => page.getByRole('navigation', { name: 'Main' });

async function signInAs(email: string, password: string): Promise<void> {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.getByRole('button', { name: /^Your account: / }).waitFor();
}

async function signOut(): Promise<void> {
  await page.getByRole('button', { name: /^Your account: / }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.getByText('You have signed out.').waitFor();
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

    await signOut();
    expect(await page.getByRole('button', { name: /^Your account: / }).count()).toBe(0);
    // The session is gone on the server too: a reload restores nothing.
    await page.reload();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
  });

  it('lets an owner invite someone, who accepts from the Outbox and signs in', async () => {
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
    await dialog.getByRole('button', { name: 'Send the invitation' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByRole('table', { name: 'Pending invitations' }).getByText(NEW_PERSON.email).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-people.png'), fullPage: true });

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

    const link = message.getByRole('link', { name: /\/accept-invitation\?token=/ });
    const href = await link.getAttribute('href');
    expect(href).toMatch(new RegExp(`^${url}/accept-invitation\\?token=[A-Za-z0-9_-]{43}$`));
    await signOut();

    await page.goto(href!);
    await page.getByRole('heading', { level: 1, name: 'Join your shop on Counterpoise' }).waitFor();
    await page.getByText(NEW_PERSON.email).first().waitFor();
    await page.getByLabel('Your name').fill(NEW_PERSON.name);
    await page.getByLabel('Password', { exact: true }).fill(NEW_PASSWORD);
    await page.getByRole('button', { name: 'Join and sign in' }).click();
    await page.getByRole('button', { name: `Your account: ${NEW_PERSON.name}` }).waitFor();
    await page.screenshot({ path: join(SCREENS_DIR, 'accounts-joined.png') });

    await signOut();
    await signInAs(NEW_PERSON.email, NEW_PASSWORD);
    await page.getByRole('button', { name: `Your account: ${NEW_PERSON.name}` }).waitFor();
    expect(await navigation().getByRole('link', { name: 'People' }).count()).toBe(0);
  });
});
