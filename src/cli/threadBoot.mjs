// Entry of every Node worker thread: lets the thread load the TypeScript sources directly, then runs
// the module named in workerData.entry.
import { register } from 'tsx/esm/api';
import { workerData } from 'node:worker_threads';

register();
await import(workerData.entry);
