import { computed, inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, type ParamMap, type Params, Router } from '@angular/router';
import { DEFAULT_PAGE_SIZE, PAGE_SIZES } from '../records/list-query';
import type { JobListFilters, JobStatus } from './jobs.api';

/** The states the list filters by, in the order of a job's life. */
export const JOB_STATUS_FILTERS: readonly JobStatus[] = ['open', 'on-hold', 'completed', 'abandoned'];

/** What the jobs list shows: its filters and page, as the address holds them. */
export interface JobsQueryState {
  readonly status: JobStatus | null;
  readonly technicianId: number | null;
  readonly customerId: number | null;
  /** Scheduled on or after (YYYY-MM-DD), or ''. */
  readonly from: string;
  /** Scheduled on or before (YYYY-MM-DD), or ''. */
  readonly to: string;
  /** From 1, as the server counts. */
  readonly page: number;
  readonly pageSize: number;
}

const DATE = /^\d{4}-\d{2}-\d{2}$/;

function positiveWhole(text: string | null, max: number): number | null {
  if (text === null || !/^\d+$/.test(text)) return null;
  const value = Number(text);
  return value >= 1 && value <= max ? value : null;
}

/** The jobs list's query from the address; a value the server would refuse falls back to its default. */
export function readJobsQuery(params: ParamMap): JobsQueryState {
  const status = params.get('status') as JobStatus | null;
  const pageSize = positiveWhole(params.get('pageSize'), 100);
  const date = (name: string) => {
    const value = params.get(name) ?? '';
    return DATE.test(value) ? value : '';
  };
  return {
    status: status !== null && JOB_STATUS_FILTERS.includes(status) ? status : null,
    technicianId: positiveWhole(params.get('technicianId'), Number.MAX_SAFE_INTEGER),
    customerId: positiveWhole(params.get('customerId'), Number.MAX_SAFE_INTEGER),
    from: date('from'),
    to: date('to'),
    page: positiveWhole(params.get('page'), 100_000) ?? 1,
    pageSize: pageSize !== null && PAGE_SIZES.includes(pageSize) ? pageSize : DEFAULT_PAGE_SIZE,
  };
}

/** The address's query string for the list: what is not set is left out, so that links stay short. */
export function jobsQueryParams(state: JobsQueryState): Params {
  return {
    status: state.status,
    technicianId: state.technicianId,
    customerId: state.customerId,
    from: state.from || null,
    to: state.to || null,
    page: state.page === 1 ? null : state.page,
    pageSize: state.pageSize === DEFAULT_PAGE_SIZE ? null : state.pageSize,
  };
}

/** The query as the jobs route takes it: only the filters that are set. */
export function jobsApiQuery(state: JobsQueryState): JobListFilters {
  return {
    ...(state.status ? { status: state.status } : {}),
    ...(state.technicianId ? { technicianId: state.technicianId } : {}),
    ...(state.customerId ? { customerId: state.customerId } : {}),
    ...(state.from ? { from: state.from } : {}),
    ...(state.to ? { to: state.to } : {}),
    page: state.page,
    pageSize: state.pageSize,
  };
}

/** Whether any filter narrows the list. */
export function jobsFiltered(state: JobsQueryState): boolean {
  return (
    state.status !== null ||
    state.technicianId !== null ||
    state.customerId !== null ||
    state.from !== '' ||
    state.to !== ''
  );
}

/** The jobs list's query, read from the address and written back to it. */
export interface JobsQuery {
  readonly state: Signal<JobsQueryState>;
  /** Shows another part of the list; a new filter starts again at the first page. */
  change(change: Partial<JobsQueryState>): void;
}

/** The query of the jobs page it is called in (an injection context), kept in the address. */
export function jobsQuery(): JobsQuery {
  const route = inject(ActivatedRoute);
  const router = inject(Router);
  const params = toSignal(route.queryParamMap, { requireSync: true });
  const state = computed(() => readJobsQuery(params()), {
    equal: (a, b) => JSON.stringify(a) === JSON.stringify(b),
  });
  return {
    state,
    change(change) {
      const current = state();
      const startAgain = Object.keys(change).some((key) => key !== 'page' && key !== 'pageSize');
      const next: JobsQueryState = {
        ...current,
        ...change,
        page: change.page ?? (startAgain || change.pageSize !== undefined ? 1 : current.page),
      };
      void router.navigate([], { relativeTo: route, queryParams: jobsQueryParams(next) });
    },
  };
}
