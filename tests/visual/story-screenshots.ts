/**
 * Screenshots of every story of a static Storybook build, and a comparison of two sets of them, so that a
 * change to the widgets shows which stories it changed and how much (a review aid, not a test: widgets are
 * meant to change; the stories' own play functions and axe checks are the tests).
 *
 *   npm run build-storybook                               builds storybook-static/
 *   npm run stories:screenshots -- capture storybook-static /tmp/shots-after
 *   npm run stories:screenshots -- compare /tmp/shots-before /tmp/shots-after
 *
 * `capture` serves the build on a free port and opens each story alone (iframe.html) in Debian's Chromium
 * at tablet and phone widths (820 and 390 CSS px, 1x), waits for fonts and for the story to settle, and
 * writes `<story id>@<width>.png`. `compare` counts the pixels that differ (pixelmatch, threshold 0.1) per
 * pair and writes `report.md` beside the after set, with a diff image of each changed story in `diff/`.
 */
import { mkdirSync, readdirSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { join, resolve } from 'node:path';
import express from 'express';
import pixelmatch from 'pixelmatch';
import { chromium } from 'playwright';
import { PNG } from 'pngjs';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../browser/support/chromium-flags';

const WIDTHS = [820, 390] as const;

interface IndexEntry {
  readonly id: string;
  readonly type: string;
  readonly title: string;
  readonly name: string;
}

/** Every story (not docs page) of a static build, in the order of its index. */
function storiesOf(buildDir: string): IndexEntry[] {
  const index = JSON.parse(readFileSync(join(buildDir, 'index.json'), 'utf8')) as {
    entries: Record<string, IndexEntry>;
  };
  return Object.values(index.entries).filter((entry) => entry.type === 'story');
}

async function capture(buildDir: string, outDir: string): Promise<void> {
  mkdirSync(outDir, { recursive: true });
  const app = express().use(express.static(resolve(buildDir)));
  const server = await new Promise<ReturnType<typeof app.listen>>((done) => {
    const listening = app.listen(0, '127.0.0.1', () => done(listening));
  });
  const { port } = server.address() as AddressInfo;
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
  try {
    for (const width of WIDTHS) {
      const page = await browser.newPage({ viewport: { width, height: 900 }, reducedMotion: 'reduce' });
      for (const story of storiesOf(buildDir)) {
        await page.goto(`http://127.0.0.1:${port}/iframe.html?id=${story.id}&viewMode=story`);
        await page.waitForSelector('#storybook-root > *, #storybook-root ~ .sb-errordisplay', {
          timeout: 30_000,
        });
        await page.evaluate(() => document.fonts.ready);
        await page.waitForLoadState('networkidle');
        // Play functions run after the first render; give them and any transition time to settle.
        await page.waitForTimeout(600);
        await page.screenshot({ path: join(outDir, `${story.id}@${width}.png`), fullPage: true });
      }
      await page.close();
    }
  } finally {
    await browser.close();
    server.close();
  }
}

interface Comparison {
  readonly file: string;
  readonly status: 'same' | 'changed' | 'added' | 'removed';
  readonly differentPixels: number;
  readonly share: number;
  readonly sizes: string;
}

function compare(beforeDir: string, afterDir: string): Comparison[] {
  const before = new Set(readdirSync(beforeDir).filter((f) => f.endsWith('.png')));
  const after = new Set(readdirSync(afterDir).filter((f) => f.endsWith('.png')));
  const diffDir = join(afterDir, 'diff');
  mkdirSync(diffDir, { recursive: true });
  const results: Comparison[] = [];
  for (const file of [...new Set([...before, ...after])].sort()) {
    if (!after.has(file)) {
      results.push({ file, status: 'removed', differentPixels: 0, share: 0, sizes: '' });
      continue;
    }
    if (!before.has(file)) {
      results.push({ file, status: 'added', differentPixels: 0, share: 0, sizes: '' });
      continue;
    }
    const a = PNG.sync.read(readFileSync(join(beforeDir, file)));
    const b = PNG.sync.read(readFileSync(join(afterDir, file)));
    // Pages of different heights are compared on a canvas as large as both, the rest blank.
    const width = Math.max(a.width, b.width);
    const height = Math.max(a.height, b.height);
    const padded = (png: PNG) => {
      const canvas = new PNG({ width, height });
      PNG.bitblt(png, canvas, 0, 0, png.width, png.height, 0, 0);
      return canvas;
    };
    const diff = new PNG({ width, height });
    const differentPixels = pixelmatch(padded(a).data, padded(b).data, diff.data, width, height, {
      threshold: 0.1,
    });
    const sizes =
      a.width === b.width && a.height === b.height ? '' : `${a.width}×${a.height} → ${b.width}×${b.height}`;
    if (differentPixels > 0) writeFileSync(join(diffDir, file), PNG.sync.write(diff));
    results.push({
      file,
      status: differentPixels > 0 || sizes !== '' ? 'changed' : 'same',
      differentPixels,
      share: differentPixels / (width * height),
      sizes,
    });
  }
  return results;
}

function report(results: readonly Comparison[]): string {
  const count = (status: Comparison['status']) => results.filter((r) => r.status === status).length;
  const lines = [
    `# Story screenshots compared`,
    '',
    `${results.length} screenshots: ${count('same')} same, ${count('changed')} changed, ` +
      `${count('added')} added, ${count('removed')} removed.`,
    '',
    '| screenshot | status | pixels that differ | size |',
    '| --- | --- | --- | --- |',
    ...results
      .filter((r) => r.status !== 'same')
      .map(
        (r) =>
          `| ${r.file} | ${r.status} | ${r.status === 'changed' ? `${r.differentPixels} (${(100 * r.share).toFixed(1)} %)` : ''} | ${r.sizes} |`,
      ),
  ];
  return lines.join('\n') + '\n';
}

async function main(): Promise<void> {
  const [command, first, second] = process.argv.slice(2);
  if (command === 'capture' && first && second) {
    if (!existsSync(join(first, 'index.json'))) throw new Error(`${first} is not a static Storybook build`);
    await capture(first, second);
    console.log(`${readdirSync(second).filter((f) => f.endsWith('.png')).length} screenshots in ${second}`);
    return;
  }
  if (command === 'compare' && first && second) {
    const text = report(compare(first, second));
    writeFileSync(join(second, 'report.md'), text);
    console.log(text);
    return;
  }
  console.error('usage: story-screenshots capture <storybook-static> <out dir> | compare <before> <after>');
  process.exitCode = 2;
}

await main();
