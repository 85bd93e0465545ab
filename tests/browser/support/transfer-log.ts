import type { CDPSession, Page } from 'playwright-core';

/** The kinds of the breakdown, from Chromium's resource types (DevTools protocol, Network.ResourceType). */
export type TransferKind = 'document' | 'script' | 'stylesheet' | 'font' | 'image' | 'xhr/fetch' | 'other';

/** One request of the page as Chromium's network log saw it. */
export interface LoggedRequest {
  readonly url: string;
  readonly kind: TransferKind;
  readonly status: number;
  /** The response's Content-Encoding (`br`, `gzip`), empty when sent as it is. */
  readonly contentEncoding: string;
  /** Bytes over the wire, headers included: `encodedDataLength` of `Network.loadingFinished`. */
  readonly bytes: number;
  /** Why the request did not finish (Chromium's error text, or `cancelled` by the page); absent when it did. */
  readonly failure?: string;
}

/** What a stretch of the page's life transferred. */
export interface TransferFigures {
  readonly bytes: number;
  readonly requests: number;
  readonly byKind: Readonly<Record<TransferKind, { bytes: number; requests: number }>>;
  readonly log: readonly LoggedRequest[];
}

const KINDS: Record<string, TransferKind> = {
  Document: 'document',
  Script: 'script',
  Stylesheet: 'stylesheet',
  Font: 'font',
  Image: 'image',
  XHR: 'xhr/fetch',
  Fetch: 'xhr/fetch',
};

interface InFlight {
  url: string;
  kind: TransferKind;
  status: number;
  contentEncoding: string;
  /** Bytes seen so far: the response's headers, then each `Network.dataReceived`. */
  bytes: number;
}

/**
 * Chromium's network log of one page, read through a DevTools protocol session on the page's own target
 * (Network.enable): every request's `encodedDataLength` (headers and body as they came over the wire)
 * from `Network.loadingFinished`, and for a request that failed, the bytes it had received. Requests
 * that the service worker makes for itself (its precaching) run in the worker's own target and are not
 * seen here; a response that the page gets from the service worker counts the bytes the network sent,
 * none when it came from the worker's cache.
 */
export class TransferLog {
  private readonly inFlight = new Map<string, InFlight>();
  private readonly done: LoggedRequest[] = [];
  private lastActivity = Date.now();

  private constructor(private readonly session: CDPSession) {}

  /** Starts logging the page's network. */
  static async start(page: Page): Promise<TransferLog> {
    const session = await page.context().newCDPSession(page);
    const log = new TransferLog(session);
    session.on('Network.requestWillBeSent', (event) => {
      log.lastActivity = Date.now();
      // A redirect reuses the request id: the redirect's own response is counted in the next one's bytes.
      const previous = log.inFlight.get(event.requestId);
      log.inFlight.set(event.requestId, {
        url: event.request.url,
        kind: KINDS[event.type ?? ''] ?? 'other',
        status: 0,
        contentEncoding: '',
        bytes: previous?.bytes ?? 0,
      });
    });
    session.on('Network.responseReceived', (event) => {
      const request = log.inFlight.get(event.requestId);
      if (!request) return;
      request.status = event.response.status;
      request.contentEncoding = headerOf(event.response.headers, 'content-encoding');
      request.bytes += event.response.encodedDataLength;
      log.lastActivity = Date.now();
    });
    session.on('Network.dataReceived', (event) => {
      const request = log.inFlight.get(event.requestId);
      if (request) request.bytes += event.encodedDataLength;
      log.lastActivity = Date.now();
    });
    session.on('Network.loadingFinished', (event) => {
      log.finish(event.requestId, event.encodedDataLength);
    });
    session.on('Network.loadingFailed', (event) => {
      // Cancelled by the page (an aborted fetch) is not a failure: the app no longer wanted the answer.
      log.finish(event.requestId, undefined, event.canceled ? 'cancelled' : event.errorText);
    });
    await session.send('Network.enable');
    return log;
  }

