import { Worker } from 'node:worker_threads';
import { portDeathCreate } from '../workers/portDeath.ts';
import type { JobRequest, JobResponse, WorkerPort } from '../workers/protocol.ts';

const BOOT = new URL('./threadBoot.mjs', import.meta.url);

/** Returns a WorkerPort over a Node worker thread running the TypeScript module `entry`. */
export function threadPortCreate(entry: URL, options: { resourceLimitsMb?: number } = {}): WorkerPort {
  const worker = new Worker(BOOT, {
    workerData: { entry: entry.href },
    resourceLimits: options.resourceLimitsMb ? { maxOldGenerationSizeMb: options.resourceLimitsMb } : undefined,
  });
  const death = portDeathCreate();
  worker.on('error', (e) => death.die(e instanceof Error ? e.message : String(e)));
  worker.on('exit', (code) => death.die(`exit code ${code}`));
  worker.unref();
  return {
    postMessage: (m: JobRequest, transfer?: Transferable[]) => worker.postMessage(m, (transfer ?? []) as never),
    onMessage: (h: (m: JobResponse) => void) => void worker.on('message', h),
    onDeath: death.onDeath,
    terminate: () => {
      death.silence();
      void worker.terminate();
    },
  };
}

/** Returns the serve endpoint of the current Node worker thread. */
export async function threadEndpoint() {
  const { parentPort } = await import('node:worker_threads');
  if (!parentPort) throw new Error('not running in a worker thread');
  return {
    postMessage: (m: JobResponse, transfer?: Transferable[]) => parentPort.postMessage(m, (transfer ?? []) as never),
    addListener: (h: (m: JobRequest) => void) => void parentPort.on('message', h),
  };
}
