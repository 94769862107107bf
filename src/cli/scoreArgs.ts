import { availableParallelism } from 'node:os';
import type { PairOptions } from '../data/pairing.ts';
import { argsParse, ignoreParse, namedDirParse, runsParse, UsageError } from './args.ts';

/** Options of `npm run score`, validated. */
export interface ScoreOptions {
  truth: string;
  runs: { name: string; dir: string }[];
  images: string | null;
  confidence: { name: string; dir: string }[];
  /** A folder of instance maps (16-bit ids, 0 = no instance) for iIoU, or null. */
  instances: string | null;
  classes: string | null;
  ignore: number | null;
  out: string | null;
  csv: string | null;
  workers: number;
  biouRatio: number;
  bfTolerance: number;
  /** Length of the likely-label-mistake queue in the report. */
  suspects: number;
  /** A flags file (saved from the app) whose verdicts re-rank the queue, or null. */
  verdicts: string | null;
  /** A dataset root or its hairline.json (README "Your data"); the folders then come from it, not --truth/--pred. */
  dataset: string | null;
  /** A list file of the frames to score. */
  list: string | null;
  /** Per-folder suffix group or key pattern, from hairline.json. */
  pair?: PairOptions;
  /** A results folder to write (README "Large datasets"), and the shard of the frames to score ("K/N" or "auto"). */
  results: string | null;
  shard: string | null;
}

export const SCORE_USAGE = `usage: npm run score -- --truth DIR --pred [NAME=]DIR [--pred ...] [--classes FILE] [--ignore N]
       [--images DIR] [--confidence NAME=DIR] [--instances DIR] [--list FILE] [--out report.json] [--csv frames.csv] [--workers N]
       [--biou-ratio R] [--bf-tolerance T] [--suspects N] [--verdicts FLAGS.json]
       [--results DIR [--shard K/N|auto]]
   or: npm run score -- --dataset DIR|hairline.json [--list FILE] [--classes FILE] [--out …] …`;

/** Returns the scorer's options from argv, or throws UsageError naming the mistake. */
export function scoreOptionsParse(argv: string[]): ScoreOptions {
  const a = argsParse(argv, {
    truth: { kind: 'string' },
    pred: { kind: 'string', repeat: true },
    images: { kind: 'string' },
    confidence: { kind: 'string', repeat: true },
    instances: { kind: 'string' },
    classes: { kind: 'string' },
    ignore: { kind: 'number' },
    out: { kind: 'string' },
    csv: { kind: 'string' },
    workers: { kind: 'number' },
    'biou-ratio': { kind: 'number' },
    'bf-tolerance': { kind: 'number' },
    suspects: { kind: 'number' },
    verdicts: { kind: 'string' },
    dataset: { kind: 'string' },
    list: { kind: 'string' },
    results: { kind: 'string' },
    shard: { kind: 'string' },
    help: { kind: 'flag' },
  });
  if (a.help) throw new UsageError(SCORE_USAGE);
  if (a._.length) throw new UsageError(`unexpected argument "${a._[0]}"`);
  const results = (a.results as string | undefined) ?? null;
  const shard = (a.shard as string | undefined) ?? null;
  if (shard !== null && results === null) throw new UsageError('--shard needs --results DIR (a shard writes a results folder for npm run merge)');
  if (results !== null && a.verdicts !== undefined) throw new UsageError('--verdicts re-ranks the JSON report\'s queue; leave it out with --results');
  if (results !== null && (a.out !== undefined || a.csv !== undefined)) {
    throw new UsageError('--results writes its own tables; leave out --out and --csv (run again without --results for the JSON report)');
  }
  const dataset = (a.dataset as string | undefined) ?? null;
  if (dataset !== null) {
    const mixed = ['truth', 'pred', 'images', 'confidence', 'instances'].find((k) => a[k] !== undefined);
    if (mixed) throw new UsageError(`--dataset names the folders itself; leave out --${mixed} (or describe it in hairline.json)`);
  } else if (typeof a.truth !== 'string') throw new UsageError('--truth DIR is required (or --dataset DIR)');
  const preds = (a.pred as string[] | undefined) ?? [];
  if (preds.length === 0 && dataset === null) throw new UsageError('--pred DIR is required (give it once per prediction run)');
  const runs = runsParse(preds);
  const names = new Set(runs.map((r) => r.name));
  const confidence = ((a.confidence as string[] | undefined) ?? []).map((c) => namedDirParse(c, 'confidence'));
  for (const c of confidence) if (!names.has(c.name)) throw new UsageError(`--confidence ${c.name}=…: no run named "${c.name}"`);
  const ignore = ignoreParse(a.ignore as number | undefined);
  const workers = (a.workers as number | undefined) ?? availableParallelism();
  if (!Number.isInteger(workers) || workers < 1 || workers > 256) throw new UsageError(`--workers must be an integer 1..256, got ${workers}`);
  const biouRatio = (a['biou-ratio'] as number | undefined) ?? 0.02;
  if (!(biouRatio > 0 && biouRatio <= 1)) throw new UsageError(`--biou-ratio must be in (0, 1], got ${biouRatio}`);
  const bfTolerance = (a['bf-tolerance'] as number | undefined) ?? 0.0075;
  if (!(bfTolerance > 0 && bfTolerance <= 1)) throw new UsageError(`--bf-tolerance must be in (0, 1], got ${bfTolerance}`);
  const suspects = (a.suspects as number | undefined) ?? 200;
  if (!Number.isInteger(suspects) || suspects < 0 || suspects > 100000) throw new UsageError(`--suspects must be an integer 0..100000, got ${suspects}`);
  return {
    truth: (a.truth as string | undefined) ?? '',
    runs,
    images: (a.images as string | undefined) ?? null,
    confidence,
    instances: (a.instances as string | undefined) ?? null,
    classes: (a.classes as string | undefined) ?? null,
    ignore,
    out: (a.out as string | undefined) ?? null,
    csv: (a.csv as string | undefined) ?? null,
    workers,
    biouRatio,
    bfTolerance,
    suspects,
    verdicts: (a.verdicts as string | undefined) ?? null,
    dataset,
    list: (a.list as string | undefined) ?? null,
    results,
    shard,
  };
}
