// `npm run score -- --truth DIR --pred [NAME=]DIR ...`: scores a dataset headless with the same core
// code as the browser, in a pool of worker threads; writes the src/docs/metrics.md JSON report.
import { readFile } from 'node:fs/promises';
import type { FrameJobResult } from '../core/frameJob.ts';
import { datasetTotalsAdd, datasetTotalsCreate, datasetTotalsWiden, type DatasetTotals } from '../core/metrics/datasetTotals.ts';
import { frameSummary } from '../core/metrics/frameSummary.ts';
import { flagsFileParse } from '../core/review/flagsFile.ts';
import type { SuspectVerdictKind } from '../core/review/verdict.ts';
import { extrasTotalsAdd, extrasTotalsCreate, type ExtrasTotals } from '../core/metrics/extrasTotals.ts';
import type { ReportFrameLine } from '../core/metrics/report.ts';
import { reportBuild, reportLineOf } from '../core/report/reportBuild.ts';
import { censusKeep } from '../core/report/reportCensus.ts';
import { UsageError } from './args.ts';
import { progressCreate } from './progress.ts';
import { SCORE_USAGE, scoreOptionsParse, type ScoreOptions } from './scoreArgs.ts';
import { scoreDatasetOpen } from './scoreDataset.ts';
import { framesScore } from './scoreFrames.ts';
import { scoreResults } from './scoreResults.ts';
import { pairingReport } from './scoreOpened.ts';
import { scoreOptionsResolve } from './datasetArgs.ts';
import { openedOf } from '../data/opened.ts';
import { regionGatherAdd, regionGatherCreate, regionGatherSuspects } from './scoreRegions.ts';
import { OutputError, outputCheck, outputWrite } from './outputFile.ts';
import { framesCsv, summaryText, type FrameCsvRow } from './scoreReportWrite.ts';
import { termText } from './termText.ts';

/** Warnings printed before the rest are only counted. */
const WARNINGS_SHOWN = 20;

/** Exit codes: every frame scored / bad arguments, unreadable folder or unwritable output / some frames failed / an output could not be written after scoring. */
export const EXIT = { ok: 0, usage: 1, someFailed: 3, output: 4 } as const;

