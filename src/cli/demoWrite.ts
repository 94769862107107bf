// Writes the Kestrel Quay demo as a normal dataset folder: images/, truth/, instances/, predictions/run-a/,
// predictions/run-b/, classes.json and answer-key.json. Frames are generated independently, on
// worker threads when there are several cores.
import { mkdir, readdir, stat, unlink, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { fail, ok, type Result } from '../core/result.ts';
import { demoClassesJson } from '../demo/classes.ts';
import type { DemoMistake } from '../demo/mistakes.ts';
import { demoFrameName, type DemoOptions } from '../demo/options.ts';
import { DEMO_RUNS } from '../demo/runs.ts';
import { workerPoolCreate } from '../workers/pool.ts';
import type { DemoThreadJobs } from './demoThread.ts';
import { threadPortCreate } from './threadPort.ts';

/** What demoDatasetWrite did: frames written, answer-key entries, wall time in ms. */
export interface DemoWriteSummary {
  frames: number;
  mistakes: number;
  ms: number;
  threads: number;
}

const FOLDERS = ['images', 'truth', 'instances', ...DEMO_RUNS.map((r) => join('predictions', r))];
const FRAME_FILE = /^kq-\d{4}\.png$/;

/** What a demo folder holds at its top level; a folder holding anything else is not overwritten. */
const TOP = new Set(['images', 'truth', 'instances', 'predictions', 'classes.json', 'answer-key.json']);

// A folder may be reused only if it is new, empty or holds nothing but an earlier (maybe unfinished)
// demo; stale frames of a longer earlier demo are removed so the folder pairs up exactly.
async function folderPrepare(dir: string, o: DemoOptions): Promise<Result<void>> {
  const info = await stat(dir).catch(() => null);
  if (info && !info.isDirectory()) return fail(dir, 'exists and is not a folder');
  if (info) {
    const other = (await readdir(dir)).filter((e) => !TOP.has(e));
    if (other.length > 0) {
      return fail(dir, `holds files that are not a demo (${other.slice(0, 3).join(', ')}${other.length > 3 ? ', …' : ''}); choose a new or empty folder`);
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

/** Writes the demo dataset into `dir`; returns a summary, or why the folder cannot be used or written. */
export async function demoDatasetWrite(dir: string, o: DemoOptions, threads = Math.min(4, availableParallelism())): Promise<Result<DemoWriteSummary>> {
  try {
    return await datasetWrite(dir, o, threads);
  } catch (e) {
    const err = e as NodeJS.ErrnoException;
    return fail(err.path ?? dir, `could not be written (${err.code ?? err.message})`);
  }
}

async function datasetWrite(dir: string, o: DemoOptions, threads: number): Promise<Result<DemoWriteSummary>> {
  const start = performance.now();
  const ready = await folderPrepare(dir, o);
  if (!ready.ok) return ready;
  await writeFile(join(dir, 'classes.json'), JSON.stringify(demoClassesJson(), null, 2) + '\n');
  const n = Math.max(1, Math.min(threads, o.frames));
  let perFrame: DemoMistake[][];
  if (n === 1) {
    // loaded here only: with threads the generator runs in the workers, and the main thread skips
    // compiling it before they can start
    const { demoFrameFilesWrite } = await import('./demoFrameFiles.ts');
    perFrame = [];
    for (let i = 0; i < o.frames; i++) perFrame.push(await demoFrameFilesWrite(dir, i, o));
  } else {
    const pool = workerPoolCreate<DemoThreadJobs>(() => threadPortCreate(new URL('./demoThread.ts', import.meta.url)), n);
    try {
      perFrame = await Promise.all(Array.from({ length: o.frames }, (_, i) => pool.run('demoFrameWrite', { dir, index: i, options: o })));
    } finally {
      pool.destroy();
    }
  }
  const key = perFrame.flat();
  // one mistake per line: easy to read and to diff
  await writeFile(join(dir, 'answer-key.json'), '[\n' + key.map((m) => '  ' + JSON.stringify(m)).join(',\n') + '\n]\n');
  return ok({ frames: o.frames, mistakes: key.length, ms: performance.now() - start, threads: n });
}
