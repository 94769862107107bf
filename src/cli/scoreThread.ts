// Worker thread of the headless scorer: reads a frame's files from disk and runs the same core job
// as the browser's scoring worker.
import { readFile } from 'node:fs/promises';
import { frameJobScore, type FileBytes, type FrameJobInput } from '../core/frameJob.ts';
import { scoreScratchCreate } from '../core/metrics/scratch.ts';
import { frameResultBuffers } from '../workers/scoreJobs.ts';
import { workerServe } from '../workers/serve.ts';
import { threadEndpoint } from './threadPort.ts';

/** A file to read: its path on disk and the name used in messages. */
export interface FilePath {
  file: string;
  path: string;
}

/** Input of the thread's `frameScore`: like FrameJobInput, with paths instead of bytes. */
export interface FrameScorePaths extends Omit<FrameJobInput, 'truth' | 'preds' | 'photo'> {
  truth: FilePath;
  preds: { run: string; file: FilePath | null }[];
  photo: FilePath | null;
}

async function bytesOf(f: FilePath): Promise<FileBytes | string> {
  try {
    return { file: f.file, bytes: new Uint8Array(await readFile(f.path)) };
  } catch (e) {
    return `${f.file}: could not be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`;
  }
}

const scratch = scoreScratchCreate();
const endpoint = await threadEndpoint();

workerServe(endpoint, {
  async frameScore(input: FrameScorePaths) {
    const truth = await bytesOf(input.truth);
    if (typeof truth === 'string') {
      return { value: { name: input.name, width: 0, height: 0, error: truth, runs: input.preds.map((p) => ({ run: p.run, stats: null, error: truth })) } };
    }
    const preds = await Promise.all(
      input.preds.map(async (p) => {
        if (!p.file) return { run: p.run, file: null, error: null };
        const b = await bytesOf(p.file);
        return typeof b === 'string' ? { run: p.run, file: null, error: b } : { run: p.run, file: b, error: null };
      }),
    );
    const photo = input.photo ? await bytesOf(input.photo) : null;
    const value = frameJobScore(
      { ...input, truth, preds: preds.map((p) => ({ run: p.run, file: p.file })), photo: typeof photo === 'string' ? null : photo },
      scratch,
    );
    // A prediction that could not be read says so, rather than "no prediction file".
    for (const p of preds) {
      const r = value.runs.find((x) => x.run === p.run);
      if (r && p.error && !value.error) r.error = p.error;
    }
    return { value, transfer: frameResultBuffers(value) };
  },
});
