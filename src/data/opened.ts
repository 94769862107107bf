import type { ClassTable } from '../core/classTable.ts';
import { countText } from '../core/countText.ts';
import type { IdPairs } from '../core/idMap.ts';
import { groupChoiceText } from './labelGroups.ts';
import type { AmbiguousFile, Pairing, UnpairedFile } from './pairing.ts';

/** What was opened and how, for the user: the CLI report's `opened` block and the app's "opened" panel. */
export interface Opened {
  frames: number;
  runs: string[];
  /** Frames that have a photo. */
  photos: number;
  unpaired: UnpairedFile[];
  ambiguous: AmbiguousFile[];
  /** One line per folder holding several encodings of each frame: which was used and why. */
  groups: string[];
  /** One line per id map of the class table in use. */
  idMaps: string[];
  /** Things that make the scores mean less than they seem, or leave inputs out. */
  warnings: string[];
}

/** Returns "37 stored ids → 19 classes, 18 to void" for an id map. */
export function idPairsText(key: string, pairs: IdPairs): string {
  const toVoid = pairs.filter(([, c]) => c === null).length;
  const classes = new Set(pairs.flatMap(([, c]) => (c === null ? [] : [c]))).size;
  return `${key}: ${countText(pairs.length)} stored ids → ${countText(classes)} classes${toVoid ? `, ${countText(toVoid)} to void` : ''}`;
}

/** Returns the summary of a pairing and the class table it is read with; `warnings` adds later findings (id census, resizing). */
export function openedOf(pairing: Pairing, table: ClassTable | null, warnings: string[] = []): Opened {
  const idMaps: string[] = [];
  if (table?.truthIds) idMaps.push(idPairsText('truthIds', table.truthIds));
  if (table?.predictionIds) idMaps.push(idPairsText('predictionIds', table.predictionIds));
  return {
    frames: pairing.frames.length,
    runs: pairing.runs,
    photos: pairing.frames.filter((f) => f.image).length,
    unpaired: pairing.unpaired,
    ambiguous: pairing.ambiguous ?? [],
    groups: (pairing.groups ?? []).map(groupChoiceText),
    idMaps,
    warnings: [...(pairing.warnings ?? []), ...warnings],
  };
}

/** Returns "predictions/r/a/k.png could pair with truth/x/k.png or truth/y/k.png". */
export function ambiguityText(a: AmbiguousFile): string {
  return `${a.folder}/${a.file} could pair with ${a.candidates.join(' or ')}`;
}

/** Returns one line per unpaired file, the first `cap` of them, then a count of the rest. */
export function unpairedLines(unpaired: UnpairedFile[], cap = 20): string[] {
  const lines = unpaired.slice(0, cap).map((u) => `not paired: ${u.folder}/${u.file}: ${u.reason}`);
  if (unpaired.length > cap) lines.push(`… and ${countText(unpaired.length - cap)} more files not paired (all are listed in the report's "unpaired")`);
  return lines;
}

/** Returns the error for a dataset with files that could pair with more than one frame: the first 20 with their candidates. */
export function ambiguityMessage(ambiguous: AmbiguousFile[]): string {
  const shown = ambiguous.slice(0, 20).map((a) => `  ${ambiguityText(a)}`);
  const more = ambiguous.length > 20 ? [`  … and ${countText(ambiguous.length - 20)} more`] : [];
  return [
    `${countText(ambiguous.length)} file${ambiguous.length === 1 ? '' : 's'} could pair with more than one frame, so nothing was guessed:`,
    ...shown,
    ...more,
    'Give the frame keys with "pattern" in hairline.json, or rename or nest the files so each key is unique.',
  ].join('\n');
}
