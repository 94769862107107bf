import { labelMapIdsCheck } from '../core/frameCheck.ts';
import { labelMapMaxId } from '../core/labelMap.ts';
import { labelMapRead } from '../core/labelRead.ts';
import { classTableGenerated, type ClassTable } from '../core/classTable.ts';
import { fileExt } from './frameKeys.ts';
import { datasetPair, type DatasetListing, type GroupChoice, type PairOptions, type Pairing } from './pairing.ts';

/** Reads the bytes of `path` inside `folder` (`truth`, `predictions/<run>`, …). */
export type FolderRead = (folder: string, path: string) => Promise<Uint8Array>;

/** What one suffix group's first file decodes as: a rank (lower is better) or why it cannot be a label map. */
interface GroupProbe {
  tail: string;
  rank: number;
  /** Plain words: "8-bit ids, all in the class table" or the reason it was passed over. */
  what: string;
}

function tailName(tail: string): string {
  return tail === '' ? '(no suffix)' : `"${tail}"`;
}

/** Returns how a sample file of a group decodes under the class table. */
async function groupProbe(folder: string, tail: string, sample: string, read: FolderRead, table: ClassTable | null, ignore: number): Promise<GroupProbe> {
  if (fileExt(sample) === '.json') return { tail, rank: Infinity, what: 'a JSON of shapes, not a label map' };
  let bytes: Uint8Array;
  try {
    bytes = await read(folder, sample);
  } catch (e) {
    return { tail, rank: Infinity, what: `${sample} could not be read (${(e as Error).message})` };
  }
  const t = table ?? classTableGenerated(-1, ignore);
  const role = folder === 'truth' ? 'truth' : 'prediction';
  const r = labelMapRead(bytes, { file: `${folder}/${sample}`, table: t, role });
  if (!r.ok) return { tail, rank: Infinity, what: r.error.replace(`${folder}/${sample}: `, '') };
  const enc = r.value.encoding;
  if (!t.generated) {
    const ids = labelMapIdsCheck(r.value, t, sample, 'truth');
    if (!ids.ok) return { tail, rank: Infinity, what: `ids not in the class table (${ids.error.replace(`${sample}: `, '')})` };
  }
  if (enc.kind === 'rgb') return { tail, rank: 2, what: 'colour-coded, every colour in the class table' };
  const maxId = labelMapMaxId({ ...r.value, ids: r.value.stored ?? r.value.ids });
  if (enc.kind === 'gray' && enc.bitDepth === 16) {
    // Without a class table, large 16-bit ids usually number instances (class × 1000 + instance), not classes.
    if (t.generated && maxId > 255) return { tail, rank: Infinity, what: `16-bit ids up to ${maxId}, which look like instance ids` };
    return { tail, rank: 1, what: `16-bit ids up to ${maxId}${t.generated ? '' : ', all in the class table'}` };
  }
  return { tail, rank: 0, what: `${enc.kind === 'palette' ? 'palette' : `${enc.bitDepth}-bit`} ids up to ${maxId}${t.generated ? '' : ', all in the class table'}` };
}

/**
 * Returns the dataset paired by frame key, with each folder that holds several encodings of a frame
 * (suffix groups) using the group whose first file decodes as label ids under the class table; the
 * choice and the reasons for passing the others over are in `groups[].why`. Groups named in `chosen`
 * (from the description file) are used as given.
 */
export async function datasetPairProbed(
  listing: DatasetListing, read: FolderRead, table: ClassTable | null, ignore: number, options: PairOptions = {},
): Promise<Pairing> {
  const chosen = options.chosen ?? {};
  const first = datasetPair(listing, options);
  const picks: Record<string, string> = { ...chosen };
  const whys = new Map<string, string>();
  for (const g of first.groups ?? []) {
    if (chosen[g.folder] !== undefined || g.folder === 'images') continue;
    const probes = await Promise.all(g.groups.map((x) => groupProbe(g.folder, x.tail, x.sample, read, table, ignore)));
    const best = [...probes].sort((a, b) => a.rank - b.rank)[0];
    const usable = best.rank < Infinity;
    if (usable) picks[g.folder] = best.tail;
    const lines = probes.map((p) => `${tailName(p.tail)}: ${p.what}`);
    whys.set(
      g.folder,
      usable
        ? `using ${tailName(best.tail)} (${best.what}); ${lines.filter((_, i) => probes[i] !== best).join('; ')}`
        : `no group decodes as label ids (${lines.join('; ')}); using the largest`,
    );
  }
  const paired = whys.size ? datasetPair(listing, { ...options, chosen: picks }) : first;
  paired.groups = (paired.groups ?? []).map((g): GroupChoice => ({ ...g, why: whys.get(g.folder) ?? g.why }));
  return paired;
}

/** Returns one line per suffix-group choice: the folder, the groups, the one used and why, and how to choose another. */
export function groupChoiceText(g: GroupChoice): string {
  const names = g.groups.map((x) => `${tailName(x.tail)} (${x.files} files)`).join(', ');
  return `${g.folder}: several encodings of each frame: ${names}; ${g.why}. To use another, set "suffix" for this folder in hairline.json`;
}
