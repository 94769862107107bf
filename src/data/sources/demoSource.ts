import { demoClassesJson } from '../../demo/classes.ts';
import { DEMO_DEFAULTS, demoFrameName, type DemoOptions } from '../../demo/options.ts';
import { DEMO_RUNS } from '../../demo/runs.ts';
import { browserPortCreate } from '../../workers/browserPort.ts';
import type { DemoJobs } from '../../workers/demoJobs.ts';
import { workerPoolCreate } from '../../workers/pool.ts';
import type { DatasetSource } from './source.ts';

/** The built-in demo as a dataset source: frames are generated in workers as PNG bytes, on demand. */
export interface DemoSource extends DatasetSource {
  options: DemoOptions;
  /** Frames generated so far. */
  generated(): number;
}

/**
 * Returns the Kestrel Quay demo as a dataset. A frame is generated the first time any of its files is
 * read (so the frame on screen and the frames being scored come first), then kept as Blobs; every
 * file goes through the same PNG decoding as a user's files.
 */
export function demoSourceOpen(options: DemoOptions = { ...DEMO_DEFAULTS }, workers = Math.max(1, Math.min(2, navigator.hardwareConcurrency || 2))): DemoSource {
  const pool = workerPoolCreate<DemoJobs>(
    () => browserPortCreate(() => new Worker(new URL('../../workers/demo.worker.ts', import.meta.url), { type: 'module', name: 'hairline-demo' })),
    workers,
  );
  const frames = new Map<number, Promise<Record<string, Blob>>>();
  const names = Array.from({ length: options.frames }, (_, i) => demoFrameName(i));
  const indexOf = new Map(names.map((n, i) => [n, i]));
  let done = 0;

  const frameFiles = (index: number): Promise<Record<string, Blob>> => {
    let p = frames.get(index);
    if (!p) {
      p = pool.run('demoFrame', { index, options }).then((f) => {
        done++;
        const png = (b: Uint8Array) => new Blob([b as BlobPart], { type: 'image/png' });
        const files: Record<string, Blob> = { images: png(f.photoPng), truth: png(f.truthPng), instances: png(f.instancesPng) };
        for (const run of DEMO_RUNS) files[`predictions/${run}`] = png(f.predPngs[run]);
        return files;
      });
      frames.set(index, p);
      p.catch(() => frames.get(index) === p && frames.delete(index));
    }
    return p;
  };

  const file = (n: string) => `${n}.png`;
  const predictions: Record<string, string[]> = {};
  for (const run of DEMO_RUNS) predictions[run] = names.map(file);
  return {
    kind: 'demo',
    title: 'Kestrel Quay demo',
    options,
    listing: { images: names.map(file), truth: names.map(file), instances: names.map(file), predictions, confidence: {} },
    classesText: JSON.stringify(demoClassesJson()),
    generated: () => done,
    close() {
      pool.destroy();
      frames.clear();
    },
    async read(folder, path) {
      const index = indexOf.get(path.replace(/\.png$/, ''));
      if (index === undefined) throw new Error(`${folder}/${path}: not a demo file`);
      const blob = (await frameFiles(index))[folder];
      if (!blob) throw new Error(`${folder}/${path}: not a demo file`);
      return blob;
    },
  };
}
