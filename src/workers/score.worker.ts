// Scoring worker: decodes a frame's label maps and scores them with the core engine.
import { selfEndpoint } from './browserPort.ts';
import { scoreJobs } from './scoreJobs.ts';
import { workerServe } from './serve.ts';

workerServe(selfEndpoint(), scoreJobs);
