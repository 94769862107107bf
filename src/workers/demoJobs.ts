import { demoFrame, type DemoFrame } from '../demo/frame.ts';
import type { DemoOptions } from '../demo/options.ts';
import { buffersOf, type JobOutput } from './protocol.ts';

/** The demo worker's command table: one Kestrel Quay frame as PNG bytes per request. */
export const demoJobs = {
  demoFrame(input: { index: number; options: DemoOptions }): JobOutput<DemoFrame> {
    const f = demoFrame(input.index, input.options);
    return { value: f, transfer: buffersOf(f.photoPng, f.truthPng, f.instancesPng, f.predPngs['run-a'], f.predPngs['run-b']) };
  },
};

export type DemoJobs = typeof demoJobs;
