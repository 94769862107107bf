// Worker thread of the headless scorer: reads a frame's files from disk and runs the same job as the
// browser's scoring worker (src/workers/frameScoreRun.ts). Each thread has its own heap, which V8
// grows over the decoded maps a frame leaves behind unless collected: a full collection every
// THREAD_TRIM_JOBS frames keeps the threads' share of the process memory flat (heapTrim.ts).
import { workerServe } from '../workers/serve.ts';
import { heapTrim } from './heapTrim.ts';
import { scoreFileJobs, type FrameScorePaths } from './scoreFiles.ts';
import { threadEndpoint } from './threadPort.ts';

const THREAD_TRIM_JOBS = 50;
let jobs = 0;

workerServe(await threadEndpoint(), {
  async frameScore(input: FrameScorePaths) {
    const out = await scoreFileJobs.frameScore(input);
    if (++jobs % THREAD_TRIM_JOBS === 0) heapTrim();
    return out;
  },
});
