// Measuring helpers for the fuzz tests: a call's wall time and what it threw, peak memory growth,
// and an error message reduced to its kind so distinct messages can be counted.

/** Returns the call's value (undefined if it threw), its wall time in ms, and what it threw. */
export function callTimed<T>(f: () => T): { value: T | undefined; ms: number; thrown: string } {
  const t0 = performance.now();
  try {
    const value = f();
    return { value, ms: performance.now() - t0, thrown: '' };
  } catch (e) {
    return { value: undefined, ms: performance.now() - t0, thrown: String((e as Error)?.stack ?? e) };
  }
}

/**
 * Returns a watcher of this process's memory: `sample()` after each call records the resident size,
 * `growth()` is the largest rise in bytes over the start, from those samples and from the kernel's
 * peak resident size (which also sees peaks inside a call).
 */
export function memoryWatch(): { sample: () => void; growth: () => number } {
  const rss0 = process.memoryUsage().rss;
  const peak0 = process.resourceUsage().maxRSS * 1024;
  let high = rss0;
  return {
    sample: () => void (high = Math.max(high, process.memoryUsage().rss)),
    growth: () => Math.max(high - rss0, process.resourceUsage().maxRSS * 1024 - Math.max(peak0, rss0)),
  };
}

/** Returns the kind of an error message: file name, numbers, quoted text, colours and chunk names replaced. */
export function errorClass(message: string): string {
  return message
    .replace(/^[^:]*: /, '')
    .replace(/#[0-9a-f]{6}/g, '#RRGGBB')
    .replace(/"[^"]*"/g, '"…"')
    .replace(/\d[\d,]*/g, 'N')
    .replace(/its [A-Za-z]{4} chunk/g, 'its XXXX chunk');
}
