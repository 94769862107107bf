import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { classTableFromText, classTableGenerated, type ClassTable } from '../core/classTable.ts';
import type { ExportFrame } from '../core/export/tileRender.ts';
import type { TileExportSource } from '../core/export/tilesExport.ts';
import { frameSizesCheck } from '../core/frameCheck.ts';
import { labelMapFromPng } from '../core/png/decodeLabel.ts';
import { photoFromPng } from '../core/png/decodePhoto.ts';
import { fail, ok, type Result } from '../core/result.ts';
import { datasetPair, type Pairing } from '../data/pairing.ts';
import { UsageError } from './args.ts';
import type { ExportOptions } from './exportArgs.ts';
import { filesUnder } from './listFiles.ts';

/** The folders the exporter reads: frames paired by stem (as the scorer pairs them) and the class table. */
export interface ExportDataset {
  pairing: Pairing;
  table: ClassTable;
}

/** Returns the class table of --classes (with --ignore), or throws UsageError saying what is wrong. */
async function tableRead(o: ExportOptions): Promise<ClassTable> {
  // Without a table ids are named by number (colour-coded maps then fail with a message saying why).
  if (!o.classes) return classTableGenerated(-1, o.ignore ?? 255);
  let text: string;
  try {
    text = await readFile(o.classes, 'utf8');
  } catch (e) {
    throw new UsageError(`--classes ${o.classes}: cannot read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  const r = classTableFromText(text, o.classes);
  if (!r.ok) throw new UsageError(r.error);
  if (o.ignore !== null && o.ignore !== r.value.ignore) {
    const clash = r.value.classes.find((c) => c.id === o.ignore);
    if (clash) throw new UsageError(`--ignore ${o.ignore} is the id of class "${clash.name}" in ${o.classes}`);
    return { ...r.value, ignore: o.ignore };
  }
  return r.value;
}

/** Lists the folders and pairs frames by stem; runs keep the order given on the command line. */
export async function exportDatasetOpen(o: ExportOptions): Promise<ExportDataset> {
  const table = await tableRead(o);
  const truth = await filesUnder(o.truth, 'truth');
  const predictions: Record<string, string[]> = {};
  for (const r of o.runs) predictions[r.name] = await filesUnder(r.dir, 'pred');
  const images = o.images ? await filesUnder(o.images, 'images') : [];
  const pairing = datasetPair({ truth, predictions, images });
  pairing.runs = o.runs.map((r) => r.name);
  return { pairing, table };
}

async function bytesRead(path: string, file: string): Promise<Result<Uint8Array>> {
  try {
    return ok(new Uint8Array(await readFile(path)));
  } catch (e) {
    return fail(file, `cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

/** Returns a frame source reading the folders from disk: label maps decoded exactly, PNG photos decoded (other photo types noted and left out). */
export function exportSourceFromFolders(ds: ExportDataset, o: ExportOptions): TileExportSource {
  const frames = new Map(ds.pairing.frames.map((f) => [f.name, f]));
  const runDir = new Map(o.runs.map((r) => [r.name, r.dir]));
  return {
    async frameLoad(name) {
      const f = frames.get(name);
      if (!f) return fail('', `frame "${name}" has no ground-truth file in --truth ${o.truth}`);
      const file = `truth/${f.truth}`;
      const bytes = await bytesRead(join(o.truth, f.truth), file);
      if (!bytes.ok) return bytes;
      const truth = labelMapFromPng(bytes.value, { file, table: ds.table });
      if (!truth.ok) return truth;
      const { width, height } = truth.value;
      const frame: ExportFrame = { width, height, truth: truth.value, preds: {}, photo: null, notes: [] };
      for (const run of ds.pairing.runs) {
        const path = f.predictions[run];
        if (path === null) {
          frame.notes.push(`run "${run}" has no prediction for this frame`);
          continue;
        }
        const pfile = `${run}/${path}`;
        const pb = await bytesRead(join(runDir.get(run)!, path), pfile);
        const p = pb.ok ? labelMapFromPng(pb.value, { file: pfile, table: ds.table }) : pb;
        const sized = p.ok ? frameSizesCheck([{ file, width, height }, { file: pfile, width: p.value.width, height: p.value.height }]) : p;
        if (!p.ok || !sized.ok) frame.notes.push(!p.ok ? p.error : (sized as { error: string }).error);
        else frame.preds[run] = p.value;
      }
      if (o.images && f.image) {
        const ifile = `images/${f.image}`;
        if (!f.image.toLowerCase().endsWith('.png')) frame.notes.push(`${ifile}: the command line decodes PNG photos only; the tile has no photo`);
        else {
          const ib = await bytesRead(join(o.images, f.image), ifile);
          const photo = ib.ok ? photoFromPng(ib.value, { file: ifile }) : ib;
          const sized = photo.ok ? frameSizesCheck([{ file, width, height }, { file: ifile, width: photo.value.width, height: photo.value.height }]) : photo;
          if (!photo.ok || !sized.ok) frame.notes.push(!photo.ok ? photo.error : (sized as { error: string }).error);
          else frame.photo = photo.value.rgba;
        }
      }
      return ok(frame);
    },
  };
}
