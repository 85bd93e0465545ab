// `npm test`: every suite in one command (lint, types, engine, server, reference checks, widget library,
// workbench, widget stories, production build, packaging, browser tests), then a summary. Exits non-zero
// when anything failed.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const bin = (path) => join(root, 'node_modules', path);
const resultsDir = join(root, 'test-results');
mkdirSync(resultsDir, { recursive: true });

const node = (script, ...args) => [process.execPath, bin(script), ...args];
const ng = (...args) => node('@angular/cli/bin/ng.js', ...args);
const vitest = (report, ...args) =>
  node(
    'vitest/vitest.mjs',
    'run',
    ...args,
    '--reporter=default',
    '--reporter=json',
    `--outputFile.json=${report}`,
  );
const ngTest = (project, report) =>
  ng('test', project, '--watch=false', '--reporters=json', '--reporters=default', `--output-file=${report}`);

/** Each step: a name, the commands it runs in order, and the vitest JSON report it leaves, if any. */
const steps = [
  {
    name: 'Lint and format',
    commands: [
      node('eslint/bin/eslint.js', '.', '--max-warnings=0'),
      node('prettier/bin/prettier.cjs', '--check', '.', '--log-level=warn'),
    ],
  },
  {
    name: 'Types (server, shared, tests)',
    commands: [node('typescript/bin/tsc', '-p', 'tsconfig.node.json')],
  },
  {
    name: 'Engine, server, reference, source',
    report: 'node.json',
    commands: [
      vitest(
        join(resultsDir, 'node.json'),
        '--project',
        'shared',
        '--project',
        'server',
        '--project',
        'reference',
        '--project',
        'source',
      ),
    ],
  },
  {
    name: 'Widget library (ng test)',
    report: 'library.json',
    commands: [ngTest('counterpoise', join(resultsDir, 'library.json'))],
  },
  {
    name: 'Workbench app (ng test)',
    report: 'workbench.json',
    commands: [ngTest('workbench', join(resultsDir, 'workbench.json'))],
  },
  {
    name: 'Widget stories (Chromium)',
    report: 'stories.json',
    commands: [vitest(join(resultsDir, 'stories.json'), '--project', 'storybook')],
  },
  {
    name: 'Production build',
    commands: [
      [process.execPath, join(root, 'scripts', 'build-lib.mjs')],
      [process.execPath, join(root, 'scripts', 'build-app.mjs')],
      [process.execPath, join(root, 'scripts', 'build-client.mjs')],
    ],
  },
  {
    name: 'Packaging (npm pack, dealer app)',
    report: 'packaging.json',
    needs: 'Production build',
    commands: [vitest(join(resultsDir, 'packaging.json'), '--project', 'packaging')],
  },
  {
    name: 'Docs (site, guide examples)',
    report: 'docs.json',
    needs: 'Production build',
    commands: [
      // The docs site and its widget catalogue (dist/docs), which tests/docs/site.spec.ts serves and crawls.
      [process.execPath, join(root, 'scripts', 'build-docs.mjs')],
      vitest(join(resultsDir, 'docs.json'), '--project', 'docs'),
    ],
  },
  {
    name: 'Browser (Chromium)',
    report: 'browser.json',
    needs: 'Production build',
    commands: [vitest(join(resultsDir, 'browser.json'), '--project', 'browser')],
  },
];

const env = { ...process.env, NG_CLI_ANALYTICS: 'false' };
const results = [];
const started = Date.now();

for (const step of steps) {
  const result = { name: step.name, status: 'passed', passed: 0, failed: 0, skipped: 0, seconds: 0 };
  results.push(result);
  const prerequisite = step.needs && results.find((r) => r.name === step.needs);
  if (prerequisite && prerequisite.status !== 'passed') {
    result.status = 'not run';
    console.log(`\n▶ ${step.name}: not run, because "${step.needs}" failed.`);
    continue;
  }
  console.log(`\n▶ ${step.name}`);
  const report = step.report && join(resultsDir, step.report);
  if (report) rmSync(report, { force: true });
  const stepStart = Date.now();
  for (const [command, ...args] of step.commands) {
    const run = spawnSync(command, args, { cwd: root, env, stdio: 'inherit' });
    if (run.status !== 0) {
      result.status = 'failed';
      break;
    }
  }
  result.seconds = (Date.now() - stepStart) / 1000;
  if (report && existsSync(report)) {
    const json = JSON.parse(readFileSync(report, 'utf8'));
    result.passed = json.numPassedTests ?? 0;
    result.failed = json.numFailedTests ?? 0;
    result.skipped = (json.numPendingTests ?? 0) + (json.numTodoTests ?? 0);
    if (json.numTotalTests === 0) result.status = 'failed';
  }
  // A step with no report counts as one check: the linter, the type checker, the build.
  if (!report) result.status === 'passed' ? result.passed++ : result.failed++;
  else if (result.status === 'failed' && result.failed === 0) result.failed = 1;
}

const total = results.reduce(
  (sum, r) => ({
    passed: sum.passed + r.passed,
    failed: sum.failed + r.failed,
    skipped: sum.skipped + r.skipped,
  }),
  { passed: 0, failed: 0, skipped: 0 },
);
const pad = (text, width) => String(text).padEnd(width);
console.log('\nCounterpoise test summary');
console.log(
  `  ${pad('step', 36)}${pad('result', 10)}${pad('passed', 8)}${pad('failed', 8)}${pad('skipped', 9)}time`,
);
for (const r of results) {
  console.log(
    `  ${pad(r.name, 36)}${pad(r.status, 10)}${pad(r.passed, 8)}${pad(r.failed, 8)}${pad(r.skipped, 9)}${r.seconds.toFixed(1)} s`,
  );
}
const failedSteps = results.filter((r) => r.status !== 'passed');
console.log(`  total time ${((Date.now() - started) / 1000).toFixed(1)} s`);
if (failedSteps.length > 0) console.log(`  failed: ${failedSteps.map((r) => r.name).join(', ')}`);
console.log(`${total.passed} passed, ${total.failed} failed, ${total.skipped} skipped`);
process.exit(failedSteps.length > 0 ? 1 : 0);
