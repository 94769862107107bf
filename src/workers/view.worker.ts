// View worker: decodes a frame's files for the viewer (label maps exactly, the photo by the browser).
import { selfEndpoint } from './browserPort.ts';
import { workerServe } from './serve.ts';
import { viewJobs } from './viewJobs.ts';

workerServe(selfEndpoint(), viewJobs);
