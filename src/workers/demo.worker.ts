// Demo worker: generates Kestrel Quay frames as PNG bytes, one frame per request.
import { buffersOf } from './protocol.ts';
import { selfEndpoint } from './browserPort.ts';
import { workerServe } from './serve.ts';
import { demoFrame } from '../demo/frame.ts';
import type { DemoOptions } from '../demo/options.ts';

workerServe(selfEndpoint(), {
  demoFrame(input: { index: number; options: DemoOptions }) {
    const f = demoFrame(input.index, input.options);
    return { value: f, transfer: buffersOf(f.photoPng, f.truthPng, f.predPngs['run-a'], f.predPngs['run-b']) };
  },
});
