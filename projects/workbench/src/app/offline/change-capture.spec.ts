import { describe, expect, it } from 'vitest';
import { aJob } from '../jobs/jobs-testing';
import type { JobCorrection } from '../jobs/jobs.api';
import { captureChange } from './change-capture';

describe('captureChange', () => {
  const job = aJob({ corrections: [{ id: 41, sequence: 2 } as JobCorrection] });

  it('reads each step’s change from the call the step makes, sending nothing', () => {
    expect(captureChange((api, id, etag) => api.acknowledgeSafety(id, ['lockout'], etag), job)).toEqual({
      kind: 'acknowledge-safety',
      body: { topicIds: ['lockout'] },
    });
    expect(captureChange((api, id, etag) => api.computeCorrection(id, 'one-run', etag), job)).toEqual({
      kind: 'compute-correction',
      body: { method: 'one-run' },
    });
    const run = { kind: 'initial' as const, readings: [] };
    expect(captureChange((api, id, etag) => api.addRun(id, run, etag), job)).toEqual({
      kind: 'add-run',
      body: run,
    });
  });

  it('names the correction of the installed weights by its sequence, which a device-computed one has too', () => {
    const weights = {
      weights: [{ planeIndex: 0, massGrams: 12, angleDeg: 30, radiusMm: 210, fixing: 'welded' as const }],
    };
    expect(captureChange((api, id, etag) => api.recordInstalled(id, 41, weights, etag), job)).toEqual({
      kind: 'record-installed',
      correctionSequence: 2,
      body: weights,
    });
    expect(captureChange((api, id, etag) => api.recordInstalled(id, 999, weights, etag), job)).toBeNull();
  });

  it('answers null for a change that needs the server', () => {
    expect(captureChange((api, id, etag) => api.complete(id, etag), job)).toBeNull();
    expect(captureChange((api, id, etag) => api.abandon(id, 'Rain', etag), job)).toBeNull();
  });
});
