import { portDeathCreate } from './portDeath.ts';
import type { JobRequest, JobResponse, WorkerPort } from './protocol.ts';

/** Returns a WorkerPort over a browser Worker made by `make` (so Vite can see `new Worker(new URL(...))`). */
export function browserPortCreate(make: () => Worker): WorkerPort {
  const worker = make();
  const death = portDeathCreate();
  worker.addEventListener('error', (e) => {
    e.preventDefault();
    death.die(e.message || 'the worker failed to load or crashed');
  });
  worker.addEventListener('messageerror', () => death.die('a message could not be read'));
  return {
    postMessage: (m: JobRequest, transfer?: Transferable[]) => worker.postMessage(m, transfer ?? []),
    onMessage: (h: (m: JobResponse) => void) => worker.addEventListener('message', (e: MessageEvent<JobResponse>) => h(e.data)),
    onDeath: death.onDeath,
    terminate: () => {
      death.silence();
      worker.terminate();
    },
  };
}

/** Returns the serve endpoint of the current browser worker (`self`). */
export function selfEndpoint() {
  // Typed by hand: the DOM and WebWorker libs cannot both be in one program.
  const scope = self as unknown as {
    postMessage(m: JobResponse, transfer: Transferable[]): void;
    addEventListener(type: 'message', h: (e: MessageEvent<JobRequest>) => void): void;
  };
  return {
    postMessage: (m: JobResponse, transfer?: Transferable[]) => scope.postMessage(m, transfer ?? []),
    addListener: (h: (m: JobRequest) => void) => scope.addEventListener('message', (e: MessageEvent<JobRequest>) => h(e.data)),
  };
}
