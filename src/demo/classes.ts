import { classTableFromJson, colorToRgb24, type ClassTable } from '../core/classTable.ts';

/** Class ids of the Kestrel Quay demo. */
export const DEMO_CLASS = {
  sky: 0,
  water: 1,
  quay: 2,
  rail: 3,
  container: 4,
  crane: 5,
  truck: 6,
  person: 7,
  bollard: 8,
  lightMast: 9,
  building: 10,
  vegetation: 11,
} as const;

/** Void id of the demo's ground truth (the vehicle's hood and unlabelled clutter). */
export const DEMO_IGNORE = 255;

/** Number of classes in the demo table (ids 0..DEMO_CLASS_COUNT-1). */
export const DEMO_CLASS_COUNT = 12;

// Our own palette: hues spread around the wheel, with lightness chosen so neighbours in a typical
// frame (sky/water, quay/rail, container/building, crane/mast) stay apart even for weak colour vision.
const DEMO_CLASSES = [
  { id: 0, name: 'sky', color: '#9cc8ea' },
  { id: 1, name: 'water', color: '#245e8f' },
  { id: 2, name: 'quay', color: '#a39d92' },
  { id: 3, name: 'rail', color: '#5c3f73' },
  { id: 4, name: 'container', color: '#d9733b' },
  { id: 5, name: 'crane', color: '#f2c230' },
  { id: 6, name: 'truck', color: '#2fa39a' },
  { id: 7, name: 'person', color: '#e8467c' },
  { id: 8, name: 'bollard', color: '#f7f07a' },
  { id: 9, name: 'light mast', color: '#a27be0' },
  { id: 10, name: 'building', color: '#7d5b45' },
  { id: 11, name: 'vegetation', color: '#4f9a50' },
] as const;

/** Returns the parsed JSON object written to the demo's `classes.json`. */
export function demoClassesJson(): { ignore: number; classes: { id: number; name: string; color: string }[] } {
  return { ignore: DEMO_IGNORE, classes: DEMO_CLASSES.map((c) => ({ ...c })) };
}

/** Returns the demo's class table, validated by the same parser users' `classes.json` goes through. */
export function demoClassTable(): ClassTable {
  const parsed = classTableFromJson(demoClassesJson(), 'classes.json (demo)');
  if (!parsed.ok) throw new Error(parsed.error); // a bug in the table above, not user input
  return parsed.value;
}

/** Returns a flat r,g,b palette of `entries` colours: class colours first, then greys for other ids. */
export function demoPalette(entries: number): Uint8Array {
  const out = new Uint8Array(entries * 3);
  for (let id = 0; id < entries; id++) {
    const rgb = id < DEMO_CLASSES.length ? colorToRgb24(DEMO_CLASSES[id].color) : 0x404040 + (id % 8) * 0x101010;
    out[id * 3] = (rgb >> 16) & 255;
    out[id * 3 + 1] = (rgb >> 8) & 255;
    out[id * 3 + 2] = rgb & 255;
  }
  return out;
}
