import { csvField } from '../core/export/tileRows.ts';
import { termText } from './termText.ts';
import type { ScoreReport } from '../core/metrics/report.ts';

/** One CSV row per frame and run. */
export interface FrameCsvRow {
  frame: string;
  run: string;
  meanIoU: number | null;
  pixelAccuracy: number | null;
  bandIoU3: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  errorPixels: number | null;
  error: string | null;
}

const CSV_COLUMNS: (keyof FrameCsvRow)[] = ['frame', 'run', 'meanIoU', 'pixelAccuracy', 'bandIoU3', 'boundaryIoU', 'boundaryF', 'errorPixels', 'error'];

/** Returns the CSV text (header + rows, CRLF line ends as RFC 4180 has them). */
export function framesCsv(rows: FrameCsvRow[]): string {
  const lines = [CSV_COLUMNS.join(',')];
  for (const r of rows) lines.push(CSV_COLUMNS.map((c) => csvField(r[c])).join(','));
  return lines.join('\r\n') + '\r\n';
}

function p(v: number | null): string {
  return v === null ? '   —  ' : (v * 100).toFixed(2).padStart(6);
}

/** Returns the short summary table printed after scoring (per run: mIoU, band IoU at 3 px, BIoU, BF; worst frames; top suspects). */
export function summaryText(
  report: Pick<ScoreReport, 'frames'>, runs: Record<string, ScoreReport['dataset']>, worst: { run: string; name: string; meanIoU: number | null }[],
  suspects: { frame: string; run: string; bbox: number[]; score: number; reasons: string[] }[] = [],
): string {
  const lines: string[] = [];
  lines.push('run              mean IoU  band IoU@3px  Boundary IoU  Boundary F   (%)');
  for (const [run, d] of Object.entries(runs)) {
    const band3 = d.band.find((b) => b.width === 3)?.meanIoU ?? null;
    lines.push(`${termText(run).slice(0, 16).padEnd(16)} ${p(d.meanIoU)}     ${p(band3)}        ${p(d.boundaryIoU.mean)}      ${p(d.boundaryF.mean)}`);
  }
  if (worst.length) {
    lines.push('', `worst frames by mean IoU (${termText(worst[0].run)}):`);
    for (const w of worst) lines.push(`  ${termText(w.name).padEnd(24)} ${p(w.meanIoU)}`);
  }
  if (suspects.length) {
    lines.push('', 'likely label mistakes (best first):');
    for (const x of suspects) {
      lines.push(`  ${termText(x.frame).padEnd(16)} ${termText(x.run).slice(0, 12).padEnd(12)} [${x.bbox.join(',')}] ${x.score.toFixed(2)}  ${termText(x.reasons[0] ?? '')}`);
    }
  }
  const failed = report.frames.filter((f) => f.error);
  if (failed.length) {
    lines.push('', `${failed.length} frame${failed.length === 1 ? '' : 's'} failed:`);
    for (const f of failed.slice(0, 10)) lines.push(`  ${termText(f.error ?? '')}`);
    if (failed.length > 10) lines.push(`  … and ${failed.length - 10} more (see the report)`);
  }
  return lines.join('\n') + '\n';
}
