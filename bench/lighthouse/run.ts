// `npm run bench:lighthouse`: the sign-in page's Lighthouse figures (mobile profile, simulated throttling,
// Debian's Chromium), against two baselines measured in the same run (bench/lighthouse/baseline-apps.ts):
// Angular alone (`bare`), and the least a Material sign-in page costs (`floor`). The three are audited in
// turn, the order rotating each round, so that the machine's swings fall on all of them alike; the table
// gives the median of each figure and the workbench's ratios to each baseline.
//
// BENCH_ROUNDS (default 5) sets the rounds. The workbench served is `npm run build`'s (dist/workbench), or
// WORKBENCH_DIR's. Takes about a minute to build the baselines and 25 s per audit.
import * as chromeLauncher from 'chrome-launcher';
import lighthouse from 'lighthouse';
import { fileURLToPath } from 'node:url';
import { median } from '../../shared/engine/family-sensitivity';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../../tests/browser/support/chromium-flags';
import { requireBuiltWorkbench, startServer, type TestServer } from '../../tests/browser/support/server';
import { type BaselineName, type BuiltBaseline, buildBaseline } from './baseline-apps';

const root = fileURLToPath(new URL('../..', import.meta.url));
const rounds = Number(process.env['BENCH_ROUNDS'] ?? 5);

/** Issue 15's target for the sign-in page. */
const TARGET = { score: 0.95, lcpMs: 2_500 };

type Target = BaselineName | 'workbench';
interface Figures {
  readonly score: number;
  readonly fcpMs: number;
  readonly lcpMs: number;
  readonly tbtMs: number;
  readonly siMs: number;
}

requireBuiltWorkbench();
console.log('Building the baselines (bare Angular, and a Material sign-in page)…');
const baselines: Partial<Record<BaselineName, BuiltBaseline>> = {};
const servers: Partial<Record<Target, TestServer>> = {};
let chrome: chromeLauncher.LaunchedChrome | undefined;
try {
  for (const name of ['bare', 'floor'] as const) {
    baselines[name] = await buildBaseline(root, name);
    // Our own server, so that the baselines get the same static serving, headers and compressed copies.
    servers[name] = await startServer(baselines[name].browserDir);
  }
  servers.workbench = await startServer();
  const pages: Record<Target, string> = {
    bare: `${servers.bare!.url}/`,
    floor: `${servers.floor!.url}/sign-in`,
    workbench: `${servers.workbench.url}/sign-in`,
  };

  chrome = await chromeLauncher.launch({
    chromePath: CHROMIUM_PATH,
    chromeFlags: [...CHROMIUM_ARGS, '--headless=new'],
    logLevel: 'error',
  });
  const audit = async (url: string): Promise<Figures> => {
    for (let attempt = 0; ; attempt++) {
      const lhr = (
        await lighthouse(url, { port: chrome!.port, onlyCategories: ['performance'], logLevel: 'error' })
      )?.lhr;
      if (lhr?.runtimeError?.code === 'NO_NAVSTART' && attempt === 0) continue;
      if (!lhr || lhr.runtimeError)
        throw new Error(`Lighthouse failed on ${url}: ${lhr?.runtimeError?.message}`);
      const value = (id: string) => lhr.audits[id]?.numericValue ?? Number.NaN;
      return {
        score: lhr.categories['performance']?.score ?? 0,
        fcpMs: value('first-contentful-paint'),
        lcpMs: value('largest-contentful-paint'),
        tbtMs: value('total-blocking-time'),
        siMs: value('speed-index'),
      };
    }
  };

  const targets: Target[] = ['bare', 'floor', 'workbench'];
  const results: Record<Target, Figures[]> = { bare: [], floor: [], workbench: [] };
  for (let round = 0; round < rounds; round++) {
    const order = targets.map((_, index) => targets[(index + round) % targets.length]!);
    const line: string[] = [];
    for (const target of order) {
      const figures = await audit(pages[target]);
      results[target].push(figures);
      line.push(
        `${target} ${figures.score.toFixed(2)} (TBT ${Math.round(figures.tbtMs)}, LCP ${Math.round(figures.lcpMs)})`,
      );
    }
    console.log(`round ${round + 1}/${rounds}: ${line.join(' · ')}`);
  }

  const medians = Object.fromEntries(
    targets.map((target) => {
      const runs = results[target];
      const of = (key: keyof Figures) => median(runs.map((run) => run[key]));
      return [
        target,
        { score: of('score'), fcpMs: of('fcpMs'), lcpMs: of('lcpMs'), tbtMs: of('tbtMs'), siMs: of('siMs') },
      ];
    }),
  ) as Record<Target, Figures>;
  console.log(`\nMedians of ${rounds} rounds, Lighthouse's mobile profile:`);
  console.table(
    Object.fromEntries(
      targets.map((target) => [
        target,
        {
          score: medians[target].score,
          'FCP ms': Math.round(medians[target].fcpMs),
          'LCP ms': Math.round(medians[target].lcpMs),
          'TBT ms': Math.round(medians[target].tbtMs),
          'SI ms': Math.round(medians[target].siMs),
        },
      ]),
    ),
  );
  // A ratio to a baseline figure of 0 (bare Angular blocks for no time) says nothing: "n/a".
  const ratio = (key: keyof Figures, baseline: BaselineName) =>
    medians[baseline][key] > 0 ? (medians.workbench[key] / medians[baseline][key]).toFixed(2) : 'n/a';
  for (const baseline of ['bare', 'floor'] as const) {
    console.log(
      `workbench / ${baseline}: score ${ratio('score', baseline)}, FCP ${ratio('fcpMs', baseline)}, ` +
        `LCP ${ratio('lcpMs', baseline)}, TBT ${ratio('tbtMs', baseline)}`,
    );
  }
  const met = results.workbench.filter(
    (run) => run.score >= TARGET.score && run.lcpMs <= TARGET.lcpMs,
  ).length;
  console.log(
    `Issue 15's target (score ≥ ${TARGET.score}, LCP ≤ ${TARGET.lcpMs} ms): met in ${met} of ${rounds} rounds; ` +
      `the floor scored ≥ ${TARGET.score} in ${results.floor.filter((run) => run.score >= TARGET.score).length}.`,
  );
} finally {
  await chrome?.kill();
  for (const server of Object.values(servers)) await server?.stop();
  for (const baseline of Object.values(baselines)) baseline?.remove();
}
