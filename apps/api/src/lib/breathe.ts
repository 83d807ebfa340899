/**
 * Lets timers and I/O (other requests) run before a long piece of work goes on: the API serves
 * everything on one event loop, and rebuilding a 200,000-part catalogue's caches in one stretch
 * would stall every request for seconds.
 */
export const breathe = (): Promise<void> => new Promise<void>((resolve) => setImmediate(resolve));
