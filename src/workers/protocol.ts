/** A request to a worker: which command, with what input. */
export interface JobRequest {
  id: number;
  cmd: string;
  input: unknown;
}

/** A worker's answer to one request. */
export type JobResponse = { id: number; ok: true; value: unknown } | { id: number; ok: false; error: string };

/** What a command handler returns: the value to send back and the buffers to move with it. */
export interface JobOutput<T = unknown> {
  value: T;
  transfer?: Transferable[];
}

/** A command table: command name → handler. Handlers throw only on a programming error. */
export type JobTable = Record<string, (input: never) => JobOutput | Promise<JobOutput>>;

/** The input a job table's command takes. */
export type JobInput<Jobs extends JobTable, K extends keyof Jobs> = Parameters<Jobs[K]>[0];

/** The value a job table's command answers with. */
export type JobValue<Jobs extends JobTable, K extends keyof Jobs> = Awaited<ReturnType<Jobs[K]>>['value'];

/** The minimal worker surface the pool needs (a browser Worker or an adapted Node worker_thread). */
export interface WorkerPort {
  postMessage(message: JobRequest, transfer?: Transferable[]): void;
  onMessage(handler: (message: JobResponse) => void): void;
  /** Called once when the worker dies (uncaught error or exit); `reason` says why. */
  onDeath(handler: (reason: string) => void): void;
  terminate(): void;
}

/** Returns the list of ArrayBuffers under typed arrays, deduplicated, for a transfer list. */
export function buffersOf(...arrays: (ArrayBufferView | null | undefined)[]): ArrayBuffer[] {
  const seen = new Set<ArrayBuffer>();
  for (const a of arrays) if (a && a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  return [...seen];
}
