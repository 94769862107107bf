// A full garbage collection on request, for long runs whose garbage V8 would otherwise let pile up:
// with a high allocation rate (rows encoded and dropped frame after frame) V8 raises its heap limit
// instead of collecting, and the process's memory grows with the number of frames though nothing is
// kept. Collecting every few hundred frames keeps it flat (test/bench/resultsMemory.bench.ts).
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

let gc: (() => void) | null = null;

/** Runs a full garbage collection. */
export function heapTrim(): void {
  if (!gc) {
    setFlagsFromString('--expose-gc');
    gc = runInNewContext('gc') as () => void;
  }
  gc();
}
