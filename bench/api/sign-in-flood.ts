/*
 * `npm run bench:sign-in-flood`: how much a flood of sign-ins for made-up addresses slows a signed-in
 * person's `GET /api/v1/me`, with the password-hash gate as the server ships it (2 hashes at once, 20
 * waiting) and with a gate wide open (as before the gate existed). Each round times `/me` alone, then
 * while FLOOD_SIZE sign-ins (scrypt at the production cost, 32 MiB each) are under way, all in one
 * process on loopback. The slowest `/me` is the one that matters: its token check (WebCrypto HMAC) runs
 * on libuv's thread pool, behind every hash already queued there. Figures, not assertions: the ratio
 * slowest/alone is what docs/benchmarks.md reports, since this machine's speed swings from run to run.
 *
 * Options (environment): FLOOD_SIZE (default 40), FLOOD_ROUNDS (default 3).
 */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createApp } from '../../server/src/app';
import { HashGate } from '../../server/src/auth/hash-gate';
import { hashPasswordSync } from '../../server/src/auth/passwords';
import { AccountsRepo } from '../../server/src/accounts/accounts.repo';
import { openTemporaryDatabase } from '../../server/src/testing/temporary-database';

const FLOOD_SIZE = Number(process.env['FLOOD_SIZE'] ?? 40);
const ROUNDS = Math.max(1, Number(process.env['FLOOD_ROUNDS'] ?? 3));
const PASSWORD = 'three herons over the weir';
const COST = 15;

const median = (values: readonly number[]) =>
  [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

async function timeMe(url: string, token: string, count: number): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < count; i++) {
    const start = performance.now();
    const answer = await fetch(`${url}/api/v1/me`, { headers: { Authorization: `Bearer ${token}` } });
    await answer.arrayBuffer();
    if (answer.status !== 200) throw new Error(`/me answered ${answer.status}`);
    times.push(performance.now() - start);
  }
  return times;
}

async function measure(
  gate: HashGate,
): Promise<{ aloneMs: number; floodMs: number; floodWorstMs: number; refused: number }> {
  const temporary = openTemporaryDatabase();
  const repo = new AccountsRepo(temporary.database.orm);
  const organisation = repo.insertOrganisation('Flood Bench Shop', new Date());
  repo.insertUser({
    organisationId: organisation.id,
    email: 'owner@flood-bench.test',
    name: 'Bench Owner',
    role: 'owner',
    passwordHash: hashPasswordSync(PASSWORD, { log2N: COST }),
    createdAt: new Date(),
  });
  const app = createApp({
    database: temporary.database,
    log: () => undefined,
    accounts: {
      passwordHashCost: COST,
      hashGate: gate,
      clientLimits: { signIn: { limit: 1_000_000, windowMs: 60_000 } },
    },
  });
  const server = await new Promise<Server>((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  try {
    const signIn = (email: string, password: string) =>
      fetch(`${url}/api/v1/auth/sign-in`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email, password }),
      });
    const session = (await (await signIn('owner@flood-bench.test', PASSWORD)).json()) as {
      accessToken: string;
    };
    await timeMe(url, session.accessToken, 5);
    const alone = await timeMe(url, session.accessToken, 20);
    const flood = Array.from({ length: FLOOD_SIZE }, (_, i) =>
      signIn(`nobody-${i}@flood-bench.test`, 'not the password of anyone').then((answer) => answer.status),
    );
    const during = await timeMe(url, session.accessToken, 20);
    const statuses = await Promise.all(flood);
    return {
      aloneMs: median(alone),
      floodMs: median(during),
      floodWorstMs: Math.max(...during),
      refused: statuses.filter((status) => status === 429).length,
    };
  } finally {
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    temporary.dispose();
  }
}

const rows: string[] = [];
for (let round = 1; round <= ROUNDS; round++) {
  for (const [name, gate] of [
    ['gate as shipped (2 at once, 20 waiting)', new HashGate()],
    ['gate wide open (before)', new HashGate({ maxRunning: 1_000, maxWaiting: 1_000 })],
  ] as const) {
    const { aloneMs, floodMs, floodWorstMs, refused } = await measure(gate);
    rows.push(
      `round ${round}  ${name.padEnd(40)} /me alone ${aloneMs.toFixed(1)} ms; during ${FLOOD_SIZE} sign-ins ` +
        `median ${floodMs.toFixed(1)} ms, slowest ${floodWorstMs.toFixed(0)} ms ` +
        `(×${(floodWorstMs / aloneMs).toFixed(0)}); sign-ins refused 429: ${refused}`,
    );
    console.log(rows.at(-1));
  }
}
