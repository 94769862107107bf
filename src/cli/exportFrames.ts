import { join } from 'node:path';
import type { ClassTable } from '../core/classTable.ts';
import { dictCreate } from '../core/dict.ts';
import { frameDecode } from '../core/decodedFrame.ts';
import type { TileExportSource } from '../core/export/tilesExport.ts';
import { fail } from '../core/result.ts';
import { datasetPair, type Pairing } from '../data/pairing.ts';
import { classTableRead } from './classesRead.ts';
import { diskFileReader } from './diskFiles.ts';
import type { ExportOptions } from './exportArgs.ts';
import { filesUnder } from './listFiles.ts';

/** The folders the exporter reads: frames paired by stem (as the scorer pairs them) and the class table. */
export interface ExportDataset {
  pairing: Pairing;
  table: ClassTable;
}

/** Lists the folders and pairs frames by stem; runs keep the order given on the command line. */
export async function exportDatasetOpen(o: ExportOptions): Promise<ExportDataset> {
  const table = await classTableRead(o.classes, o.ignore);
  const truth = await filesUnder(o.truth, 'truth');
  const predictions = dictCreate<string[]>();
  for (const r of o.runs) predictions[r.name] = await filesUnder(r.dir, 'pred');
  const images = o.images ? await filesUnder(o.images, 'images') : [];
  const pairing = datasetPair({ truth, predictions, images });
  pairing.runs = o.runs.map((r) => r.name);
  return { pairing, table };
}

/** Returns a frame source reading the folders from disk: label maps decoded exactly, PNG photos decoded (other photo types noted and left out). */
export function exportSourceFromFolders(ds: ExportDataset, o: ExportOptions): TileExportSource {
  const frames = new Map(ds.pairing.frames.map((f) => [f.name, f]));
  const runDir = new Map(o.runs.map((r) => [r.name, r.dir]));
  const reader = diskFileReader();
  return {
    async frameLoad(name) {
      const f = frames.get(name);
      if (!f) return fail('', `frame "${name}" has no ground-truth file in --truth ${o.truth}`);
      const image = o.images && f.image ? { file: `images/${f.image}`, path: join(o.images, f.image) } : null;
      return frameDecode({
        name,
        truth: { file: `truth/${f.truth}`, path: join(o.truth, f.truth) },
        preds: ds.pairing.runs.map((run) => {
          const path = f.predictions[run];
          return { run, file: path === null ? null : { file: `${run}/${path}`, path: join(runDir.get(run)!, path) } };
        }),
        photo: image,
        table: ds.table,
      }, reader);
    },
  };
}
