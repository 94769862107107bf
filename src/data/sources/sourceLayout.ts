import { DESCRIPTION_FILE, descriptionFromText } from '../description.ts';
import { classTableFromText } from '../../core/classTable.ts';
import { dictCreate } from '../../core/dict.ts';
import { datasetPairProbed } from '../labelGroups.ts';
import type { Pairing } from '../pairing.ts';
import { layoutFromPaths, type DatasetLayout } from '../layout.ts';
import type { DatasetSource } from './source.ts';

/** A served or dropped root read as a dataset: its layout, and the texts of its class table and list file. */
export interface SourceLayout extends DatasetLayout {
  classesText: string | null;
  listText: string | null;
  /** The pairing made while opening, when a plain folder (no suffix groups) makes it final: reused, not made again. */
  paired?: Pairing;
}

/**
 * Returns the layout of a root from its file paths and hairline.json (if there is one), with the class
 * table and list file read; throws an Error whose message says what was expected and what was found
 * when the root is no dataset, or names the key of a bad description file.
 */
export async function sourceLayoutOpen(
  paths: string[], readText: (path: string) => Promise<string>, readBytes: (path: string) => Promise<Uint8Array>,
): Promise<SourceLayout> {
  let description = null;
  if (paths.includes(DESCRIPTION_FILE)) {
    const d = descriptionFromText(await readText(DESCRIPTION_FILE));
    if (!d.ok) throw new Error(d.error);
    description = d.value;
  }
  const layout = layoutFromPaths(paths, description);
  if (!layout.ok) throw new Error(layout.error);
  const { classesPath, listPath } = layout.value;
  const classesText = classesPath && paths.includes(classesPath) ? await readText(classesPath) : null;
  if (classesPath && classesText === null && description?.classes) throw new Error(`${DESCRIPTION_FILE}: "classes": ${classesPath} is not in the folder`);
  let listText: string | null = null;
  if (listPath) {
    if (!paths.includes(listPath)) throw new Error(`${DESCRIPTION_FILE}: "list": ${listPath} is not in the folder`);
    listText = await readText(listPath);
  }
  // Folders with several encodings per frame use the group whose first file decodes as label ids.
  const parsed = classesText === null ? null : classTableFromText(classesText, 'classes.json');
  const table = parsed?.ok ? parsed.value : null;
  const lay = layout.value;
  const probed = await datasetPairProbed(lay.listing, (folder, path) => readBytes(layoutPath(lay, folder, path)), table, table?.ignore ?? 255, lay.pair);
  const why: Record<string, string> = dictCreate();
  for (const g of probed.groups ?? []) {
    if (lay.pair.chosen?.[g.folder] !== undefined) continue;
    lay.pair.chosen = { ...lay.pair.chosen, [g.folder]: g.chosen };
    why[g.folder] = g.why;
  }
  // Pairing 10^5 files takes a while: without suffix groups the probe's pairing is the dataset's.
  const paired = (probed.groups ?? []).length === 0 ? probed : undefined;
  return { ...lay, pair: { ...lay.pair, why }, classesText, listText, paired };
}

/** Returns the path under the root of `path` inside a layout folder (`truth`, `predictions/<run>`, …). */
export function layoutPath(layout: Pick<DatasetLayout, 'dirs'>, folder: string, path: string): string {
  const dir = layout.dirs[folder];
  if (dir === undefined) throw new Error(`${folder}/${path}: no such folder in this dataset`);
  return dir === '' ? path : `${dir}/${path}`;
}

/** Returns the fields a served or dropped source takes from its layout. */
export function sourceFieldsOf(layout: SourceLayout): Pick<DatasetSource, 'listing' | 'classesText' | 'pair' | 'listText' | 'how' | 'paired'> {
  return { listing: layout.listing, classesText: layout.classesText, pair: layout.pair, listText: layout.listText, how: layout.how, paired: layout.paired };
}
