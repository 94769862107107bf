// Writes the Kestrel Quay demo as a normal dataset folder: images/, truth/, predictions/run-a/,
// predictions/run-b/, classes.json and answer-key.json. Frames are generated independently, on
// worker threads when there are several cores.
import { mkdir, readdir, stat, unlink, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { constants, deflateSync } from 'node:zlib';
import { fail, ok, type Result } from '../core/result.ts';
import { demoClassesJson } from '../data/demo/classes.ts';
import { demoFrame, type DemoZlib } from '../data/demo/frame.ts';
import type { DemoMistake } from '../data/demo/mistakes.ts';
import { demoFrameName, type DemoOptions } from '../data/demo/options.ts';
import { DEMO_RUNS } from '../data/demo/runs.ts';
import { workerPoolCreate } from '../workers/pool.ts';
import { threadPortCreate } from './threadPort.ts';

/** What demoDatasetWrite did: frames written, answer-key entries, wall time in ms. */
export interface DemoWriteSummary {
  frames: number;
  mistakes: number;
  ms: number;
  threads: number;
}

const FOLDERS = ['images', 'truth', ...DEMO_RUNS.map((r) => join('predictions', r))];
const FRAME_FILE = /^kq-\d{4}\.png$/;

// Node's zlib: the same file format as the portable path, several times quicker. Photos carry sensor
// noise, so string matching finds little: Huffman coding alone was 5× faster and no larger (measured).
const zlibNode: DemoZlib = {
  photo: (data) => new Uint8Array(deflateSync(data, { level: 1, strategy: constants.Z_HUFFMAN_ONLY })),
  labels: (data) => new Uint8Array(deflateSync(data, { level: 1 })),
};

/** Generates frame `index` and writes its four PNGs under `dir`; returns its answer-key entries. */
export async function demoFrameFilesWrite(dir: string, index: number, o: DemoOptions): Promise<DemoMistake[]> {
  const f = demoFrame(index, o, zlibNode);
  const file = `${f.name}.png`;
  await Promise.all([
    writeFile(join(dir, 'images', file), f.photoPng),
    writeFile(join(dir, 'truth', file), f.truthPng),
    ...DEMO_RUNS.map((r) => writeFile(join(dir, 'predictions', r, file), f.predPngs[r])),
  ]);
  return f.mistakes;
}

// A folder may be reused only if it is new, empty or an earlier demo; stale frames of a longer earlier
// demo are removed so the folder pairs up exactly.
async function folderPrepare(dir: string, o: DemoOptions): Promise<Result<void>> {
  const info = await stat(dir).catch(() => null);
  if (info && !info.isDirectory()) return fail(dir, 'exists and is not a folder');
  if (info) {
    const entries = await readdir(dir);
    if (entries.length > 0 && !entries.includes('answer-key.json')) {
      return fail(dir, 'is not empty and holds no earlier demo (no answer-key.json); choose a new or empty folder');
    }
  }
  const keep = new Set(Array.from({ length: o.frames }, (_, i) => `${demoFrameName(i)}.png`));
  for (const sub of FOLDERS) {
    const path = join(dir, sub);
    await mkdir(path, { recursive: true });
    for (const name of await readdir(path)) if (FRAME_FILE.test(name) && !keep.has(name)) await unlink(join(path, name));
  }
  return ok(undefined);
}

/** Writes the demo dataset into `dir`; returns a summary, or why the folder cannot be used. */
export async function demoDatasetWrite(dir: string, o: DemoOptions, threads = Math.min(4, availableParallelism())): Promise<Result<DemoWriteSummary>> {
  const start = performance.now();
  const ready = await folderPrepare(dir, o);
  if (!ready.ok) return ready;
  await writeFile(join(dir, 'classes.json'), JSON.stringify(demoClassesJson(), null, 2) + '\n');
  const n = Math.max(1, Math.min(threads, o.frames));
  let perFrame: DemoMistake[][];
  if (n === 1) {
    perFrame = [];
    for (let i = 0; i < o.frames; i++) perFrame.push(await demoFrameFilesWrite(dir, i, o));
  } else {
    const pool = workerPoolCreate(() => threadPortCreate(new URL('./demoThread.ts', import.meta.url)), n);
    try {
      perFrame = await Promise.all(Array.from({ length: o.frames }, (_, i) => pool.run<DemoMistake[]>('demoFrameWrite', { dir, index: i, options: o })));
    } finally {
      pool.destroy();
    }
  }
  const key = perFrame.flat();
  await writeFile(join(dir, 'answer-key.json'), JSON.stringify(key, null, 1) + '\n');
  return ok({ frames: o.frames, mistakes: key.length, ms: performance.now() - start, threads: n });
}