/** Returns the verdicts of a flags file by item key, or throws UsageError naming the file and its problem. */
async function verdictsRead(file: string): Promise<Map<string, SuspectVerdictKind>> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (e) {
    throw new UsageError(`--verdicts ${file}: cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  const parsed = flagsFileParse(text, file);
  if (!parsed.ok) throw new UsageError(`--verdicts ${parsed.error}`);
  return new Map(parsed.value.verdicts.map((v) => [v.key, v.verdict]));
}

async function run(given: ScoreOptions): Promise<number> {
  const options = await scoreOptionsResolve(given);
  // Where the results go is checked before any scoring, so a typo costs nothing.
  try {
    if (options.out) await outputCheck(options.out, '--out');
    if (options.csv) await outputCheck(options.csv, '--csv');
  } catch (e) {
    throw e instanceof OutputError ? new UsageError(e.message) : e;
  }
  const verdicts = options.verdicts ? await verdictsRead(options.verdicts) : new Map<string, SuspectVerdictKind>();
  const ds = await scoreDatasetOpen(options);
  const { pairing } = ds;
  pairingReport(pairing, (line) => process.stderr.write(`${termText(line)}\n`));
  if (pairing.frames.length === 0) throw new UsageError(`--truth ${options.truth}: no label PNGs found`);
  const { table } = ds;
  const generated = table.generated;
  if (options.results) return scoreResults(options, ds, table);
  const runs = pairing.runs;
  const n = pairing.frames.length;

  const totals = new Map<string, DatasetTotals>(runs.map((r) => [r, datasetTotalsCreate(table.classes.map((c) => c.id))]));
  const lines = new Map<string, (ReportFrameLine | undefined)[]>(runs.map((r) => [r, new Array(n)]));
  const extras = new Map<string, ExtrasTotals>(runs.map((r) => [r, extrasTotalsCreate()]));
  const csvRows: (FrameCsvRow[] | undefined)[] = new Array(n);
  const regions = regionGatherCreate(n, options.suspects);
  const census = censusKeep(runs);
  let done = 0;
  let failed = 0;
  const progress = progressCreate(n);

  // A folder of unusable photos would warn once per frame: the first few are shown, the rest counted.
  let warned = 0;
  const take = (index: number, result: FrameJobResult) => {
    for (const w of result.warnings ?? []) if (warned++ < WARNINGS_SHOWN) process.stderr.write(`warning: ${termText(w)}\n`);
    regionGatherAdd(regions, index, result, runs[0]);
    census.add(result);
    let anyFailed = false;
    const rows: FrameCsvRow[] = [];
    for (const r of result.runs) {
      let error = result.error ?? r.error;
      if (r.stats && !error) {
        const wide = generated ? datasetTotalsWiden(totals.get(r.run)!, r.stats.classIds) : { ok: true as const, value: totals.get(r.run)! };
        if (wide.ok) {
          totals.set(r.run, wide.value);
          datasetTotalsAdd(wide.value, r.stats);
        } else error = `${result.name}: ${wide.error}`;
      }
      if (!r.stats || error) anyFailed = true;
      if (r.stats && r.extras && !error) extrasTotalsAdd(extras.get(r.run)!, r.extras, r.stats.classIds);
      lines.get(r.run)![index] = reportLineOf(result.name, r.stats, r.extras, error);
      const s = r.stats && !error ? frameSummary(r.stats, 3) : null;
      rows.push({
        frame: result.name, run: r.run, meanIoU: s?.meanIoU ?? null, pixelAccuracy: s?.pixelAccuracy ?? null, bandIoU3: s?.bandIoU ?? null,
        boundaryIoU: s?.boundaryIoU ?? null, boundaryF: s?.boundaryF ?? null, errorPixels: s?.errorPixels ?? null, error,
      });
    }
    csvRows[index] = rows;
    done++;
    if (anyFailed) failed++;
    progress.tick(done, failed, termText(result.name));
  };

  await framesScore(ds, options, table, 0, n, take);
  progress.end(done, failed);
  if (warned > WARNINGS_SHOWN) process.stderr.write(`… and ${warned - WARNINGS_SHOWN} more warnings like these\n`);
  const idWarnings = census.warnings();
  for (const w of idWarnings) process.stderr.write(`warning: ${termText(w)}\n`);

  const names = new Map(table.classes.map((c) => [c.id, c.name]));
  const report = reportBuild({
    classes: table.classes, generated, settings: ds.settings,
    runs: runs.map((r) => ({ run: r, totals: totals.get(r)!, extras: extras.get(r)!, lines: lines.get(r)! as ReportFrameLine[] })),
    regions: regions.lines, voidSpill: regions.voidSpill,
    suspects: regionGatherSuspects(regions, (id) => names.get(id) ?? String(id), verdicts),
    unpaired: pairing.unpaired, opened: openedOf(pairing, ds.table, idWarnings),
  });
  const runBlocks = report.runs ?? { [runs[0]]: report.dataset };
  const json = JSON.stringify(report, null, 2) + '\n';
  if (options.out) await outputWrite(options.out, '--out', json);
  else process.stdout.write(json);
  if (options.csv) await outputWrite(options.csv, '--csv', framesCsv(csvRows.flatMap((r) => r ?? [])));

  const worst = report.frames
    .filter((f) => f.meanIoU !== null)
    .sort((a, b) => a.meanIoU! - b.meanIoU!)
    .slice(0, 5)
    .map((f) => ({ run: runs[0], name: f.name, meanIoU: f.meanIoU }));
  (options.out ? process.stdout : process.stderr).write(summaryText(report, runBlocks, worst, report.suspects.slice(0, 5)));
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

async function main(): Promise<void> {
  let options: ScoreOptions;
  try {
    options = scoreOptionsParse(process.argv.slice(2));
  } catch (e) {
    if (e instanceof UsageError) {
      process.stderr.write(e.message === SCORE_USAGE ? `${SCORE_USAGE}\n` : `hairline score: ${e.message}\n${SCORE_USAGE}\n`);
      process.exit(EXIT.usage);
    }
    throw e;
  }
  try {
    process.exitCode = await run(options);
  } catch (e) {
    process.stderr.write(`hairline score: ${termText((e as Error).message)}\n`);
    process.exit(e instanceof OutputError ? EXIT.output : EXIT.usage);
  }
}

await main();
