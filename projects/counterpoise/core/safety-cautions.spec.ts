import { describe, expect, it } from 'vitest';
import { JOB_SAFETY_TOPICS } from '@counterpoise/api';
import { SAFETY_CAUTIONS, SAFETY_TOPICS, cautionsFor } from './safety-cautions';

describe('SAFETY_TOPICS', () => {
  it('are the topics a balancing job acknowledges on the server, in the same order', () => {
    // The library repeats them rather than import @counterpoise/api at run time (zod would come with it).
    expect(SAFETY_TOPICS).toEqual(JOB_SAFETY_TOPICS);
  });
});

describe('cautionsFor', () => {
  it('gives every caution when no topic is asked for', () => {
    expect(cautionsFor()).toBe(SAFETY_CAUTIONS);
    expect(cautionsFor([])).toBe(SAFETY_CAUTIONS);
  });

  it('keeps job order and only the topics asked for', () => {
    const titles = cautionsFor(['weights', 'lockout']).map((caution) => caution.title);
    expect(titles).toEqual(['Lock out and tag out', 'Check every weight before the run']);
  });

  it('has at least one caution for every topic', () => {
    for (const topic of SAFETY_TOPICS) expect(cautionsFor([topic]).length).toBeGreaterThan(0);
  });
});
