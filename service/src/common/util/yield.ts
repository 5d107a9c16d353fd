/**
 * Long loops over thousands of rows (a logger batch, a CSV chunk) stop every this many rows and let the event
 * loop answer other requests (the live channel, the health check) before going on.
 */
export const YIELD_EVERY_ROWS = 1000;

/** Resolves after the event loop has had a turn (timers and I/O waiting run first). */
export function yieldToEventLoop(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}
