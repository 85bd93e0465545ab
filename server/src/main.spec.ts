/*
 * The server as people start it: through npm (`npm start`, `npm run serve`) and with NODE_ENV=production.
 * A stop signal sent to npm alone, as a service manager or a container runtime sends it, must reach the
 * server's graceful shutdown: npm exits after the server, the port closes, no process is left behind, and
 * every answered keyed request has its usage row. Traffic stays on 127.0.0.1; waits are bounded, and
 * afterAll kills whatever a failed test left running.
 */
import { type ChildProcess, execFileSync, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { Agent, request } from 'node:http';
import { createServer, connect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import BetterSqlite3 from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_API_KEY_FILE } from './keys/keys.seed';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const REQUESTS = 5;

/** Every process group and folder a test started, for afterAll. */
const started: ChildProcess[] = [];
const folders: string[] = [];

afterAll(() => {
  for (const child of started) {
    // Each child leads its own process group, which holds anything it started, orphans included.
    try {
      if (child.pid) process.kill(-child.pid, 'SIGKILL');
    } catch {
      // The group is gone already.
    }
  }
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

/** A port nobody listens on now, so that the test knows where the server will be before it starts. */
async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const address = probe.address();
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  if (address === null || typeof address === 'string') throw new Error('No port was given.');
  return address.port;
}

/** Resolves once `check` holds; fails, naming `what`, if it still does not after `timeoutMs`. */
async function waitFor(what: string, check: () => boolean, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > until) throw new Error(`Gave up waiting for ${what}.`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

interface ProcessRow {
  pid: number;
  ppid: number;
  state: string;
  args: string;
}

const processTable = (): ProcessRow[] =>
  execFileSync('ps', ['-eo', 'pid=,ppid=,stat=,args='], { encoding: 'utf8' })
    .split('\n')
    .map((line) => /^\s*(\d+)\s+(\d+)\s+(\S+)\s+(.*)$/.exec(line))
    .filter((match) => match !== null)
    .map(([, pid, ppid, state, args]) => ({
      pid: Number(pid),
      ppid: Number(ppid),
      state: state!,
      args: args!,
    }));

/** The processes started by `pid`, their children, and so on. */
function descendants(pid: number): ProcessRow[] {
  const table = processTable();
  const found: ProcessRow[] = [];
  let parents = new Set([pid]);
  while (parents.size > 0) {
    const children = table.filter((row) => parents.has(row.ppid));
    found.push(...children);
    parents = new Set(children.map((row) => row.pid));
  }
  return found;
}

/** A process that has exited counts as gone even while it waits to be reaped (a zombie). */
const running = (pid: number) => processTable().some((row) => row.pid === pid && !row.state.startsWith('Z'));

/** Whether a connection to the port is refused, as it is once the server has closed it. */
const refused = (port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve(false);
    });
    socket.once('error', (error: NodeJS.ErrnoException) => resolve(error.code === 'ECONNREFUSED'));
  });

