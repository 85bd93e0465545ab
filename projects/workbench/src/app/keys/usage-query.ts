import { computed, inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, type ParamMap, Router } from '@angular/router';
import type { UsageGrouping } from '@counterpoise/api';

/** The ways the portal breaks usage down, as the report names them. */
export const USAGE_GROUPINGS: readonly UsageGrouping[] = ['day', 'route', 'key'];

/** The longest span a report covers (the API's `MAX_USAGE_SPAN_DAYS`; a spec holds the two equal). */
export const MAX_SPAN_DAYS = 366;

/** The span the portal shows when the address names none. */
export const DEFAULT_SPAN_DAYS = 30;

/** The ready-made spans, in days up to and including today. */
export const USAGE_PRESETS: readonly { readonly days: number; readonly label: string }[] = [
  { days: 7, label: 'Last 7 days' },
  { days: 30, label: 'Last 30 days' },
  { days: 90, label: 'Last 90 days' },
];

const DAY_MS = 86_400_000;
const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * What the portal's usage shows: whole UTC days from `from` to `to`, both included, as the report reads
 * dates (`2026-05-01`), and how they are grouped.
 */
export interface UsageQueryState {
  readonly from: string;
  readonly to: string;
  readonly groupBy: UsageGrouping;
}

/** A UTC day as the report writes it. */
export function dayOf(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** The first millisecond of a day written `2026-05-01`, or null when it is no calendar day. */
export function dayStartMs(day: string): number | null {
  const match = DAY.exec(day);
  if (!match) return null;
  const [year, month, date] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const ms = Date.UTC(year, month - 1, date);
  return dayOf(ms) === day ? ms : null;
}

/** How many days a span covers, both ends included. */
export function spanDays(from: string, to: string): number {
  return Math.round(((dayStartMs(to) ?? 0) - (dayStartMs(from) ?? 0)) / DAY_MS) + 1;
}

/** Every day of a span in order, both ends included. */
export function daysOf(from: string, to: string): string[] {
  const start = dayStartMs(from);
  const end = dayStartMs(to);
  if (start === null || end === null) return [];
  const days: string[] = [];
  for (let ms = start; ms <= end; ms += DAY_MS) days.push(dayOf(ms));
  return days;
}

/** The `days` days up to and including today (UTC). */
export function lastDays(days: number, nowMs: number): Pick<UsageQueryState, 'from' | 'to'> {
  return { from: dayOf(nowMs - (days - 1) * DAY_MS), to: dayOf(nowMs) };
}

/**
 * Why a span cannot be asked for, in words for the person, or null when it can: each end a day, the end
 * not before the start, and no longer than a report covers.
 */
export function spanProblem(from: string, to: string): string | null {
  if (dayStartMs(from) === null) return 'Choose the first day.';
  if (dayStartMs(to) === null) return 'Choose the last day.';
  const days = spanDays(from, to);
  if (days < 1) return 'The last day comes before the first.';
  if (days > MAX_SPAN_DAYS) return `A report covers at most ${MAX_SPAN_DAYS} days; choose a shorter span.`;
  return null;
}

/**
 * The query written in the address (`?from=2026-05-01&to=2026-05-31&by=route`); anything missing or not
 * valid there gives way to the last 30 days by day, so that an edited or old link still opens.
 */
export function readUsageQuery(params: ParamMap, nowMs: number): UsageQueryState {
  const by = params.get('by');
  const groupBy = USAGE_GROUPINGS.find((grouping) => grouping === by) ?? 'day';
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  const span = spanProblem(from, to) === null ? { from, to } : lastDays(DEFAULT_SPAN_DAYS, nowMs);
  return { ...span, groupBy };
}

/** The address's query for a state. */
export function usageQueryParams(state: UsageQueryState): Record<string, string> {
  return { from: state.from, to: state.to, by: state.groupBy };
}

/** The portal's usage query, read from the address and written back to it. */
export interface UsageQuery {
  readonly state: Signal<UsageQueryState>;
  change(change: Partial<UsageQueryState>): void;
}

/** The usage query of the page it is called in (an injection context), kept in the address. */
export function usageQuery(now: () => number = Date.now): UsageQuery {
  const route = inject(ActivatedRoute);
  const router = inject(Router);
  const params = toSignal(route.queryParamMap, { requireSync: true });
  const state = computed(() => readUsageQuery(params(), now()), {
    equal: (a, b) => a.from === b.from && a.to === b.to && a.groupBy === b.groupBy,
  });
  return {
    state,
    change(change) {
      const next = { ...state(), ...change };
      void router.navigate([], {
        relativeTo: route,
        queryParams: usageQueryParams(next),
        // The span and grouping are a view of the page, not a step back would undo.
        replaceUrl: true,
      });
    },
  };
}
