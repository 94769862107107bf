import { Worker } from 'node:worker_threads';
import type { JobRequest, JobResponse, WorkerPort } from '../workers/protocol.ts';

const BOOT = new URL('./threadBoot.mjs', import.meta.url);

/** Returns a WorkerPort over a Node worker thread running the TypeScript module `entry`. */
export function threadPortCreate(entry: URL, options: { resourceLimitsMb?: number } = {}): WorkerPort {
  const worker = new Worker(BOOT, {
    workerData: { entry: entry.href },
    resourceLimits: options.resourceLimitsMb ? { maxOldGenerationSizeMb: options.resourceLimitsMb } : undefined,
  });
  let dead = false;
  const deathHandlers: ((reason: string) => void)[] = [];
  const die = (reason: string) => {
    if (dead) return;
    dead = true;
    for (const h of deathHandlers) h(reason);
  };
  worker.on('error', (e) => die(e instanceof Error ? e.message : String(e)));
  worker.on('exit', (code) => die(`exit code ${code}`));
  worker.unref();
  return {
    postMessage: (m: JobRequest, transfer?: Transferable[]) => worker.postMessage(m, (transfer ?? []) as never),
    onMessage: (h: (m: JobResponse) => void) => void worker.on('message', h),
    onDeath: (h) => void deathHandlers.push(h),
    terminate: () => {
      dead = true;
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
