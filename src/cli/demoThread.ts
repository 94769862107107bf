// Worker thread of the demo writer: generates and writes single frames on request.
import type { DemoOptions } from '../demo/options.ts';
import { workerServe } from '../workers/serve.ts';
import { demoFrameFilesWrite } from './demoFrameFiles.ts';
import { threadEndpoint } from './threadPort.ts';

/** The demo thread's command table. */
const demoThreadJobs = {
  async demoFrameWrite(input: { dir: string; index: number; options: DemoOptions }) {
    return { value: await demoFrameFilesWrite(input.dir, input.index, input.options) };
  },
};

export type DemoThreadJobs = typeof demoThreadJobs;

workerServe(await threadEndpoint(), demoThreadJobs);
