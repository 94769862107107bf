// Worker thread of the headless scorer: reads a frame's files from disk and runs the same job as the
// browser's scoring worker (src/workers/frameScoreRun.ts).
import { workerServe } from '../workers/serve.ts';
import { scoreFileJobs } from './scoreFiles.ts';
import { threadEndpoint } from './threadPort.ts';

workerServe(await threadEndpoint(), scoreFileJobs);