interface Started {
  child: ChildProcess;
  port: number;
  folder: string;
  databasePath: string;
  output: () => string;
  /** How the process ended, once everything it and its children wrote has been read (or 10 s after). */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

/**
 * Starts `command` from the repository's root as a user would, with the database in a folder of its own
 * and nothing inherited that would choose the demo data for it; resolves once the server listens.
 */
async function startServer(command: string, args: string[], env: NodeJS.ProcessEnv): Promise<Started> {
  const folder = mkdtempSync(join(tmpdir(), 'counterpoise-process-'));
  folders.push(folder);
  const port = await freePort();
  const databasePath = join(folder, 'counterpoise.sqlite');
  const inherited = { ...process.env };
  // vitest sets NODE_ENV=test; each case says what it runs with.
  delete inherited['NODE_ENV'];
  delete inherited['SEED_DEMO'];
  const child = spawn(command, args, {
    cwd: ROOT,
    env: {
      ...inherited,
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databasePath,
      STATIC_DIR: join(folder, 'no-workbench'),
      SMTP_FAKE_PORT: '0',
      PASSWORD_HASH_COST: '10',
      npm_config_update_notifier: 'false',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  started.push(child);
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  let ended = 0;
  child.stdout?.on('end', () => ended++);
  child.stderr?.on('end', () => ended++);
  let stopped = false;
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.on('exit', (code, signal) => {
      stopped = true;
      // 'exit' may come before the last output; a process left behind would hold the pipes open for good.
      void waitFor('the output to end', () => ended === 2, 10_000)
        .catch(() => undefined)
        .then(() => resolve({ code, signal }));
    }),
  );
  await waitFor(
    `"is running at" from ${command} ${args.join(' ')}`,
    () => {
      if (stopped) throw new Error(`${command} ${args.join(' ')} stopped before listening:\n${output}`);
      return output.includes(`is running at http://127.0.0.1:${port}`);
    },
    60_000,
  );
  return { child, port, folder, databasePath, output: () => output, exited };
}

/**
 * Keyed calculator requests with the demo key, over a connection kept alive as clients keep theirs (the
 * server must close it to stop); an agent of the test's own, so that no pooled connection to an earlier
 * server on the same port is reused. Returns the statuses answered.
 */
async function keyedRequests(started: Started): Promise<number[]> {
  const key = readFileSync(join(started.folder, DEMO_API_KEY_FILE), 'utf8').trim();
  const agent = new Agent({ keepAlive: true, maxSockets: 1 });
  const statuses: number[] = [];
  for (let i = 0; i < REQUESTS; i++) {
    const body = JSON.stringify({ mass: 120 + i, fromRadius: 180, toRadius: 240 });
    const status = await new Promise<number>((resolve, reject) => {
      const outgoing = request(
        {
          host: '127.0.0.1',
          port: started.port,
          path: '/api/v1/calc/radius',
          method: 'POST',
          agent,
          headers: { 'x-api-key': key, 'content-type': 'application/json' },
        },
        (response) => {
          response.resume();
          response.on('end', () => resolve(response.statusCode ?? 0));
        },
      );
      outgoing.on('error', reject);
      outgoing.end(body);
    });
    statuses.push(status);
  }
  return statuses;
}

const usageRows = (databasePath: string) => {
  const sqlite = new BetterSqlite3(databasePath, { readonly: true, fileMustExist: true });
  try {
    return sqlite.prepare('SELECT route, status FROM api_usage ORDER BY id').all() as {
      route: string;
      status: number;
    }[];
  } finally {
    sqlite.close();
  }
};

const tableSize = (databasePath: string, table: 'users' | 'api_keys') => {
  const sqlite = new BetterSqlite3(databasePath, { readonly: true, fileMustExist: true });
  try {
    return (sqlite.prepare(`SELECT count(*) AS count FROM ${table}`).get() as { count: number }).count;
  } finally {
    sqlite.close();
  }
};

describe('a stop signal sent to npm', { timeout: 120_000 }, () => {
  it.each([
    ['npm run serve', ['run', 'serve'], { SEED_DEMO: 'true' }],
    // The build is not what is under test: SKIP_BUILD serves without it.
    ['npm start', ['start'], { SKIP_BUILD: 'true' }],
  ])('reaches the server under %s, which stops gracefully before npm exits', async (_name, args, env) => {
    const server = await startServer('npm', args, env);
    const npmPid = server.child.pid!;
    const statuses = await keyedRequests(server);
    expect(statuses).toEqual(Array.from({ length: REQUESTS }, () => 200));

    const tree = descendants(npmPid);
    // The node process itself, not a shell whose command line names it.
    const serverProcess = tree.filter((row) =>
      /^(\S*\/)?node .*(server\/src\/main\.ts|dist\/server\/main\.js)/.test(row.args),
    );
    expect(serverProcess, JSON.stringify(tree)).toHaveLength(1);

    process.kill(npmPid, 'SIGTERM');
    const exit = await server.exited;

    // npm exits only once the server has: the port is closed and the server process is gone.
    expect(await refused(server.port), 'the port still answers after npm exited').toBe(true);
    expect(running(serverProcess[0]!.pid), `the server outlived npm:\n${server.output()}`).toBe(false);
    expect(server.output()).toContain('SIGTERM received: finishing the requests under way');
    expect(exit, server.output()).toEqual({ code: 0, signal: null });
    // Helpers of the server (tsx's esbuild service) end once their parent has.
    const left = () => tree.filter((row) => running(row.pid));
    await waitFor('the processes npm started to end', () => left().length === 0, 10_000).catch(
      () => undefined,
    );
    expect(left()).toEqual([]);

    // The graceful shutdown wrote the usage row of every answered request.
    expect(usageRows(server.databasePath)).toEqual(
      statuses.map((status) => ({ route: 'POST /api/v1/calc/radius', status })),
    );
  });
});

describe('the demo data at start-up', { timeout: 120_000 }, () => {
  it('is left out of a production server, which says why', async () => {
    const server = await startServer(process.execPath, ['--import', 'tsx', 'server/src/main.ts'], {
      NODE_ENV: 'production',
    });
    server.child.kill('SIGTERM');
    expect(await server.exited).toEqual({ code: 0, signal: null });

    // Read once the process has exited, when everything it wrote to stdout and stderr is in.
    expect(server.output()).toMatch(
      /Demo data: +off \(NODE_ENV=production; set SEED_DEMO=true to seed it\)\n/,
    );
    expect(server.output()).not.toContain('WARNING');
    expect(server.output()).not.toContain('Demo sign-ins');

    expect(existsSync(join(server.folder, DEMO_API_KEY_FILE))).toBe(false);
    expect(tableSize(server.databasePath, 'users')).toBe(0);
    expect(tableSize(server.databasePath, 'api_keys')).toBe(0);
  });

  it('is seeded by npm start, in production, with a warning that says so', async () => {
    const server = await startServer('npm', ['start'], { SKIP_BUILD: 'true' });
    process.kill(server.child.pid!, 'SIGTERM');
    expect(await server.exited).toEqual({ code: 0, signal: null });

    expect(server.output()).toMatch(/Demo data: +on \(SEED_DEMO=true\)\n/);
    expect(server.output()).toMatch(
      /WARNING: this server runs with NODE_ENV=production and holds the demo data/,
    );
    expect(existsSync(join(server.folder, DEMO_API_KEY_FILE))).toBe(true);
    expect(tableSize(server.databasePath, 'users')).toBeGreaterThan(0);
  });
});
