import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { ClassTable } from '../core/classTable.ts';
import { dictCreate } from '../core/dict.ts';
import { datasetPairProbed } from '../data/labelGroups.ts';
import { frameListParse, pairingListed } from '../data/frameList.ts';
import type { Pairing } from '../data/pairing.ts';
import { UsageError } from './args.ts';
import { classTableRead } from './classesRead.ts';
import { filesUnder } from './listFiles.ts';
import type { ScoreOptions } from './scoreArgs.ts';
import type { FrameScorePaths } from './scoreFiles.ts';
import type { ScoreSettings } from '../core/metrics/settings.ts';
import { sequencePlaces, type SequencePlace } from '../core/temporal/sequences.ts';

/** The dataset the scorer was pointed at: frames paired by stem, the class table, and what did not pair. */
export interface ScoreDataset {
  pairing: Pairing;
  /** The table frames are scored with (generated without --classes: `table.generated`). */
  table: ClassTable;
  settings: ScoreSettings;
  /** Each frame's place in its sequence (neighbours for flicker), in pairing order. */
  places: SequencePlace[];
}

/** Lists the folders, pairs frames by stem and reads the class table. */
export async function scoreDatasetOpen(options: ScoreOptions): Promise<ScoreDataset> {
  const table = await classTableRead(options.classes, options.ignore);
  const truth = await filesUnder(options.truth, 'truth');
  const predictions = dictCreate<string[]>();
  for (const r of options.runs) predictions[r.name] = await filesUnder(r.dir, 'pred');
  const confidence = dictCreate<string[]>();
  for (const c of options.confidence) confidence[c.name] = await filesUnder(c.dir, 'confidence');
  const images = options.images ? await filesUnder(options.images, 'images') : [];
  const instances = options.instances ? await filesUnder(options.instances, 'instances') : undefined;
  const ignore = table.ignore;
  const dirs = new Map<string, string>([['truth', options.truth], ['images', options.images ?? '']]);
  for (const r of options.runs) dirs.set(`predictions/${r.name}`, r.dir);
  for (const c of options.confidence) dirs.set(`confidence/${c.name}`, c.dir);
  if (options.instances) dirs.set('instances', options.instances);
  const read = async (folder: string, path: string) => new Uint8Array(await readFile(join(dirs.get(folder)!, path)));
  let pairing = await datasetPairProbed({ truth, predictions, images, confidence, instances }, read, table.generated ? null : table, ignore, options.pair);
  if (options.list) {
    const text = await readFile(options.list, 'utf8').catch((e: NodeJS.ErrnoException) => {
      throw new UsageError(`--list ${options.list}: cannot read (${e.code ?? e.message})`);
    });
    const listed = pairingListed(pairing, frameListParse(text), options.list);
    if (!listed.ok) throw new UsageError(listed.error);
    pairing = listed.value;
  }
  // datasetPair sorts runs by name; the scorer keeps the order given (the first --pred is the report's run).
  pairing.runs = options.runs.map((r) => r.name);
  const settings: ScoreSettings = {
    ignore,
    biouDilationRatio: options.biouRatio,
    bfTolerance: options.bfTolerance,
  };
  return { pairing, table, settings, places: sequencePlaces(pairing.frames.map((f) => f.name)) };
}

/** Returns the worker-thread job for frame `index`: file paths and the names used in messages. */
export function scoreJobOf(ds: ScoreDataset, options: ScoreOptions, table: ClassTable, index: number): FrameScorePaths {
  const f = ds.pairing.frames[index];
  const runDir = new Map(options.runs.map((r) => [r.name, r.dir]));
  const confDir = new Map(options.confidence.map((c) => [c.name, c.dir]));
  return {
    name: f.name,
    truth: { file: `truth/${f.truth}`, path: join(options.truth, f.truth) },
    preds: ds.pairing.runs.map((run) => {
      const file = f.predictions[run];
      return { run, file: file === null ? null : { file: `${run}/${file}`, path: join(runDir.get(run)!, file) } };
    }),
    photo: options.images && f.image ? { file: `images/${f.image}`, path: join(options.images, f.image) } : null,
    neighbours: ds.pairing.runs.map((run) => {
      const at = (i: number | null) => {
        const file = i === null ? null : ds.pairing.frames[i].predictions[run];
        return file ? { file: `${run}/${file}`, path: join(runDir.get(run)!, file) } : null;
      };
      const { prev, next } = ds.places[index];
      return { run, prev: at(prev), next: at(next) };
    }),
    instances: options.instances && f.instance ? { file: `instances/${f.instance}`, path: join(options.instances, f.instance) } : null,
    confidence: options.confidence.map((c) => {
      const file = f.confidence[c.name] ?? null;
      return { run: c.name, file: file === null ? null : { file: `confidence/${c.name}/${file}`, path: join(confDir.get(c.name)!, file) } };
    }),
    table,
    settings: ds.settings,
  };
}
