import { afterEach, describe, expect, it, vi } from 'vitest';
import { afterNextPaint } from './after-next-paint';

describe('afterNextPaint', () => {
  afterEach(() => vi.restoreAllMocks());

  it('resolves in a task after the next animation frame, not before it', async () => {
    const order: string[] = [];
    requestAnimationFrame(() => order.push('frame'));
    await afterNextPaint().then(() => order.push('after the paint'));
    expect(order).toEqual(['frame', 'after the paint']);
  });

  it('resolves on its own timer when no frame comes, as in a hidden tab', async () => {
    vi.spyOn(window, 'requestAnimationFrame').mockImplementation(() => 0);
    const started = performance.now();
    await afterNextPaint(30);
    expect(performance.now() - started).toBeGreaterThanOrEqual(25);
  });
});
