import { describe, expect, it } from 'vitest';
import { convertedJobs, dayValue, historySeries, historySummary } from './history-chart-model';
import { aHistory, aHistoryJob, MM_S_RMS_PER_IN_S_PK } from './machine-history-testing';

describe('the history chart’s model', () => {
  it('draws each side before and after over the jobs’ days, in the history’s unit, and one shared limit', () => {
    const series = historySeries(aHistory());
    expect(series.map((one) => one.label)).toEqual([
      'Left before',
      'Left after',
      'Right before',
      'Right after',
      'Acceptance limit',
    ]);
    const leftBefore = series[0]!;
    expect(leftBefore.points.map((point) => point.jobId)).toEqual([18, 42, 57]);
    expect(leftBefore.points[0]!.x).toBe(Date.UTC(2025, 5, 10));
    // The job read in mm/s RMS is drawn in in/s peak.
    expect(leftBefore.points[0]!.y).toBeCloseTo(9.9 / MM_S_RMS_PER_IN_S_PK, 9);
    // The job begun has no after point.
    expect(series[1]!.points.map((point) => point.jobId)).toEqual([18, 42]);
    const limit = series[4]!;
    expect(limit.side).toBeNull();
    expect(limit.points.map((point) => point.jobId)).toEqual([18, 42, 57]);
    for (const point of limit.points) expect(point.y).toBeCloseTo(0.15, 9);
  });

  it('draws a limit per side when the sides’ limits differ (a balance grade)', () => {
    const job = aHistoryJob();
    const history = aHistory({
      jobs: [
        {
          ...job,
          sides: job.sides.map((side, index) => ({
            ...side,
            limit: index === 0 ? 0.1 : 0.2,
            inHistoryUnit: { ...side.inHistoryUnit, limit: index === 0 ? 0.1 : 0.2 },
          })),
        },
      ],
    });
    const limits = historySeries(history).filter((one) => one.stage === 'limit');
    expect(limits.map((one) => [one.label, one.points[0]!.y])).toEqual([
      ['Left acceptance limit', 0.1],
      ['Right acceptance limit', 0.2],
    ]);
  });

  it('leaves out the sides and lines a machine never read', () => {
    const job = aHistoryJob();
    const history = aHistory({
      jobs: [
        {
          ...job,
          sides: [
            { ...job.sides[0]!, limit: null, inHistoryUnit: { ...job.sides[0]!.inHistoryUnit, limit: null } },
          ],
        },
      ],
    });
    expect(historySeries(history).map((one) => one.key)).toEqual(['left-before', 'left-after']);
    expect(historySeries(aHistory({ jobs: [], unit: null }))).toEqual([]);
  });

  it('names the jobs drawn converted from another unit', () => {
    expect(convertedJobs(aHistory()).map((job) => job.id)).toEqual([18]);
  });

  it('sums the chart up in words: the span, the latest job and the limit', () => {
    expect(historySummary(aHistory())).toBe(
      'Amplitude before and after balancing, in in/s peak, for 3 jobs, from 10 Jun 2025 to 30 Nov 2026. ' +
        'Latest job (no. 57, 30 Nov 2026): left side 0.24 before, no reading after yet; right side 0.21 ' +
        'before, no reading after yet; acceptance limit 0.15. The table below gives every figure.',
    );
    expect(historySummary(aHistory({ jobs: [], unit: null }))).toBe('No readings yet: the chart is empty.');
    expect(dayValue('2026-04-14')).toBe(Date.UTC(2026, 3, 14));
  });
});
