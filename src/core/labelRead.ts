import type { ClassTable } from './classTable.ts';
import { idMapInvalidId, labelMapIdsMap, unmappedIdsText } from './idMap.ts';
import type { LabelIds } from './labelMap.ts';
import { labelMapFromPng, type DecodedLabelMap, type LabelDecodeOptions } from './png/decodeLabel.ts';
import { fail, ok, type Result } from './result.ts';

/** A decoded label map in class ids; `stored` holds the file's own ids when an id map changed them. */
export interface ReadLabelMap extends DecodedLabelMap {
  stored?: LabelIds;
  /** Why some pixels of a prediction count as wrong whatever the truth (stored ids the map does not list). */
  warning?: string;
}

/**
 * Returns a label PNG decoded and, when the class table has an id map for `role` (`truthIds` /
 * `predictionIds`), mapped to class ids. A ground truth with a stored id the map does not list is
 * an error naming the ids; in a prediction such pixels become an id that is no class (always wrong)
 * and the result carries a warning.
 */
export function labelMapRead(bytes: Uint8Array, options: LabelDecodeOptions & { role: 'truth' | 'prediction' }): Result<ReadLabelMap> {
  const r = labelMapFromPng(bytes, options);
  if (!r.ok) return r;
  const table: ClassTable | undefined = options.table;
  const pairs = options.role === 'truth' ? table?.truthIds : table?.predictionIds;
  // Colour-coded maps are read through the classes' colours, so they already hold class ids.
  if (!table || !pairs || r.value.encoding.kind === 'rgb') return r;
  const key = options.role === 'truth' ? 'truthIds' : 'predictionIds';
  const invalid = idMapInvalidId(table.classes.map((c) => c.id), table.ignore);
  const m = labelMapIdsMap(r.value, pairs, table.ignore, invalid);
  if (m.unmapped.length && options.role === 'truth') {
    return fail(options.file, `${unmappedIdsText(m.unmapped)} not listed in "${key}" of classes.json; add ${m.unmapped.length === 1 ? 'it' : 'them'} (null means void)`);
  }
  const out: ReadLabelMap = { width: m.width, height: m.height, ids: m.ids, stored: m.stored, encoding: r.value.encoding };
  if (m.unmapped.length) out.warning = `${options.file}: ${unmappedIdsText(m.unmapped)} not listed in "${key}" of classes.json; counted as wrong`;
  return ok(out);
}
