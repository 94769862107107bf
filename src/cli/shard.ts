// `--shard K/N` (0-based) and `--shard auto`: which contiguous run of frames, in name order, one
// machine of a job array scores.
import { UsageError } from './args.ts';
import type { ResultsShard } from './resultsWrite.ts';

/**
 * Returns the shard named by `text`: "K/N" with 0 ≤ K < N, or "auto", read from a Slurm job array
 * (SLURM_ARRAY_TASK_ID − SLURM_ARRAY_TASK_MIN of SLURM_ARRAY_TASK_COUNT) or a Kubernetes Indexed Job
 * (JOB_COMPLETION_INDEX of HAIRLINE_SHARDS, which the manifest sets to its completions).
 */
export function shardParse(text: string, env: Record<string, string | undefined> = process.env): ResultsShard {
  const whole = (v: string | undefined) => (v !== undefined && /^\d+$/.test(v.trim()) ? Number(v) : null);
  let index: number | null, count: number | null, from: string;
  if (text === 'auto') {
    if (env.SLURM_ARRAY_TASK_ID !== undefined) {
      index = whole(env.SLURM_ARRAY_TASK_ID);
      const min = whole(env.SLURM_ARRAY_TASK_MIN ?? '0');
      if (index !== null && min !== null) index -= min;
      count = whole(env.SLURM_ARRAY_TASK_COUNT);
      from = `SLURM_ARRAY_TASK_ID=${env.SLURM_ARRAY_TASK_ID}, SLURM_ARRAY_TASK_MIN=${env.SLURM_ARRAY_TASK_MIN ?? '(unset)'}, SLURM_ARRAY_TASK_COUNT=${env.SLURM_ARRAY_TASK_COUNT ?? '(unset)'}`;
    } else if (env.JOB_COMPLETION_INDEX !== undefined) {
      index = whole(env.JOB_COMPLETION_INDEX);
      count = whole(env.HAIRLINE_SHARDS);
      from = `JOB_COMPLETION_INDEX=${env.JOB_COMPLETION_INDEX}, HAIRLINE_SHARDS=${env.HAIRLINE_SHARDS ?? '(unset)'}`;
    } else {
      throw new UsageError('--shard auto: not in a Slurm job array (no SLURM_ARRAY_TASK_ID) nor a Kubernetes Indexed Job (no JOB_COMPLETION_INDEX); give --shard K/N');
    }
  } else {
    const m = /^(\d+)\/(\d+)$/.exec(text.trim());
    index = m ? Number(m[1]) : null;
    count = m ? Number(m[2]) : null;
    from = `--shard ${text}`;
    if (!m) throw new UsageError(`--shard must be K/N (0-based, e.g. 0/4) or auto, got "${text}"`);
  }
  if (index === null || count === null || count < 1 || index < 0 || index >= count || count > 100000) {
    throw new UsageError(`--shard: ${from} does not name a shard K of N with 0 ≤ K < N ≤ 100000`);
  }
  return { index, count };
}

/** Returns the frames [from, to) of shard `s` of `total` frames: contiguous, sizes differing by at most one. */
export function shardRange(total: number, s: ResultsShard): { from: number; to: number } {
  return { from: Math.floor((s.index * total) / s.count), to: Math.floor(((s.index + 1) * total) / s.count) };
}
