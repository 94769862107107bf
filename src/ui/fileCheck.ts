import { classTableFromText, classTableFind, classTableGenerated, type ClassTable } from '../core/classTable.ts';
import { labelMapIdCounts } from '../core/labelMap.ts';
import { labelMapFromPng, type LabelSourceEncoding } from '../core/png/decodeLabel.ts';
import { colorizeForPreview } from './previewColors.ts';

/** What the file check shows for one dropped label PNG. */
export interface FileCheckRow {
  file: string;
  bytes: number;
  error: string | null;
  width?: number;
  height?: number;
  encoding?: string;
  ids?: { id: number; count: number; name: string; color: string }[];
  preview?: ImageData;
}

/** Returns a short plain description of how a label PNG stores its ids. */
export function encodingDescribe(e: LabelSourceEncoding): string {
  switch (e.kind) {
    case 'gray':
      return `grayscale ${e.bitDepth}-bit`;
    case 'palette':
      return `palette ${e.bitDepth}-bit (${e.colors.length / 3} entries)`;
    case 'rgb':
      return 'colour-coded RGB';
  }
}

/** Decodes each dropped file (classes.json first, if present) and returns one row per label PNG. */
export async function filesCheck(files: File[], prior: ClassTable | null): Promise<{ table: ClassTable | null; tableError: string | null; rows: FileCheckRow[] }> {
  let table = prior;
  let tableError: string | null = null;
  const tableFile = files.find((f) => f.name.toLowerCase().endsWith('.json'));
  if (tableFile) {
    const r = classTableFromText(await tableFile.text(), tableFile.name);
    if (r.ok) table = r.value;
    else tableError = r.error;
  }
  const rows: FileCheckRow[] = [];
  for (const f of files) {
    if (f === tableFile) continue;
    const bytes = new Uint8Array(await f.arrayBuffer());
    const r = labelMapFromPng(bytes, { file: f.name, table: table ?? undefined });
    if (!r.ok) {
      rows.push({ file: f.name, bytes: bytes.length, error: r.error });
      continue;
    }
    const map = r.value;
    const shown = table ?? classTableGenerated(255);
    const ids = labelMapIdCounts(map).map(({ id, count }) => {
      const c = classTableFind(shown, id);
      const isVoid = id === shown.ignore;
      return { id, count, name: isVoid ? 'void' : (c?.name ?? 'not in table'), color: c?.color ?? (isVoid ? '#000000' : '#ff00ff') };
    });
    rows.push({
      file: f.name,
      bytes: bytes.length,
      error: null,
      width: map.width,
      height: map.height,
      encoding: encodingDescribe(map.encoding),
      ids,
      preview: colorizeForPreview(map, shown),
    });
  }
  return { table, tableError, rows };
}
