/*
 * Every curl and TypeScript example of the integrators' guide (docs/integrators/*.md), run against a
 * live server, each answer compared with the one its page documents; a page change that breaks an
 * example fails here.
 *
 * The server is the real app (createApp) on a temporary database and a loopback port, with one
 * organisation and its owner signed in. Each page gets a key of its own, so that what one page's
 * examples count does not depend on another's. curl blocks run through /bin/sh with the real curl; the
 * TypeScript blocks are type-checked (tsc, strict) and run (their types stripped by esbuild) in a folder
 * where @counterpoise/client is installed from its packed tarball with no registry reachable: the
 * packaging check of the client.
 *
 * The client is built afresh into a temporary folder (scripts/build-client.mjs), unless
 * COUNTERPOISE_CLIENT_DIR names a built one (dist/client after `npm run build:client`).
 */
import { execFile, spawnSync } from 'node:child_process';
import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { transformSync } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/src/app';
import { createTestKey } from '../../server/src/keys/testing/test-keys';
import type { OpenApiDocument } from '../../server/src/openapi/openapi';
import { createTestOrganisation, signIn, TEST_HASH_COST } from '../../server/src/testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../../server/src/testing/temporary-database';
import { UsageLog } from '../../server/src/usage/usage-log';
import { type Captures, compareAnswer, type Example, examplesOf, settingsOf } from './support/examples';

const root = fileURLToPath(new URL('../..', import.meta.url));
const guide = join(root, 'docs', 'integrators');
/** The organisation whose owner and keys the examples use. */
const ORGANISATION = 'Ridgeline Rotor Service';

const pages = readdirSync(guide)
  .filter((file) => file.endsWith('.md'))
  .sort()
  .map((file) => {
    const text = readFileSync(join(guide, file), 'utf8');
    return { file, examples: examplesOf(`docs/integrators/${file}`, text), settings: settingsOf(text) };
  });

interface Live {
  temporary: TemporaryDatabase;
  usageLog: UsageLog;
  server: Server;
  url: string;
  accessToken: string;
  document: OpenApiDocument;
  /** The folder the TypeScript examples run in, with the client installed. */
  app: string;
  /** tsc's complaints, by the example file they are about. */
  typeErrors: Map<string, string[]>;
}
let live: Live | undefined;
let work: string;

/** The file a TypeScript example is written to. */
const programFile = (example: Example) =>
  `${example.page.replace(/^docs\/integrators\//, '').replace(/\.md$/, '')}-line-${example.line}.ts`;

