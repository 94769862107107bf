// `npm run export -- --flags flags.json --truth DIR --pred [NAME=]DIR ... --out tiles.zip`: cuts the
// tiles of the flags in a flags file from a dataset folder with the same core code as the app and
// writes one ZIP (tiles, manifest.json, tiles.csv).
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { deflateSync } from 'node:zlib';
import { tilesExport, type TilesExportProgress } from '../core/export/tilesExport.ts';
import type { ZipSink } from '../core/export/zipStream.ts';
import { flagsSelect } from '../core/review/flagsFilter.ts';
import { flagsFileParse } from '../core/review/flagsFile.ts';
import { UsageError } from './args.ts';
import { EXPORT_USAGE, exportOptionsParse, type ExportOptions } from './exportArgs.ts';
import './nodeInflate.ts'; // zlib's inflate for every PNG the exporter reads
import { exportDatasetOpen, exportSourceFromFolders } from './exportFrames.ts';
import { outputOpen, type OutputFile } from './outputFile.ts';
import { termText } from './termText.ts';

/** Exit codes, as the scorer's: every tile written / bad arguments or input / some tiles failed. */
export const EXIT = { ok: 0, usage: 1, someFailed: 3 } as const;

/**
 * Returns a ZIP sink appending to `out`, the final chunk resolving once the file is on disk under its
 * final name, and the write error it met, if any (reported as it is, in one line).
 */
function fileSink(out: OutputFile): { sink: ZipSink; error: () => Error | null } {
  let error: Error | null = null;
  const sink: ZipSink = async (chunk, final) => {
    try {
      await out.write(chunk);
      if (final) await out.commit();
    } catch (e) {
      throw (error = e as Error);
    }
  };
  return { sink, error: () => error };
}

function progressWriter(): (p: TilesExportProgress) => void {
  const tty = Boolean(process.stderr.isTTY);
  let last = 0;
  return (p) => {
    const now = Date.now();
    const done = p.flagsDone === p.flagsTotal && p.frame === null;
    if (!done && now - last < (tty ? 100 : 1000)) return;
    last = now;
    const line = `flags ${p.flagsDone}/${p.flagsTotal} · ${p.tilesDone} tiles${p.failed ? ` · ${p.failed} failed` : ''} · ${(p.bytes / 1e6).toFixed(1)} MB`;
    process.stderr.write(tty ? `\r${line.padEnd(60)}` : `${line}\n`);
  };
}

async function run(o: ExportOptions): Promise<number> {
  let text: string;
  try {
    text = await readFile(o.flags, 'utf8');
  } catch (e) {
    throw new UsageError(`--flags ${o.flags}: cannot read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  const parsed = flagsFileParse(text, o.flags);
  if (!parsed.ok) throw new UsageError(parsed.error);
  const ds = await exportDatasetOpen(o);
  if (ds.pairing.frames.length === 0) throw new UsageError(`--truth ${o.truth}: no label PNGs found`);
  const file = parsed.value;
  if (file.dataset && file.dataset.frames !== ds.pairing.frames.length) {
    process.stderr.write(`note: ${o.flags} was saved from "${termText(file.dataset.title)}" with ${file.dataset.frames} frames; --truth has ${ds.pairing.frames.length}. Flags are matched by frame name.\n`);
  }
  const flags = flagsSelect(file.flags, { reasons: o.reasons, frames: o.frames });
  if (flags.length === 0) {
    const why = o.reasons.length || o.frames.length ? 'no flag matches --reason/--frame' : 'the flags file holds no flags';
    throw new UsageError(`${o.flags}: nothing to export (${why})`);
  }
  // Written next to the ZIP and renamed at the end, so a failed or cancelled (Ctrl+C) export leaves no broken ZIP.
  const zip = await outputOpen(o.out, '--out');
  const { sink, error } = fileSink(zip);
  const dataset = { key: file.dataset?.key ?? '', title: file.dataset?.title ?? basename(o.truth), frames: ds.pairing.frames.length };
  const result = await tilesExport({
    dataset, flags, runs: ds.pairing.runs, table: ds.table, mode: o.mode, source: exportSourceFromFolders(ds, o), sink,
    frameOrder: ds.pairing.frames.map((f) => f.name), onProgress: progressWriter(),
    pause: () => new Promise((r) => setTimeout(r, 0)),
    compress: (data) => new Uint8Array(deflateSync(data, { level: 6 })),
  });
  if (process.stderr.isTTY) process.stderr.write('\n');
  if (!result.ok) {
    await zip.abort();
    throw error() ?? new Error(`${o.out}: ${result.error}`);
  }
  const { manifest, bytes } = result.value;
  process.stdout.write(`wrote ${manifest.tiles.length} tile${manifest.tiles.length === 1 ? '' : 's'} of ${flags.length} flag${flags.length === 1 ? '' : 's'} to ${o.out} (${(bytes / 1e6).toFixed(2)} MB)\n`);
  if (manifest.failed.length) {
    process.stderr.write(`${manifest.failed.length} failed (also listed in manifest.json "failed"):\n`);
    for (const f of manifest.failed) process.stderr.write(`  ${termText(`${f.frame} · flag ${f.flagId}: ${f.reason}`)}\n`);
    return EXIT.someFailed;
  }
  return EXIT.ok;
}

async function main(): Promise<void> {
  let options: ExportOptions;
  try {
    options = exportOptionsParse(process.argv.slice(2));
  } catch (e) {
    if (e instanceof UsageError) {
      process.stderr.write(e.message === EXPORT_USAGE ? `${EXPORT_USAGE}\n` : `hairline export: ${e.message}\n${EXPORT_USAGE}\n`);
      process.exit(EXIT.usage);
    }
    throw e;
  }
  try {
    process.exitCode = await run(options);
  } catch (e) {
    process.stderr.write(`hairline export: ${termText((e as Error).message)}\n`);
    process.exit(EXIT.usage);
  }
}

await main();
