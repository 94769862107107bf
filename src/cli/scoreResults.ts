// `npm run score -- … --results DIR [--shard K/N|auto]`: scores the dataset (or one shard of it) into
// a results folder (resultsWrite.ts) instead of the JSON report, holding nothing per frame.
import { createHash } from 'node:crypto';
import type { ClassTable } from '../core/classTable.ts';
import { SUSPECT_DEFAULTS } from '../core/suspects/suspectSettings.ts';
import { progressCreate } from './progress.ts';
import type { ScoreOptions } from './scoreArgs.ts';
import type { ScoreDataset } from './scoreDataset.ts';
import { framesScore } from './scoreFrames.ts';
import { summaryText } from './scoreReportWrite.ts';
import { resultsWriterCreate } from './resultsWrite.ts';
import { shardParse, shardRange } from './shard.ts';

/** Failed frames and warnings printed before the rest are only counted. */
const SHOWN = 20;

/** Returns the dataset's identity: a digest of its runs and every frame name in order (the same for every shard). */
export function datasetIdOf(ds: { pairing: { runs: readonly string[]; frames: readonly { name: string }[] } }): string {
  const h = createHash('sha256');
  h.update(JSON.stringify(ds.pairing.runs));
  for (const f of ds.pairing.frames) h.update(`\n${f.name}`);
  return h.digest('hex').slice(0, 32);
}

/** Scores into the results folder; returns the exit code (3 when some frames failed). */
export async function scoreResults(options: ScoreOptions, ds: ScoreDataset, table: ClassTable): Promise<number> {
  const total = ds.pairing.frames.length;
  const shard = options.shard === null ? null : shardParse(options.shard);
  const { from, to } = shard ? shardRange(total, shard) : { from: 0, to: total };
  const suspectSettings = { ...SUSPECT_DEFAULTS, queueMax: options.suspects };
  const writer = await resultsWriterCreate({
    dir: options.results!, runs: ds.pairing.runs, settings: ds.settings, suspectSettings, datasetId: datasetIdOf(ds), total, from, to, shard,
    classTable: { generated: table.generated, ignore: ds.settings.ignore, classes: table.classes.map((c) => ({ id: c.id, name: c.name })) },
    unpaired: ds.pairing.unpaired,
  });
  // The frames just beyond the shard's edges are scored too, for the temporal evidence of its own frames.
  const w = suspectSettings.temporalWindow;
  const readFrom = Math.max(0, from - w), readTo = Math.min(total, to + w);
  const progress = progressCreate(readTo - readFrom);
  let done = 0, failed = 0, warned = 0, shown = 0;
  try {
    await framesScore(ds, options, table, readFrom, readTo, (index, result) => {
      for (const x of result.warnings ?? []) if (warned++ < SHOWN) process.stderr.write(`warning: ${x}\n`);
      const own = index >= from && index < to;
      const error = result.error ?? result.runs.find((r) => r.error)?.error ?? null;
      if (own && error) {
        failed++;
        if (shown++ < SHOWN) process.stderr.write(`failed: ${error}\n`);
      }
      writer.add(index, result);
      progress.tick(++done, failed, result.name);
    });
    progress.end(done, failed);
    if (warned > SHOWN) process.stderr.write(`… and ${warned - SHOWN} more warnings like these\n`);
    if (shown > SHOWN) process.stderr.write(`… and ${shown - SHOWN} more failed frames (error column of ${options.results}/frames.parquet)\n`);
    const { summary, queue } = await writer.finish();
    const part = shard ? `shard ${shard.index}/${shard.count}: frames ${from}..${to - 1} of ${total}` : `${total} frames`;
    process.stdout.write(
      `results: ${options.results} (${part}; ${summary.frames.scored} scored, ${summary.frames.failed} failed; ` +
        `${summary.rows.frames} frame rows, ${summary.rows.regions} region rows, ${summary.rows.queue} in the queue)\n`,
    );
    process.stdout.write(summaryText({ frames: [] }, summary.runs, [], queue.slice(0, 5)));
    return summary.frames.failed > 0 ? 3 : 0;
  } catch (e) {
    await writer.abandon();
    throw e;
  }
}
