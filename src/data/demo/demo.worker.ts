// Demo worker: generates Kestrel Quay frames as PNG bytes, one frame per request.
import { buffersOf } from '../../workers/protocol.ts';
import { selfEndpoint } from '../../workers/browserPort.ts';
import { workerServe } from '../../workers/serve.ts';
import { demoFrame } from './frame.ts';
import type { DemoOptions } from './options.ts';

workerServe(selfEndpoint(), {
  demoFrame(input: { index: number; options: DemoOptions }) {
    const f = demoFrame(input.index, input.options);
    return { value: f, transfer: buffersOf(f.photoPng, f.truthPng, f.predPngs['run-a'], f.predPngs['run-b']) };
  },
});
