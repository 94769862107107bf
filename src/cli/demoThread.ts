// Worker thread of the demo writer: generates and writes single frames on request.
import type { DemoOptions } from '../demo/options.ts';
import { workerServe } from '../workers/serve.ts';
import { demoFrameFilesWrite } from './demoFrameFiles.ts';
import { threadEndpoint } from './threadPort.ts';

const endpoint = await threadEndpoint();

workerServe(endpoint, {
  async demoFrameWrite(input: { dir: string; index: number; options: DemoOptions }) {
    return { value: await demoFrameFilesWrite(input.dir, input.index, input.options) };
  },
});
