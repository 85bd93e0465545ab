import {
  type FieldError,
  MAX_USAGE_SPAN_DAYS,
  type OrganisationUsageReport,
  type UsageFigures,
  type UsageQuery,
  type UsageReport,
  type UsageStatusCount,
} from '@counterpoise/api';
import type { ApiKeyIdentity } from '../http/keyed-request';
import { HttpProblem } from '../http/problem';
import type { UsageGroupRow, UsageRepo } from './usage.repo';

const DAY_MS = 86_400_000;
/** The span of a report that names neither end. */
const DEFAULT_SPAN_MS = 30 * DAY_MS;

/** Durations are measured to the microsecond at best; more digits would only be noise. */
const round = (ms: number) => Math.round(ms * 1000) / 1000;

function figuresOf(
  row: Omit<UsageGroupRow, 'group' | 'keyName'>,
  errorsByStatus: readonly UsageStatusCount[],
): UsageFigures {
  return {
    requests: row.requests,
    calculations: row.calculations,
    clientErrors: row.clientErrors,
    serverErrors: row.serverErrors,
    rateLimited: row.rateLimited,
    errorsByStatus: [...errorsByStatus],
    bytes: row.bytes,
    meanDurationMs: row.requests === 0 ? 0 : round(row.totalDurationMs / row.requests),
    maxDurationMs: round(row.maxDurationMs),
  };
}

/**
 * The span a query asks for: `to` defaults to now and `from` to 30 days before `to`. A span that
 * ends before it starts, or is longer than a report covers, is a 400 naming the parameter to change.
 */
export function resolveSpan(query: UsageQuery, now: Date): { from: Date; to: Date } {
  const to = query.to ?? now;
  const from = query.from ?? new Date(to.getTime() - DEFAULT_SPAN_MS);
  const errors: FieldError[] = [];
  if (from.getTime() >= to.getTime()) {
    errors.push(
      query.to === undefined
        ? { path: 'from', message: 'from is in the future; without to, the report ends now.' }
        : { path: 'to', message: 'to must come after from.' },
    );
  } else if (to.getTime() - from.getTime() > MAX_USAGE_SPAN_DAYS * DAY_MS) {
    errors.push({
      path: query.from === undefined ? 'to' : 'from',
      message: `A report covers at most ${MAX_USAGE_SPAN_DAYS} days; bring from and to closer.`,
    });
  }
  const [error] = errors;
  if (error) {
    // Worded and coded as the query's own validation, so that a client handles both alike.
    throw new HttpProblem(
      400,
      'Bad Request',
      `${error.path}: ${error.message}`,
      errors,
      'about:blank',
      'INVALID_REQUEST',
    );
  }
  return { from, to };
}

/**
 * The usage report of the calling key over the span of the query, in groups and in total. It reads
 * what the usage log has written, which trails the requests by at most a flush interval.
 */
export function buildUsageReport(
  repo: UsageRepo,
  apiKey: ApiKeyIdentity,
  query: UsageQuery,
  now: Date,
): UsageReport {
  return {
    key: { id: apiKey.id, name: apiKey.name, prefix: apiKey.prefix },
    ...summarise(repo, apiKey.id, query, now),
  };
}

/** The usage report of every key of an organisation, for its signed-in owners and developers. */
export function buildOrganisationUsageReport(
  repo: UsageRepo,
  organisation: { id: number; name: string },
  query: UsageQuery,
  now: Date,
): OrganisationUsageReport {
  return { organisation, ...summarise(repo, { organisationId: organisation.id }, query, now) };
}

function summarise(
  repo: UsageRepo,
  scope: number | { organisationId: number },
  query: UsageQuery,
  now: Date,
): Omit<UsageReport, 'key'> {
  const { from, to } = resolveSpan(query, now);
  // Both reads in one transaction, so that a flush between them cannot make the errors disagree.
  const { rows, statuses } = repo.read(() => ({
    rows: repo.groups(scope, from, to, query.groupBy),
    statuses: repo.errorStatuses(scope, from, to, query.groupBy),
  }));
  const byGroup = new Map<string, UsageStatusCount[]>();
  const totalByStatus = new Map<number, number>();
  for (const { group, status, answers } of statuses) {
    const list = byGroup.get(group) ?? [];
    list.push({ status, answers });
    byGroup.set(group, list);
    totalByStatus.set(status, (totalByStatus.get(status) ?? 0) + answers);
  }
  const total = { requests: 0, calculations: 0, clientErrors: 0, serverErrors: 0, rateLimited: 0, bytes: 0 };
  let totalDurationMs = 0;
  let maxDurationMs = 0;
  for (const row of rows) {
    total.requests += row.requests;
    total.calculations += row.calculations;
    total.clientErrors += row.clientErrors;
    total.serverErrors += row.serverErrors;
    total.rateLimited += row.rateLimited;
    total.bytes += row.bytes;
    totalDurationMs += row.totalDurationMs;
    maxDurationMs = Math.max(maxDurationMs, row.maxDurationMs);
  }
  return {
    from: from.toISOString(),
    to: to.toISOString(),
    groupBy: query.groupBy,
    groups: rows.map((row) => ({
      group: row.group,
      ...(row.keyName === null ? {} : { keyName: row.keyName }),
      ...figuresOf(row, byGroup.get(row.group) ?? []),
    })),
    total: figuresOf(
      { ...total, totalDurationMs, maxDurationMs },
      [...totalByStatus].sort(([a], [b]) => a - b).map(([status, answers]) => ({ status, answers })),
    ),
  };
}
