import type { JobRequest, JobResponse, JobTable } from './protocol.ts';

/** Endpoint a worker listens on: `self` in a browser worker, `parentPort` in Node. */
export interface ServeEndpoint {
  postMessage(message: JobResponse, transfer?: Transferable[]): void;
  addListener(handler: (message: JobRequest) => void): void;
}

/** Answers each request by running the named command from `table`; errors become failed responses. */
export function workerServe(endpoint: ServeEndpoint, table: JobTable): void {
  endpoint.addListener(async (req) => {
    const handler = table[req.cmd] as ((input: unknown) => ReturnType<JobTable[string]>) | undefined;
    if (!handler) {
      endpoint.postMessage({ id: req.id, ok: false, error: `unknown worker command "${req.cmd}"` });
      return;
    }
    try {
      const out = await handler(req.input);
      endpoint.postMessage({ id: req.id, ok: true, value: out.value }, out.transfer ?? []);
    } catch (e) {
      endpoint.postMessage({ id: req.id, ok: false, error: e instanceof Error ? e.message : String(e) });
    }
  });
}
