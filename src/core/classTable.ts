import { idPairsFromJson, type IdPairs } from './idMap.ts';
import { fail, ok, type Result } from './result.ts';

/** One class of a label map: its id, display name and `#rrggbb` colour. */
export interface ClassInfo {
  id: number;
  name: string;
  color: string;
}

/** The classes of a dataset, as read from `classes.json` or generated when there is none. */
export interface ClassTable {
  /** Ground-truth id that marks void pixels (left out of every score). */
  ignore: number;
  /** Colour meaning void in colour-coded (RGB) label maps, or null. */
  ignoreColor: string | null;
  /** Classes sorted by id. */
  classes: ClassInfo[];
  /** True when no table was given: ids are named by number, colours generated. */
  generated: boolean;
  /** Stored id → class id of ground-truth files (`"truthIds"`), or absent when truth stores class ids. */
  truthIds?: IdPairs | null;
  /** Stored id → class id of prediction files (`"predictionIds"`), or absent when predictions store class ids. */
  predictionIds?: IdPairs | null;
}

/** Largest id a class may have; 65535 is kept free so a 16-bit map always has an id outside the table. */
export const CLASS_ID_MAX = 65534;
/**
 * Most classes scored. Each frame keeps a band histogram of 65 widths per (truth, prediction) pair of
 * classes: 17 MB per frame at 256 classes (twice that in each run's dataset totals), so the limit
 * keeps memory bounded however many ids a hostile file holds.
 */
export const CLASSES_MAX = 256;
/** Longest class name kept (in characters); longer names are cut with "…". */
export const CLASS_NAME_MAX = 80;
/** Default void id (common practice for 8-bit label maps). */
export const DEFAULT_IGNORE = 255;

const COLOR_RE = /^#[0-9a-fA-F]{6}$/;

/** Returns the colour `#rrggbb` as a 24-bit integer 0xRRGGBB. */
export function colorToRgb24(color: string): number {
  return parseInt(color.slice(1), 16);
}

/** Returns the 24-bit integer 0xRRGGBB as `#rrggbb` (lower case). */
export function rgb24ToColor(rgb: number): string {
  return '#' + (rgb & 0xffffff).toString(16).padStart(6, '0');
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Characters that reorder or hide text (bidi controls) or are not text at all (control characters). */
// eslint-disable-next-line no-control-regex
const NAME_UNSAFE = /[\u0000-\u001f\u007f-\u009f\u061c\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g;

/** Returns a class name safe to show: bidi and control characters removed, trimmed, cut to CLASS_NAME_MAX characters. */
export function classNameClean(name: string): string {
  const chars = [...name.replace(NAME_UNSAFE, '').trim()];
  return chars.length > CLASS_NAME_MAX ? chars.slice(0, CLASS_NAME_MAX - 1).join('') + '…' : chars.join('');
}

function isIdInRange(v: unknown): v is number {
  return typeof v === 'number' && Number.isInteger(v) && v >= 0 && v <= CLASS_ID_MAX;
}

/** Returns a validated class table from the parsed JSON of `classes.json`, or the first problem found. */
export function classTableFromJson(json: unknown, file = 'classes.json'): Result<ClassTable> {
  if (!isPlainObject(json)) return fail(file, 'expected a JSON object with "ignore" and "classes"');
  // "ignore" may list several stored void ids: the first is the void id, the others map to it.
  const ignoreList = Array.isArray(json.ignore) ? json.ignore : [json.ignore ?? DEFAULT_IGNORE];
  if (ignoreList.length === 0) return fail(file, '"ignore" is an empty list; give the void id, or a list of them');
  for (const v of ignoreList) {
    if (typeof v !== 'number' || !Number.isInteger(v) || v < 0 || v > 65535) {
      return fail(file, `"ignore" must be an integer 0..65535 or a list of them, got ${JSON.stringify(json.ignore)}`);
    }
  }
  const ignore = ignoreList[0] as number;
  let ignoreColor: string | null = null;
  if (json.ignoreColor !== undefined && json.ignoreColor !== null) {
    if (typeof json.ignoreColor !== 'string' || !COLOR_RE.test(json.ignoreColor)) {
      return fail(file, `"ignoreColor" must be a colour like "#000000", got ${JSON.stringify(json.ignoreColor)}`);
    }
    ignoreColor = json.ignoreColor.toLowerCase();
  }
  if (!Array.isArray(json.classes)) return fail(file, '"classes" must be an array of { id, name, color }');
  if (json.classes.length === 0) return fail(file, '"classes" is empty: list at least one class');
  if (json.classes.length > CLASSES_MAX) {
    return fail(file, `lists ${json.classes.length} classes; at most ${CLASSES_MAX} are scored (every frame keeps counts for each pair of classes)`);
  }
  const classes: ClassInfo[] = [];
  const byId = new Map<number, number>();
  const byColor = new Map<string, number>();
  if (ignoreColor) byColor.set(ignoreColor, -1);
  for (let i = 0; i < json.classes.length; i++) {
    const c: unknown = json.classes[i];
    const where = `class #${i + 1}`;
    if (!isPlainObject(c)) return fail(file, `${where} must be an object { id, name, color }`);
    if (!isIdInRange(c.id)) {
      return fail(file, `${where} has id ${JSON.stringify(c.id)}; ids must be integers 0..${CLASS_ID_MAX}`);
    }
    const id = c.id;
    if (id === ignore) return fail(file, `${where} has id ${id}, which is the "ignore" (void) id`);
    if (byId.has(id)) return fail(file, `id ${id} is used twice (class #${byId.get(id)! + 1} and ${where})`);
    byId.set(id, i);
    const name = c.name === undefined ? String(id) : c.name;
    if (typeof name !== 'string' || classNameClean(name) === '') return fail(file, `${where} (id ${id}) needs a non-empty "name"`);
    if (typeof c.color !== 'string' || !COLOR_RE.test(c.color)) {
      return fail(file, `${where} (id ${id}) has colour ${JSON.stringify(c.color)}; use "#rrggbb"`);
    }
    const color = c.color.toLowerCase();
    const prior = byColor.get(color);
    if (prior !== undefined) {
      const other = prior === -1 ? '"ignoreColor"' : `class #${prior + 1}`;
      return fail(file, `colour ${color} is used twice (${other} and ${where}); colour-coded maps need unique colours`);
    }
    byColor.set(color, i);
    classes.push({ id, name: classNameClean(name), color });
  }
  classes.sort((a, b) => a.id - b.id);
  for (const v of ignoreList) {
    const clash = classes.find((c) => c.id === v);
    if (clash) return fail(file, `"ignore" lists ${v}, which is the id of class "${clash.name}"`);
  }
  const ids = new Set(classes.map((c) => c.id));
  const maps: { truthIds: IdPairs | null; predictionIds: IdPairs | null } = { truthIds: null, predictionIds: null };
  for (const key of ['truthIds', 'predictionIds'] as const) {
    if (json[key] === undefined || json[key] === null) continue;
    const r = idPairsFromJson(json[key], key, ids, file);
    if (!r.ok) return r;
    maps[key] = r.value;
  }
  const extraVoid = (ignoreList as number[]).slice(1);
  if (extraVoid.length) {
    // Without truthIds the truth stores class ids: the extra void ids join an identity map.
    const truth: IdPairs = maps.truthIds ?? [...classes.map((c): [number, number] => [c.id, c.id]), [ignore, null]];
    for (const v of extraVoid) if (!truth.some(([s]) => s === v)) truth.push([v, null]);
    maps.truthIds = truth.sort((a, b) => a[0] - b[0]);
  }
  return ok({ ignore, ignoreColor, classes, generated: false, ...maps });
}

/** Returns a validated class table parsed from the text of `classes.json`. */
export function classTableFromText(text: string, file = 'classes.json'): Result<ClassTable> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return fail(file, `is not valid JSON (${(e as Error).message})`);
  }
  return classTableFromJson(json, file);
}