function runOrThrow(command: string, args: string[], cwd: string, env: NodeJS.ProcessEnv = process.env) {
  const result = spawnSync(command, args, { cwd, env, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (result.status !== 0) {
    throw new Error(`${command} ${args.join(' ')} failed:\n${result.stdout}\n${result.stderr}`);
  }
  return result.stdout;
}

/** Packs the client, installs the tarball with no registry reachable, and type-checks every program. */
function installClient(): { app: string; typeErrors: Map<string, string[]> } {
  let clientDir = process.env['COUNTERPOISE_CLIENT_DIR'];
  if (clientDir === undefined) {
    clientDir = join(work, 'client');
    runOrThrow(process.execPath, [join(root, 'scripts', 'build-client.mjs'), '--out', clientDir], root);
  }
  // Inside the workspace's node_modules, so that a back-end example may import the workspace's own
  // packages (express) as a dealer's back end would import its own; the client comes from the tarball.
  const app = mkdtempSync(join(root, 'node_modules', '.cache', 'integrators-examples-'));
  const offline = {
    ...process.env,
    npm_config_registry: 'http://127.0.0.1:9/',
    npm_config_offline: 'true',
    npm_config_audit: 'false',
    npm_config_fund: 'false',
    npm_config_update_notifier: 'false',
  };
  const tarball = runOrThrow(
    'npm',
    ['pack', clientDir, '--pack-destination', work, '--silent'],
    work,
    offline,
  )
    .trim()
    .split('\n')
    .at(-1)!;
  writeFileSync(
    join(app, 'package.json'),
    JSON.stringify({ name: 'integrators-examples', private: true, type: 'module' }),
  );
  runOrThrow('npm', ['install', join(work, tarball), '--no-save', '--ignore-scripts'], app, offline);
  // The programs must find the client the tarball installed, not some other copy up the tree.
  const installed = join(app, 'node_modules', '@counterpoise', 'client', 'node_modules', 'openapi-fetch');
  if (!existsSync(join(installed, 'package.json')))
    throw new Error(`The tarball did not install ${installed}.`);

  const programs = pages.flatMap((page) => page.examples.filter((example) => example.kind === 'ts'));
  for (const program of programs) {
    writeFileSync(join(app, programFile(program)), program.code);
    // Run as JavaScript with the types stripped (tsc checks them below): a plain node start per program.
    const { code } = transformSync(program.code, { loader: 'ts', format: 'esm', target: 'node20' });
    writeFileSync(join(app, programFile(program).replace(/\.ts$/, '.mjs')), code);
  }
  writeFileSync(
    join(app, 'tsconfig.json'),
    JSON.stringify({
      compilerOptions: {
        strict: true,
        target: 'ES2022',
        module: 'NodeNext',
        moduleResolution: 'NodeNext',
        lib: ['ES2023', 'DOM'],
        types: ['node'],
        noEmit: true,
        skipLibCheck: true,
      },
      include: ['*.ts'],
    }),
  );
  const typeErrors = new Map<string, string[]>();
  if (programs.length > 0) {
    const tsc = spawnSync(
      process.execPath,
      [join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', 'tsconfig.json', '--pretty', 'false'],
      { cwd: app, encoding: 'utf8' },
    );
    for (const line of tsc.stdout.split('\n')) {
      const file = /^([^(]+\.ts)\(/.exec(line)?.[1];
      if (file !== undefined) typeErrors.set(file, [...(typeErrors.get(file) ?? []), line]);
    }
    if (tsc.status !== 0 && typeErrors.size === 0) throw new Error(`tsc failed:\n${tsc.stdout}${tsc.stderr}`);
  }
  return { app, typeErrors };
}

beforeAll(async () => {
  mkdirSync(join(root, 'node_modules', '.cache'), { recursive: true });
  work = mkdtempSync(join(root, 'node_modules', '.cache', 'integrators-work-'));
  const temporary = openTemporaryDatabase();
  const usageLog = new UsageLog(temporary.database);
  const app = createApp({
    database: temporary.database,
    usageLog,
    accounts: { passwordHashCost: TEST_HASH_COST },
  });
  const organisation = createTestOrganisation(temporary.database, ORGANISATION);
  const { accessToken } = await signIn(app, organisation.people.owner.email);
  const server = await new Promise<Server>((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const { port } = server.address() as AddressInfo;
  live = {
    temporary,
    usageLog,
    server,
    url: `http://127.0.0.1:${port}`,
    accessToken,
    document: app.locals.openApiDocument!,
    ...installClient(),
  };
}, 300_000);

afterAll(async () => {
  if (live) {
    live.server.closeAllConnections();
    await new Promise<void>((resolve) => live!.server.close(() => resolve()));
    live.usageLog.close();
    live.temporary.dispose();
    rmSync(live.app, { recursive: true, force: true });
  }
  if (work) rmSync(work, { recursive: true, force: true });
});

/** Runs a command with the page's variables; resolves with what it printed, whatever its exit. */
function execute(command: string, args: string[], cwd: string, env: NodeJS.ProcessEnv) {
  return new Promise<{ code: number; stdout: string; stderr: string }>((resolve) => {
    execFile(
      command,
      args,
      { cwd, env, timeout: 30_000, maxBuffer: 16 * 1024 * 1024 },
      (error, stdout, stderr) =>
        resolve({ code: error ? (typeof error.code === 'number' ? error.code : 1) : 0, stdout, stderr }),
    );
  });
}

const where = (example: Example) => `${example.page}:${example.line}`;

for (const page of pages) {
  describe(page.file, () => {
    /** The page's variables: the server, its key, the owner's token, and what its answers captured. */
    const variables: Captures = {};
    beforeAll(() => {
      const { key } = createTestKey(live!.temporary.database, {
        name: `Guide page ${page.file}`,
        limitPerMinute: page.settings.keyLimitPerMinute,
      });
      Object.assign(variables, {
        COUNTERPOISE_URL: live!.url,
        COUNTERPOISE_KEY: key,
        COUNTERPOISE_ACCESS_TOKEN: live!.accessToken,
      });
    });

    for (const example of page.examples) {
      const title = `${example.kind === 'curl' ? 'curl' : 'TypeScript'} example at line ${example.line}`;
      it(title, async () => {
        // What earlier examples did is in the usage report before this one asks for it.
        live!.usageLog.flush();
        const env = { ...process.env, ...variables };
        if (example.kind === 'curl') {
          expect(example.answer, `${where(example)}: a curl example is followed by its answer`).toBeDefined();
        } else {
          expect(live!.typeErrors.get(programFile(example)) ?? [], `${where(example)} type-checks`).toEqual(
            [],
          );
        }
        const run =
          example.kind === 'curl'
            ? await execute('/bin/sh', ['-c', example.code], root, env)
            : await execute(
                process.execPath,
                [programFile(example).replace(/\.ts$/, '.mjs')],
                live!.app,
                env,
              );
        expect(run.code, `${where(example)} exits 0\n${run.stderr}`).toBe(0);
        if (example.answer) {
          const { documented, actual } = compareAnswer(
            example.answer.language,
            example.answer.text,
            run.stdout,
            variables,
          );
          expect(actual, `${where(example)}: the answer documented at line ${example.answer.line}`).toEqual(
            documented,
          );
        }
      });
    }
  });
}

describe('the guide as a whole', () => {
  it('has a runnable example in its pages', () => {
    expect(pages.flatMap((page) => page.examples).length).toBeGreaterThan(20);
  });

  it('shows every keyed route of the API with a curl and a TypeScript example', () => {
    const examples = pages.flatMap((page) => page.examples);
    const missing: string[] = [];
    for (const [path, operations] of Object.entries(live!.document.paths ?? {})) {
      for (const [method, operation] of Object.entries(
        operations as Record<string, { security?: unknown }>,
      )) {
        const keyed = JSON.stringify(operation.security ?? []).includes('ApiKey');
        if (!keyed) continue;
        const curlPath = new RegExp(
          `\\$\\{?COUNTERPOISE_URL\\}?${path.replace(/\{[^}]+\}/g, '[^/?\\s"\']+')}(?=[?\\s"']|$)`,
        );
        const byCurl = examples.some(
          (example) =>
            example.kind === 'curl' &&
            curlPath.test(example.code) &&
            (method === 'get' ? !/\s(-d|--data|-X\s*POST)/.test(example.code) : true),
        );
        const byClient = examples.some(
          (example) => example.kind === 'ts' && example.code.includes(`${method.toUpperCase()}('${path}'`),
        );
        if (!byCurl) missing.push(`${method.toUpperCase()} ${path}: no curl example`);
        if (!byClient) missing.push(`${method.toUpperCase()} ${path}: no TypeScript example`);
      }
    }
    expect(missing).toEqual([]);
  });
});

describe('the comparison of an answer with the documented one', () => {
  it('fills placeholders, keeps what they name, and still finds a changed value', () => {
    const captures: Captures = {};
    const documented = '{ "token": "<$VISITOR_TOKEN>", "expiresAt": "<date-time>", "mass": 90 }';
    const same = compareAnswer(
      'json',
      documented,
      '{"token":"abc","expiresAt":"2026-01-01","mass":90}',
      captures,
    );
    expect(same.actual).toEqual(same.documented);
    expect(captures).toEqual({ VISITOR_TOKEN: 'abc' });
    const changed = compareAnswer('json', documented, '{"token":"abc","expiresAt":"x","mass":91}', {});
    expect(changed.actual).not.toEqual(changed.documented);
  });

  it('finds a member the page leaves out, and one the server leaves out', () => {
    const documented = '{ "mass": 90, "warnings": [] }';
    const extra = compareAnswer('json', documented, '{"mass":90,"warnings":[],"radius":240}', {});
    expect(extra.actual).not.toEqual(extra.documented);
    const missing = compareAnswer('json', documented, '{"mass":90}', {});
    expect(missing.actual).not.toEqual(missing.documented);
  });

  it('compares the status and the listed headers of an HTTP answer, placeholders inside a line', () => {
    const documented =
      'HTTP/1.1 429 Too Many Requests\nRetry-After: <seconds>\n\n{ "detail": "Try again in <s> s." }';
    const actual =
      'HTTP/1.1 429 Too Many Requests\r\nDate: now\r\nretry-after: 59\r\n\r\n{"detail":"Try again in 59 s."}';
    const same = compareAnswer('http', documented, actual, {});
    expect(same.actual).toEqual(same.documented);
    const other = compareAnswer('http', documented, actual.replace('429 Too Many', '400 Too Many'), {});
    expect(other.actual).not.toEqual(other.documented);
  });

  it('reads examples, their answers and the blocks not to run from a page', () => {
    const page = [
      '```sh',
      'curl "$COUNTERPOISE_URL/api/v1/calc/radius"',
      '```',
      'Its answer:',
      '```json',
      '{ "mass": 90 }',
      '```',
      '<!-- example: not run -->',
      '```ts',
      'fragment();',
      '```',
      '```sh',
      'npm run api-key -- list',
      '```',
      '```ts',
      'console.log(1);',
      '```',
    ].join('\n');
    const found = examplesOf('page.md', page);
    expect(found.map((example) => [example.kind, example.line, example.answer?.language])).toEqual([
      ['curl', 1, 'json'],
      ['ts', 15, undefined],
    ]);
  });
});
