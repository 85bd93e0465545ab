import type { OrganisationUsageReport, UsageGroup, UsageGrouping, UsageStatusCount } from '@counterpoise/api';
import { daysOf, type UsageQueryState } from './usage-query';

/** The usage of the organisation's keys, as `GET /api/v1/usage` answers a signed-in owner or developer. */
export type UsageReport = OrganisationUsageReport;

/** One line of the portal's table and one place on the chart's axis: a day, a route or a key. */
export interface UsageLine {
  /** The group as the report names it: `2026-05-01`, `POST /api/v1/calc/radius` or a key's prefix. */
  readonly group: string;
  /** How the line is named on screen: `5 May`, `POST calc/radius`, `Dealer portal (cpk_Q2xvY2s5…)`. */
  readonly label: string;
  readonly requests: number;
  readonly calculations: number;
  /** Answers with a status of 400 or more. */
  readonly errors: number;
  readonly errorsByStatus: readonly UsageStatusCount[];
  readonly bytes: number;
  readonly meanDurationMs: number;
}

/** What the chart draws: one label per place on the axis and a number per series there. */
export interface UsageSeries {
  readonly labels: readonly string[];
  readonly requests: readonly number[];
  readonly calculations: readonly number[];
  readonly errors: readonly number[];
}

/** Words for the statuses a keyed request meets, so that a developer reads more than a number. */
const STATUS_NAMES: Readonly<Record<number, string>> = {
  400: 'Bad request',
  401: 'No valid key',
  403: 'Refused',
  404: 'Not found',
  405: 'Wrong method',
  406: 'Not acceptable',
  412: 'Changed meanwhile',
  413: 'Too large',
  415: 'Not JSON',
  422: 'Not computable',
  429: 'Over the limit',
  500: 'Server error',
  503: 'Unavailable',
};

/** A status with its name: `429 Over the limit`. */
export function statusLabel(status: number): string {
  const name = STATUS_NAMES[status] ?? (status >= 500 ? 'Server error' : 'Client error');
  return `${status} ${name}`;
}

const DAY_LABEL = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', timeZone: 'UTC' });

/** How a group is named on screen. */
export function groupLabel(
  groupBy: UsageGrouping,
  group: UsageGroup | { group: string; keyName?: string },
): string {
  if (groupBy === 'day') return DAY_LABEL.format(new Date(`${group.group}T00:00:00Z`));
  if (groupBy === 'route') return group.group.replace(' /api/v1/', ' ');
  return group.keyName === undefined ? `${group.group}…` : `${group.keyName} (${group.group}…)`;
}

function errorsOf(statuses: readonly UsageStatusCount[]): number {
  return statuses.reduce((sum, { answers }) => sum + answers, 0);
}

/** The figures of a span, day, route or key without a request: what the server reports for nothing. */
export const NO_USAGE: Omit<UsageGroup, 'group'> = {
  requests: 0,
  calculations: 0,
  clientErrors: 0,
  serverErrors: 0,
  rateLimited: 0,
  errorsByStatus: [],
  bytes: 0,
  meanDurationMs: 0,
  maxDurationMs: 0,
};

/**
 * The report's lines for the table and the chart. By day, every day of the span is a line, those without
 * requests at zero, so that the chart's axis is time; by route and by key, the report's own lines,
 * busiest first.
 */
export function usageLines(report: UsageReport, query: UsageQueryState): UsageLine[] {
  const lineOf = (group: UsageGroup): UsageLine => ({
    group: group.group,
    label: groupLabel(report.groupBy, group),
    requests: group.requests,
    calculations: group.calculations,
    errors: errorsOf(group.errorsByStatus),
    errorsByStatus: group.errorsByStatus,
    bytes: group.bytes,
    meanDurationMs: group.meanDurationMs,
  });
  if (report.groupBy !== 'day') return report.groups.map(lineOf);
  const byDay = new Map(report.groups.map((group) => [group.group, group]));
  return daysOf(query.from, query.to)
    .map((day) => byDay.get(day) ?? { group: day, ...NO_USAGE })
    .map(lineOf);
}

/** The chart's series, line for line. */
export function usageSeries(lines: readonly UsageLine[]): UsageSeries {
  return {
    labels: lines.map((line) => line.label),
    requests: lines.map((line) => line.requests),
    calculations: lines.map((line) => line.calculations),
    errors: lines.map((line) => line.errors),
  };
}

const COUNT = new Intl.NumberFormat('en-GB');

/** A count with its noun: `1 request`, `1,200 requests`. */
export function counted(count: number, one: string, many: string): string {
  return `${COUNT.format(count)} ${count === 1 ? one : many}`;
}

/** Errors in words: `None`, or `3: 400 Bad request ×2, 429 Over the limit ×1`. */
export function errorsText(statuses: readonly UsageStatusCount[]): string {
  if (statuses.length === 0) return 'None';
  return `${COUNT.format(errorsOf(statuses))}: ${statuses
    .map(({ status, answers }) => `${statusLabel(status)} ×${COUNT.format(answers)}`)
    .join(', ')}`;
}

/** Bytes as a person reads them: `980 B`, `12.4 kB`, `3.1 MB`. */
export function bytesText(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** A duration in milliseconds, to a tenth below 10 ms. */
export function durationText(ms: number): string {
  return ms < 10 ? `${ms.toFixed(1)} ms` : `${Math.round(ms)} ms`;
}

const GROUP_NOUN: Readonly<Record<UsageGrouping, string>> = { day: 'day', route: 'route', key: 'key' };

/**
 * The chart in one sentence, its name for assistive technology: what it shows, the totals and the
 * busiest line. The table below it holds every figure.
 */
export function usageSummary(report: UsageReport, lines: readonly UsageLine[]): string {
  const total = report.total;
  const what = `Requests, calculations and errors by ${GROUP_NOUN[report.groupBy]}`;
  if (total.requests === 0 && total.calculations === 0) return `${what}: none in this span.`;
  const busiest = [...lines].sort((a, b) => b.requests - a.requests)[0];
  return (
    `${what}: ${counted(total.requests, 'request', 'requests')}, ` +
    `${counted(total.calculations, 'calculation', 'calculations')} and ` +
    `${counted(errorsOf(total.errorsByStatus), 'error', 'errors')} in all` +
    (busiest === undefined ? '.' : `; the busiest ${GROUP_NOUN[report.groupBy]} is ${busiest.label}.`)
  );
}
