import { argsParse, ignoreParse, runsParse, UsageError } from './args.ts';
import type { TileMode } from '../core/export/tileBoxes.ts';
import { tileModeCheck } from '../core/export/tileBoxes.ts';

/** Options of `npm run export`, validated. */
export interface ExportOptions {
  flags: string;
  truth: string;
  runs: { name: string; dir: string }[];
  images: string | null;
  classes: string | null;
  ignore: number | null;
  out: string;
  mode: TileMode;
  reasons: string[];
  frames: string[];
}

/** Context padding of crops when neither --padding nor --tile is given, pixels (common practice: enough to see the surroundings). */
export const EXPORT_PADDING_DEFAULT = 32;

export const EXPORT_USAGE = `usage: npm run export -- --flags flags.json --truth DIR [--pred [NAME=]DIR ...] [--images DIR]
       [--classes FILE] [--ignore N] --out tiles.zip [--padding N | --tile N] [--reason R ...] [--frame NAME ...]`;

/** Returns the exporter's options from argv, or throws UsageError naming the mistake. */
export function exportOptionsParse(argv: string[]): ExportOptions {
  const a = argsParse(argv, {
    flags: { kind: 'string' },
    truth: { kind: 'string' },
    pred: { kind: 'string', repeat: true },
    images: { kind: 'string' },
    classes: { kind: 'string' },
    ignore: { kind: 'number' },
    out: { kind: 'string' },
    padding: { kind: 'number' },
    tile: { kind: 'number' },
    reason: { kind: 'string', repeat: true },
    frame: { kind: 'string', repeat: true },
    help: { kind: 'flag' },
  });
  if (a.help) throw new UsageError(EXPORT_USAGE);
  if (a._.length) throw new UsageError(`unexpected argument "${a._[0]}"`);
  if (typeof a.flags !== 'string') throw new UsageError('--flags FILE is required (a flags file saved from the app)');
  if (typeof a.truth !== 'string') throw new UsageError('--truth DIR is required');
  if (typeof a.out !== 'string' || a.out.trim() === '') throw new UsageError('--out FILE is required (the ZIP to write)');
  const runs = runsParse(a.pred as string[] | undefined);
  const ignore = ignoreParse(a.ignore as number | undefined);
  if (a.padding !== undefined && a.tile !== undefined) throw new UsageError('give --padding N (crops) or --tile N (fixed tiles), not both');
  const mode: TileMode = a.tile !== undefined ? { kind: 'tile', size: a.tile as number } : { kind: 'crop', padding: (a.padding as number | undefined) ?? EXPORT_PADDING_DEFAULT };
  const checked = tileModeCheck(mode);
  if (!checked.ok) throw new UsageError(`--${mode.kind === 'tile' ? 'tile' : 'padding'}: ${checked.error}`);
  return {
    flags: a.flags, truth: a.truth, runs, images: (a.images as string | undefined) ?? null, classes: (a.classes as string | undefined) ?? null,
    ignore, out: a.out, mode: checked.value, reasons: (a.reason as string[] | undefined) ?? [], frames: (a.frame as string[] | undefined) ?? [],
  };
}
