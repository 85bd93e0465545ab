import { convertToParamMap } from '@angular/router';
import { MAX_USAGE_SPAN_DAYS, USAGE_GROUPINGS as API_GROUPINGS } from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import {
  daysOf,
  lastDays,
  MAX_SPAN_DAYS,
  readUsageQuery,
  spanDays,
  spanProblem,
  USAGE_GROUPINGS,
  usageQueryParams,
} from './usage-query';

const NOW = Date.parse('2026-05-31T15:30:00Z');

describe('the usage query', () => {
  it('holds the report’s own limits', () => {
    expect(MAX_SPAN_DAYS).toBe(MAX_USAGE_SPAN_DAYS);
    expect([...USAGE_GROUPINGS]).toEqual([...API_GROUPINGS]);
  });

  it('reads a span and a grouping from the address, and writes them back the same', () => {
    const state = readUsageQuery(
      convertToParamMap({ from: '2026-05-01', to: '2026-05-07', by: 'route' }),
      NOW,
    );
    expect(state).toEqual({ from: '2026-05-01', to: '2026-05-07', groupBy: 'route' });
    expect(usageQueryParams(state)).toEqual({ from: '2026-05-01', to: '2026-05-07', by: 'route' });
  });

  it.each([
    [{}, 'nothing'],
    [{ from: '2026-05-01' }, 'no end'],
    [{ from: '2026-02-30', to: '2026-03-01' }, 'a day that does not exist'],
    [{ from: '2026-05-07', to: '2026-05-01' }, 'an end before the start'],
    [{ from: '2024-01-01', to: '2026-05-01' }, 'more than a report covers'],
    [{ from: 'yesterday', to: 'today', by: 'week' }, 'words'],
  ])('falls back to the last 30 days by day for %j (%s)', (params, what) => {
    expect(readUsageQuery(convertToParamMap(params), NOW), what).toEqual({
      from: '2026-05-02',
      to: '2026-05-31',
      groupBy: 'day',
    });
  });

  it('counts days with both ends included, and lists each', () => {
    expect(spanDays('2026-05-01', '2026-05-01')).toBe(1);
    expect(spanDays('2026-02-27', '2026-03-02')).toBe(4);
    expect(daysOf('2026-02-27', '2026-03-02')).toEqual([
      '2026-02-27',
      '2026-02-28',
      '2026-03-01',
      '2026-03-02',
    ]);
    expect(lastDays(7, NOW)).toEqual({ from: '2026-05-25', to: '2026-05-31' });
  });

  it('says what is wrong with a span a person cannot be shown', () => {
    expect(spanProblem('2026-05-01', '2026-05-31')).toBeNull();
    expect(spanProblem('', '2026-05-31')).toBe('Choose the first day.');
    expect(spanProblem('2026-05-01', '')).toBe('Choose the last day.');
    expect(spanProblem('2026-05-02', '2026-05-01')).toBe('The last day comes before the first.');
    expect(spanProblem('2024-12-31', '2026-01-01')).toMatch(/at most 366 days/);
  });
});
