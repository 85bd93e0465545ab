import { describe, expect, it } from 'vitest';
import { USAGE_BY_DAY } from './keys-testing';
import {
  bytesText,
  errorsText,
  groupLabel,
  statusLabel,
  usageLines,
  usageSeries,
  usageSummary,
} from './usage-model';

const SPAN = { from: '2026-05-01', to: '2026-05-07', groupBy: 'day' as const };

describe('the usage model', () => {
  it('gives every day of the span a line, days without requests at zero', () => {
    const lines = usageLines(USAGE_BY_DAY, SPAN);
    expect(lines.map((line) => [line.label, line.requests, line.calculations, line.errors])).toEqual([
      ['1 May', 0, 0, 0],
      ['2 May', 12, 12, 0],
      ['3 May', 0, 0, 0],
      ['4 May', 20, 24, 3],
      ['5 May', 0, 0, 0],
      ['6 May', 8, 8, 2],
      ['7 May', 0, 0, 0],
    ]);
    expect(usageSeries(lines)).toEqual({
      labels: ['1 May', '2 May', '3 May', '4 May', '5 May', '6 May', '7 May'],
      requests: [0, 12, 0, 20, 0, 8, 0],
      calculations: [0, 12, 0, 24, 0, 8, 0],
      errors: [0, 0, 0, 3, 0, 2, 0],
    });
  });

  it('keeps the report’s own lines by route and by key, and names them for people', () => {
    const byRoute = {
      ...USAGE_BY_DAY,
      groupBy: 'route' as const,
      groups: [{ ...USAGE_BY_DAY.groups[1]!, group: 'POST /api/v1/calc/single-plane' }],
    };
    expect(usageLines(byRoute, { ...SPAN, groupBy: 'route' }).map((line) => line.label)).toEqual([
      'POST calc/single-plane',
    ]);
    expect(groupLabel('key', { group: 'cpk_Q2xvY2s5', keyName: 'Dealer portal' })).toBe(
      'Dealer portal (cpk_Q2xvY2s5…)',
    );
  });

  it('writes errors, sizes and statuses in words', () => {
    expect(errorsText([])).toBe('None');
    expect(
      errorsText([
        { status: 400, answers: 2 },
        { status: 429, answers: 1 },
      ]),
    ).toBe('3: 400 Bad request ×2, 429 Over the limit ×1');
    expect(statusLabel(418)).toBe('418 Client error');
    expect(statusLabel(502)).toBe('502 Server error');
    expect([bytesText(980), bytesText(12_400), bytesText(3_100_000)]).toEqual(['980 B', '12.4 kB', '3.1 MB']);
  });

  it('sums the chart up in one sentence, its name for assistive technology', () => {
    const lines = usageLines(USAGE_BY_DAY, SPAN);
    expect(usageSummary(USAGE_BY_DAY, lines)).toBe(
      'Requests, calculations and errors by day: 40 requests, 44 calculations and 5 errors in all; ' +
        'the busiest day is 4 May.',
    );
    const empty = {
      ...USAGE_BY_DAY,
      groups: [],
      total: { ...USAGE_BY_DAY.total, requests: 0, calculations: 0 },
    };
    expect(usageSummary(empty, [])).toBe('Requests, calculations and errors by day: none in this span.');
  });
});
