// `node --import tsx bench/first-load.ts [url]`: what a cold visit to the workbench transfers, measured in
// Chromium's network log as tests/browser/first-load.spec.ts measures it (the spec holds the budgets; this
// prints the figures, for any server: the note's before and after). A fresh Chromium profile opens the
// sign-in page, signs in as the demo technician and lands on the home page, with service workers blocked
// (as the spec measures: every file the page needs is fetched by the page itself); the figures are bytes
// over the wire, headers included, per kind of request. `--requests` lists every request. The url defaults
// to http://localhost:4300 (`npm start`).
import type { Page } from 'playwright-core';
import { launchChromium } from '../tests/browser/support/chromium';
import { measureColdVisit, transferTable } from '../tests/browser/support/transfer-log';

const args = process.argv.slice(2);
const listRequests = args.includes('--requests');
const url = (args.find((arg) => !arg.startsWith('--')) ?? 'http://localhost:4300').replace(/\/$/, '');
const technician = { email: 'technician@ridgeline-rotor.test', password: 'balance the drum before lunch' };

const browser = await launchChromium({ serviceWorkers: 'block' });
try {
  const page: Page = browser.context.pages()[0] ?? (await browser.context.newPage());
  await page.setViewportSize({ width: 390, height: 844 });
  const { signInPage, added, home } = await measureColdVisit(page, url, technician);
  console.log(`Cold visit to ${url}\n`);
  console.log(transferTable('Sign-in page:', signInPage));
  console.log(transferTable('\nSigning in and landing on the home page added:', added));
  console.log(transferTable('\nHome page after sign-in, in total:', home));
  if (listRequests) {
    console.log('\nEvery request (bytes, kind, encoding, status, url):');
    for (const request of home.log) {
      console.log(
        `  ${String(request.bytes).padStart(8)}  ${request.kind.padEnd(10)} ${(request.contentEncoding || '-').padEnd(5)} ` +
          `${request.status} ${request.url.replace(url, '')}${request.failure ? ` (${request.failure})` : ''}`,
      );
    }
  }
} finally {
  await browser.close();
}
