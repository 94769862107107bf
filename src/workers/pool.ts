import type { JobInput, JobRequest, JobResponse, JobTable, JobValue, WorkerPort } from './protocol.ts';

/** Raised for a job whose batch was cancelled before it finished. */
export class JobCancelled extends Error {
  constructor() {
    super('cancelled');
    this.name = 'JobCancelled';
  }
}

interface Pending {
  req: JobRequest;
  transfer: Transferable[];
  batch: number;
  resolve: (v: unknown) => void;
  reject: (e: Error) => void;
}

interface Slot {
  port: WorkerPort;
  job: Pending | null;
}

/**
 * A fixed-size pool of workers running queued jobs first-in first-out; `Jobs` is the type of the job
 * table its workers serve, so `run` knows each command's input and value.
 */
export interface WorkerPool<Jobs extends JobTable> {
  /** Queues a command; resolves with the worker's value, rejects with its error or JobCancelled. */
  run<K extends keyof Jobs & string>(cmd: K, input: JobInput<Jobs, K>, transfer?: Transferable[]): Promise<JobValue<Jobs, K>>;
  /** Rejects every queued and running job of the current batch with JobCancelled; later jobs run normally. */
  cancelAll(): void;
  /** Number of jobs queued or running. */
  pending(): number;
  size: number;
  /** How many workers have died and been replaced since the pool started. */
  restarts(): number;
  destroy(): void;
}

/**
 * Returns a pool of `size` workers made by `spawn`, each serving the job table typed `Jobs`. A worker that dies fails its current job with a
 * clear message, is replaced, and the queue goes on. Cancelled running jobs are left to finish in
 * their worker (a frame takes tens of milliseconds) and their answers are dropped.
 */
export function workerPoolCreate<Jobs extends JobTable>(spawn: () => WorkerPort, size: number): WorkerPool<Jobs> {
  const queue: Pending[] = [];
  const slots: Slot[] = [];
  let nextId = 1;
  let batch = 0;
  let restarts = 0;
  let destroyed = false;

  function slotStart(index: number): void {
    const port = spawn();
    const slot: Slot = { port, job: null };
    slots[index] = slot;
    port.onMessage((msg: JobResponse) => {
      const job = slot.job;
      if (!job || job.req.id !== msg.id) return;
      slot.job = null;
      if (job.batch !== batch) job.reject(new JobCancelled());
      else if (msg.ok) job.resolve(msg.value);
      else job.reject(new Error(msg.error));
      pump();
    });
    port.onDeath((reason) => {
      if (destroyed || slots[index] !== slot) return;
      const job = slot.job;
      slot.job = null;
      port.terminate();
      restarts++;
      slotStart(index);
      if (job) job.reject(job.batch !== batch ? new JobCancelled() : new Error(`the worker stopped while running this job (${reason})`));
      pump();
    });
  }

  function pump(): void {
    for (const slot of slots) {
      if (slot.job || queue.length === 0) continue;
      const job = queue.shift()!;
      slot.job = job;
      slot.port.postMessage(job.req, job.transfer);
    }
  }

  for (let i = 0; i < size; i++) slotStart(i);

  return {
    size,
    run<K extends keyof Jobs & string>(cmd: K, input: JobInput<Jobs, K>, transfer: Transferable[] = []): Promise<JobValue<Jobs, K>> {
      if (destroyed) return Promise.reject(new Error('worker pool was shut down'));
      return new Promise<JobValue<Jobs, K>>((resolve, reject) => {
        queue.push({ req: { id: nextId++, cmd, input }, transfer, batch, resolve: resolve as (v: unknown) => void, reject });
        pump();
      });
    },
    cancelAll() {
      batch++;
      const dropped = queue.splice(0, queue.length);
      for (const job of dropped) job.reject(new JobCancelled());
      // Running jobs keep their worker busy until it answers; their promises settle now.
      for (const s of slots) s.job?.reject(new JobCancelled());
    },
    pending: () => queue.length + slots.filter((s) => s.job).length,
    restarts: () => restarts,
    destroy() {
      destroyed = true;
      for (const job of queue.splice(0)) job.reject(new JobCancelled());
      for (const s of slots) {
        s.job?.reject(new JobCancelled());
        s.port.terminate();
      }
    },
  };
}
