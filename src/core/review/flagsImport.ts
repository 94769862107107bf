import type { FlagsFileContent, FlagsFileDataset } from './flagsFile.ts';
import { reviewRecordKey, type ReviewRecord } from './reviewRecord.ts';

/** What an import did: ids added and updated, ids skipped with the reason, and warnings. */
export interface FlagsImportReport {
  added: string[];
  updated: string[];
  skipped: { id: string; reason: string }[];
  verdictsAdded: number;
  verdictsUpdated: number;
  verdictsSkipped: number;
  warnings: string[];
}

/** Returns the dataset a file was saved from and the one open, as a warning when they differ, else null. */
function datasetWarning(from: FlagsFileDataset | null, open: FlagsFileDataset | null, file: string): string | null {
  if (!from || !open || from.key === open.key) return null;
  return `${file} was saved from "${from.title}" (${from.frames} frames); the open dataset is "${open.title}" (${open.frames} frames). Flags were matched by frame name.`;
}

/**
 * Returns the records an import adds or replaces (last write wins per id: a file's flag replaces the
 * one here only when it was edited later, and comes back after a delete only when edited after the
 * delete) and the report. Flags on frames missing from `frameNames` are skipped. Pure: nothing changes here.
 */
export function flagsImportPlan(
  current: Readonly<Record<string, ReviewRecord>>,
  content: FlagsFileContent,
  options: { file: string; writer: string; dataset: FlagsFileDataset | null; frameNames: ReadonlySet<string> | null },
): { records: ReviewRecord[]; report: FlagsImportReport } {
  const report: FlagsImportReport = { added: [], updated: [], skipped: [], verdictsAdded: 0, verdictsUpdated: 0, verdictsSkipped: 0, warnings: [] };
  const warning = datasetWarning(content.dataset, options.dataset, options.file);
  if (warning) report.warnings.push(warning);
  const records: ReviewRecord[] = [];
  for (const flag of content.flags) {
    if (options.frameNames && !options.frameNames.has(flag.frame)) {
      report.skipped.push({ id: flag.id, reason: `frame ${JSON.stringify(flag.frame)} is not in this dataset` });
      continue;
    }
    const have = current[reviewRecordKey({ type: 'flag', id: flag.id })];
    if (have && have.updatedAt >= flag.updatedAt) {
      const live = have.type === 'flag' && have.flag !== null;
      report.skipped.push({ id: flag.id, reason: live ? 'the flag here is as new or newer' : 'deleted here after this version was saved' });
      continue;
    }
    records.push({ type: 'flag', id: flag.id, updatedAt: flag.updatedAt, writer: options.writer, flag });
    if (have && have.type === 'flag' && have.flag !== null) report.updated.push(flag.id);
    else report.added.push(flag.id);
  }
  for (const v of content.verdicts) {
    if (options.frameNames && !options.frameNames.has(v.frame)) {
      report.verdictsSkipped++;
      continue;
    }
    const have = current[reviewRecordKey({ type: 'verdict', id: v.key })];
    if (have && have.updatedAt >= v.updatedAt) {
      report.verdictsSkipped++;
      continue;
    }
    records.push({ type: 'verdict', id: v.key, updatedAt: v.updatedAt, writer: options.writer, verdict: v });
    if (have && have.type === 'verdict' && have.verdict !== null) report.verdictsUpdated++;
    else report.verdictsAdded++;
  }
  return { records, report };
}
