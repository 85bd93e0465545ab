/**
 * Resolves once the browser has painted its next frame: a timer set from `requestAnimationFrame` runs after
 * that frame's paint. A hidden tab paints no frames, so the promise resolves after `fallbackMs` regardless.
 */
export function afterNextPaint(fallbackMs = 500): Promise<void> {
  return new Promise((resolve) => {
    const fallback = setTimeout(resolve, fallbackMs);
    requestAnimationFrame(() =>
      setTimeout(() => {
        clearTimeout(fallback);
        resolve();
      }),
    );
  });
}
