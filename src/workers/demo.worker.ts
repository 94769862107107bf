// Demo worker: generates Kestrel Quay frames as PNG bytes, one frame per request.
import { selfEndpoint } from './browserPort.ts';
import { demoJobs } from './demoJobs.ts';
import { workerServe } from './serve.ts';

workerServe(selfEndpoint(), demoJobs);
