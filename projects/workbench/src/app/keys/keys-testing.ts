import { NO_USAGE, type UsageReport } from './usage-model';

/** The organisation of the keys specs' usage, as the demo server names it. */
const ORGANISATION = { id: 1, name: 'Ridgeline Rotor Service' };

/** A usage report with nothing in it, as the server answers a span without requests. */
export function emptyUsage(from: string, to: string, groupBy: UsageReport['groupBy'] = 'day'): UsageReport {
  return {
    organisation: ORGANISATION,
    from: `${from}T00:00:00.000Z`,
    to: new Date(Date.parse(`${to}T00:00:00Z`) + 86_400_000).toISOString(),
    groupBy,
    groups: [],
    total: NO_USAGE,
  };
}

/**
 * Three days of a dealer portal's key, by day: a quiet first day, a day with a batch (one request, three
 * calculations) and refusals, and a day over the limit.
 */
export const USAGE_BY_DAY: UsageReport = {
  organisation: ORGANISATION,
  from: '2026-05-01T00:00:00.000Z',
  to: '2026-05-08T00:00:00.000Z',
  groupBy: 'day',
  groups: [
    {
      group: '2026-05-02',
      requests: 12,
      calculations: 12,
      clientErrors: 0,
      serverErrors: 0,
      rateLimited: 0,
      errorsByStatus: [],
      bytes: 5_400,
      meanDurationMs: 1.2,
      maxDurationMs: 3,
    },
    {
      group: '2026-05-04',
      requests: 20,
      calculations: 24,
      clientErrors: 3,
      serverErrors: 0,
      rateLimited: 0,
      errorsByStatus: [
        { status: 400, answers: 2 },
        { status: 422, answers: 1 },
      ],
      bytes: 11_200,
      meanDurationMs: 2.5,
      maxDurationMs: 9,
    },
    {
      group: '2026-05-06',
      requests: 8,
      calculations: 8,
      clientErrors: 2,
      serverErrors: 0,
      rateLimited: 2,
      errorsByStatus: [{ status: 429, answers: 2 }],
      bytes: 2_100,
      meanDurationMs: 0.8,
      maxDurationMs: 1.5,
    },
  ],
  total: {
    requests: 40,
    calculations: 44,
    clientErrors: 5,
    serverErrors: 0,
    rateLimited: 2,
    errorsByStatus: [
      { status: 400, answers: 2 },
      { status: 422, answers: 1 },
      { status: 429, answers: 2 },
    ],
    bytes: 18_700,
    meanDurationMs: 1.81,
    maxDurationMs: 9,
  },
};