  private finish(requestId: string, encodedDataLength?: number, failure?: string): void {
    const request = this.inFlight.get(requestId);
    this.lastActivity = Date.now();
    if (!request) return;
    this.inFlight.delete(requestId);
    this.done.push({
      ...request,
      bytes: encodedDataLength ?? request.bytes,
      ...(failure === undefined ? {} : { failure }),
    });
  }

  /** Resolves once no request has been under way for `quietMs` (as Playwright's "networkidle"). */
  async idle(quietMs = 500, timeoutMs = 30_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    while (this.inFlight.size > 0 || Date.now() - this.lastActivity < quietMs) {
      if (Date.now() > deadline) {
        const open = [...this.inFlight.values()].map((request) => request.url).join(', ');
        throw new Error(`The network never went quiet; still under way: ${open || 'nothing'}`);
      }
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
  }

  /** The requests finished so far, and the index where the next stretch starts. */
  get mark(): number {
    return this.done.length;
  }

  /** The figures of the requests finished between two `mark`s (from the start, to now by default). */
  figures(from = 0, to = this.done.length): TransferFigures {
    const log = this.done.slice(from, to);
    const byKind = Object.fromEntries(
      (['document', 'script', 'stylesheet', 'font', 'image', 'xhr/fetch', 'other'] as const).map((kind) => {
        const ofKind = log.filter((request) => request.kind === kind);
        return [kind, { bytes: sum(ofKind), requests: ofKind.length }];
      }),
    ) as Record<TransferKind, { bytes: number; requests: number }>;
    return { bytes: sum(log), requests: log.length, byKind, log };
  }

  async stop(): Promise<void> {
    await this.session.detach();
  }
}

function sum(requests: readonly LoggedRequest[]): number {
  return requests.reduce((total, request) => total + request.bytes, 0);
}

function headerOf(headers: Record<string, string>, name: string): string {
  const key = Object.keys(headers).find((header) => header.toLowerCase() === name);
  return key === undefined ? '' : (headers[key] ?? '');
}

/** The figures as a table: one line per kind, then the total, in bytes and kB (1 kB = 1,024 bytes). */
export function transferTable(title: string, figures: TransferFigures): string {
  const row = (name: string, bytes: number, requests: number) =>
    `  ${name.padEnd(12)}${String(requests).padStart(9)}${String(bytes).padStart(11)}${(bytes / 1024).toFixed(1).padStart(10)}`;
  return [
    title,
    `  ${'kind'.padEnd(12)}${'requests'.padStart(9)}${'bytes'.padStart(11)}${'kB'.padStart(10)}`,
    ...Object.entries(figures.byKind)
      .filter(([, kind]) => kind.requests > 0)
      .map(([name, kind]) => row(name, kind.bytes, kind.requests)),
    row('total', figures.bytes, figures.requests),
  ].join('\n');
}

/** A person who signs in: the demo technician in the tests. */
export interface SignInAs {
  readonly email: string;
  readonly password: string;
}

/** The figures of a cold visit that opens the sign-in page, signs in and lands on the home page. */
export interface ColdVisitFigures {
  /** The sign-in page, until the network is quiet. */
  readonly signInPage: TransferFigures;
  /** What signing in and landing on the home page added. */
  readonly added: TransferFigures;
  /** Both: the home page after sign-in, from a cold cache. */
  readonly home: TransferFigures;
}

/**
 * On `page` (of a fresh profile: a cold cache), opens `${baseUrl}/sign-in`, waits for the network to go
 * quiet, signs in as `as`, waits for the home page's heading and for the network to go quiet again.
 * `landed` names the home page's heading (the workbench's "Your day").
 */
export async function measureColdVisit(
  page: Page,
  baseUrl: string,
  as: SignInAs,
  landed = 'Your day',
): Promise<ColdVisitFigures> {
  const log = await TransferLog.start(page);
  try {
    await page.goto(`${baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'Sign in', exact: true }).waitFor();
    await log.idle();
    const mark = log.mark;
    await page.getByLabel('E-mail address').fill(as.email);
    await page.getByLabel('Password', { exact: true }).fill(as.password);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: landed }).waitFor();
    await log.idle();
    return { signInPage: log.figures(0, mark), added: log.figures(mark), home: log.figures() };
  } finally {
    await log.stop();
  }
}
