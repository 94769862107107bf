import type { JobInput, JobRequest, JobResponse, JobTable, JobValue, WorkerPort } from './protocol.ts';

/** Raised for a job whose batch was cancelled before it finished. */
export class JobCancelled extends Error {
  constructor() {
    super('cancelled');
    this.name = 'JobCancelled';
  }
}

/** Time every job gets, whatever its size: a frame takes well under a second, so this is generous. */
export const JOB_DEADLINE_BASE_MS = 30_000;
/** Time added per pixel of a job's frame (10 µs: 21 s more at 2048×1024, 1,000 s at the 100-megapixel limit). */
export const JOB_DEADLINE_PER_PIXEL_MS = 0.01;

/**
 * Most pixels a pool of scoring workers (a page's, or the headless scorer's) holds at once. Scoring takes about 20 bytes per pixel
 * (measured: peak memory of the headless scorer, 185 MB at 1024×512 and 344 MB at 4096×2048, two
 * runs), so 64 megapixels keep the frames in flight near 1.3 GB however many cores there are.
 */
export const SCORE_PIXEL_BUDGET = 64e6;

/** Returns the watchdog deadline of a job over `pixels` pixels, ms. */
export function jobDeadlineMs(pixels: number): number {
  return JOB_DEADLINE_BASE_MS + JOB_DEADLINE_PER_PIXEL_MS * Math.max(0, pixels);
}

/** Options of a pool: how big each job is, and the watchdog and memory limits that follow from it. */
export interface WorkerPoolOptions {
  /** Returns the pixels of a job's frame (e.g. from its PNG header), or null when unknown. */
  jobPixels?: (cmd: string, input: unknown) => number | null | Promise<number | null>;
  /** Returns a job's watchdog deadline from its pixels (null: unknown), ms; jobDeadlineMs by default. */
  deadlineMs?: (pixels: number | null) => number;
  /**
   * Most pixels the running jobs of this pool may hold together; a job that would pass it waits until
   * others finish (one job always runs, however large). Infinity by default.
   */
  pixelBudget?: number;
}

interface Pending {
  req: JobRequest;
  transfer: Transferable[];
  batch: number;
  resolve: (v: unknown) => void;
  reject: (e: Error) => void;
  /** The job's pixels once known (undefined while being worked out). */
  pixels: number | null | undefined;
}

interface Slot {
  port: WorkerPort;
  job: Pending | null;
  timer: ReturnType<typeof setTimeout> | null;
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
  /** Number of jobs running in a worker now. */
  running(): number;
  size: number;
  /** How many workers have died and been replaced since the pool started. */
  restarts(): number;
  destroy(): void;
}

/**
 * Returns a pool of `size` workers made by `spawn`, each serving the job table typed `Jobs`. A worker
 * that dies fails its current job with a clear message, is replaced, and the queue goes on. A watchdog
 * gives each job a deadline scaled to its pixels: a worker that is stuck (a busy loop), has closed
 * itself or has stopped answering is terminated and replaced, and its job fails saying so. Running
 * jobs together hold at most `pixelBudget` pixels. Cancelled running jobs are left to finish in their
 * worker (a frame takes tens of milliseconds) and their answers are dropped.
 */
export function workerPoolCreate<Jobs extends JobTable>(spawn: () => WorkerPort, size: number, options: WorkerPoolOptions = {}): WorkerPool<Jobs> {
  const deadlineOf = options.deadlineMs ?? ((px: number | null) => jobDeadlineMs(px ?? 0));
  const budget = options.pixelBudget ?? Infinity;
  const queue: Pending[] = [];
  const slots: Slot[] = [];
  let nextId = 1;
  let batch = 0;
  let restarts = 0;
  let destroyed = false;

  /** Ends the slot's job (if any), terminates its worker and starts a fresh one; the job fails with `message`. */
  function slotReplace(index: number, slot: Slot, message: string): void {
    const job = slot.job;
    slot.job = null;
    if (slot.timer) clearTimeout(slot.timer);
    slot.port.terminate();
    restarts++;
    slotStart(index);
    if (job) job.reject(job.batch !== batch ? new JobCancelled() : new Error(message));
    pump();
  }

  function slotStart(index: number): void {
    const port = spawn();
    const slot: Slot = { port, job: null, timer: null };
    slots[index] = slot;
    port.onMessage((msg: JobResponse) => {
      const job = slot.job;
      if (!job || job.req.id !== msg.id) return;
      slot.job = null;
      if (slot.timer) clearTimeout(slot.timer);
      if (job.batch !== batch) job.reject(new JobCancelled());
      else if (msg.ok) job.resolve(msg.value);
      else job.reject(new Error(msg.error));
      pump();
    });
    port.onDeath((reason) => {
      if (destroyed || slots[index] !== slot) return;
      slotReplace(index, slot, `the worker stopped while running this job (${reason})`);
    });
  }

  const running = () => slots.reduce((n, s) => n + (s.job?.pixels ?? 0), 0);

  function pump(): void {
    if (destroyed) return;
    for (let index = 0; index < slots.length; index++) {
      const slot = slots[index];
      if (slot.job || queue.length === 0) continue;
      // First in, first out: the head waits until its size is known and it fits the budget.
      const job = queue[0];
      if (job.pixels === undefined) return;
      const busy = slots.some((s) => s.job);
      if (busy && running() + (job.pixels ?? 0) > budget) return;
      queue.shift();
      slot.job = job;
      const ms = deadlineOf(job.pixels);
      slot.timer = setTimeout(() => {
        if (destroyed || slots[index] !== slot || slot.job !== job) return;
        const what = job.pixels ? `${(job.pixels / 1e6).toFixed(1)}-megapixel ` : '';
        slotReplace(index, slot, `the worker did not finish this ${what}job within ${Math.round(ms / 1000)} s (stuck, or it closed itself); it was stopped and replaced`);
      }, ms);
      slot.port.postMessage(job.req, job.transfer);
    }
  }

  for (let i = 0; i < size; i++) slotStart(i);

  return {
    size,
    run<K extends keyof Jobs & string>(cmd: K, input: JobInput<Jobs, K>, transfer: Transferable[] = []): Promise<JobValue<Jobs, K>> {
      if (destroyed) return Promise.reject(new Error('worker pool was shut down'));
      return new Promise<JobValue<Jobs, K>>((resolve, reject) => {
        const job: Pending = { req: { id: nextId++, cmd, input }, transfer, batch, resolve: resolve as (v: unknown) => void, reject, pixels: null };
        queue.push(job);
        if (options.jobPixels) {
          job.pixels = undefined;
          // A size that cannot be worked out is unknown: the job gets the base deadline and counts as 0 pixels.
          const known = (px: number | null) => {
            job.pixels = px !== null && Number.isFinite(px) && px >= 0 ? px : null;
            pump();
          };
          Promise.resolve()
            .then(() => options.jobPixels!(cmd, input))
            .then(known, () => known(null));
        } else pump();
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
    running: () => slots.filter((s) => s.job).length,
    restarts: () => restarts,
    destroy() {
      destroyed = true;
      for (const job of queue.splice(0)) job.reject(new JobCancelled());
      for (const s of slots) {
        if (s.timer) clearTimeout(s.timer);
        s.job?.reject(new JobCancelled());
        s.port.terminate();
      }
    },
  };
}
