// A browser worker for the pool watchdog test: answers, spins forever, or closes itself on request.
import { selfEndpoint } from '../../../src/workers/browserPort.ts';
import type { JobOutput } from '../../../src/workers/protocol.ts';
import { workerServe } from '../../../src/workers/serve.ts';

const poolTestJobs = {
  echo: (input: { value: number }): JobOutput<number> => ({ value: input.value * 2 }),
  /** A busy loop: the worker never answers again (and cannot be told to stop). */
  spin: (): JobOutput<never> => {
    for (;;);
  },
  /** Closes the worker from inside, as `self.close()` in a bad job would: no error event follows. */
  close: (): Promise<JobOutput<never>> => {
    (self as unknown as { close(): void }).close();
    return new Promise(() => {});
  },
};

export type PoolTestJobs = typeof poolTestJobs;

workerServe(selfEndpoint(), poolTestJobs);