/** Returns a generated table for ids 0..maxId (named by number, generated colours), `ignore` excluded. */
export function classTableGenerated(maxId: number, ignore = DEFAULT_IGNORE): ClassTable {
  const classes: ClassInfo[] = [];
  for (let id = 0; id <= maxId; id++) {
    if (id === ignore) continue;
    classes.push({ id, name: String(id), color: rgb24ToColor(paletteColor(id)) });
  }
  return { ignore, ignoreColor: null, classes, generated: true };
}

/**
 * Returns a deterministic 0xRRGGBB colour for `id`. Hues step by the golden angle so consecutive ids
 * land far apart on the colour wheel; lightness and saturation cycle on a different period so ids
 * whose hues come close again still differ in brightness.
 */
export function paletteColor(id: number): number {
  const h = (id * 137.50776405) % 360;
  const l = [0.52, 0.38, 0.66][id % 3];
  const s = [0.78, 0.62, 0.92, 0.7][id % 4];
  return hslToRgb24(h, s, l);
}

function hslToRgb24(h: number, s: number, l: number): number {
  const c = (1 - Math.abs(2 * l - 1)) * s;
  const hp = h / 60;
  const x = c * (1 - Math.abs((hp % 2) - 1));
  let r = 0, g = 0, b = 0;
  if (hp < 1) [r, g, b] = [c, x, 0];
  else if (hp < 2) [r, g, b] = [x, c, 0];
  else if (hp < 3) [r, g, b] = [0, c, x];
  else if (hp < 4) [r, g, b] = [0, x, c];
  else if (hp < 5) [r, g, b] = [x, 0, c];
  else [r, g, b] = [c, 0, x];
  const m = l - c / 2;
  const to = (v: number) => Math.round((v + m) * 255);
  return (to(r) << 16) | (to(g) << 8) | to(b);
}

/** Returns a map from 0xRRGGBB colour to class id (the ignore colour maps to `ignore`). */
export function classTableColorIndex(table: ClassTable): Map<number, number> {
  const index = new Map<number, number>();
  for (const c of table.classes) index.set(colorToRgb24(c.color), c.id);
  if (table.ignoreColor) index.set(colorToRgb24(table.ignoreColor), table.ignore);
  return index;
}

/** Returns the class with `id`, or undefined. */
export function classTableFind(table: ClassTable, id: number): ClassInfo | undefined {
  return table.classes.find((c) => c.id === id);
}

/** Returns the largest class id in the table (-1 when it has none). */
export function classTableMaxId(table: ClassTable): number {
  return table.classes.length ? table.classes[table.classes.length - 1].id : -1;
}
