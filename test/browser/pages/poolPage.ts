// Test page for the worker pool's watchdog in Chromium: a pool of real browser workers (the same
// browserPort the app's scoring pool uses) with a short deadline. Driven by test/browser/pool.test.ts.
import { browserPortCreate } from '../../../src/workers/browserPort.ts';
import { workerPoolCreate } from '../../../src/workers/pool.ts';
import type { PoolTestJobs } from './poolTestWorker.ts';

const pool = workerPoolCreate<PoolTestJobs>(
  () => browserPortCreate(() => new Worker(new URL('./poolTestWorker.ts', import.meta.url), { type: 'module' })),
  2,
  { deadlineMs: () => 2000 },
);

(window as unknown as { hl: Record<string, (...a: never[]) => unknown> }).hl = {
  /** Runs the commands at once; returns each outcome as a value or "error: <message>", and the restarts. */
  runAll: async (cmds: string[]) => {
    const settled = await Promise.allSettled(cmds.map((c, i) => pool.run(c as 'echo', { value: i })));
    return { outcomes: settled.map((s) => (s.status === 'fulfilled' ? s.value : `error: ${(s.reason as Error).message}`)), restarts: pool.restarts() };
  },
};
document.title = 'pool test page ready';
