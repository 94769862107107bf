// Valid label PNGs of every kind the decoder reads, the starting points of the fuzz mutants. Each
// base keeps the ids it was written from, so a mutant that still decodes can be checked exactly.
import { classTableGenerated, colorToRgb24, type ClassTable } from '../../../src/core/classTable.ts';
import { labelMapToPng } from '../../../src/core/png/encode.ts';
import { seededPalette, testTable } from './fixtures.ts';
import { testPngWrite, type TestPngSpec } from './pngTestWriter.ts';
import { seededIds } from './seeded.ts';

/** One valid label PNG: its bytes, the ids it holds, and the class table to decode it with. */
export interface FuzzBase {
  name: string;
  bytes: Uint8Array;
  width: number;
  height: number;
  ids: number[];
  table: ClassTable;
  /** Flat r,g,b palette for palette files, else null. */
  plte: Uint8Array | null;
}

/** Classes of the colour-coded bases: ids 1..12 plus void 255 drawn in #000000. */
const RGB_IDS = Array.from({ length: 12 }, (_, i) => i + 1);
/** The class table the colour-coded bases are written with. */
export const FUZZ_RGB_TABLE = testTable(RGB_IDS, 61, 255, '#000000');
/** The table used when a dataset has no classes.json (ids named by number). */
const GENERATED = classTableGenerated(-1, 255);

function grayOrPalette(name: string, spec: Omit<TestPngSpec, 'samples'>, seed: number): FuzzBase {
  const { width, height, bitDepth, colorType } = spec;
  const count = colorType === 3 ? Math.min(2 ** bitDepth, 256) : Math.min(2 ** bitDepth, 65536);
  const ids = seededIds(width, height, count, seed, 6);
  const plte = colorType === 3 ? seededPalette(count, seed) : null;
  const bytes = testPngWrite({ ...spec, samples: ids, plte: plte ?? undefined });
  return { name, bytes, width, height, ids, table: GENERATED, plte };
}

function colourCoded(name: string, spec: Omit<TestPngSpec, 'samples'>, seed: number): FuzzBase {
  const { width, height, colorType } = spec;
  const all = [...RGB_IDS, 255];
  const ids = seededIds(width, height, all.length, seed, 6).map((j) => all[j]);
  const samples: number[] = [];
  for (const id of ids) {
    const c = id === 255 ? 0 : colorToRgb24(FUZZ_RGB_TABLE.classes.find((k) => k.id === id)!.color);
    samples.push(c >> 16, (c >> 8) & 255, c & 255);
    if (colorType === 6) samples.push(200);
  }
  return { name, bytes: testPngWrite({ ...spec, samples }), width, height, ids, table: FUZZ_RGB_TABLE, plte: null };
}

/**
 * Returns the fuzz bases: gray 1/2/4/8/16, palette 1/2/4/8, RGB and RGBA colour-coded, plain and
 * Adam7, some split over several IDAT chunks or with tRNS, from the test writer (shares no code with
 * src/core/png), plus gray 8/16 and palette files from our own encoder; sizes include 1×1, one row
 * and one column, so Adam7 passes are empty and rows end mid-byte.
 */
export function fuzzBases(): FuzzBase[] {
  const out: FuzzBase[] = [];
  const sizes: [number, number][] = [[13, 7], [1, 1], [9, 1], [1, 9], [33, 17]];
  let seed = 1;
  for (const bitDepth of [1, 2, 4, 8, 16] as const) {
    for (const interlace of [0, 1] as const) {
      const [width, height] = sizes[(bitDepth + interlace) % sizes.length];
      const spec = { width, height, colorType: 0 as const, bitDepth, interlace, idatPieces: 1 + (seed % 3) };
      out.push(grayOrPalette(`gray${bitDepth}${interlace ? '-adam7' : ''} ${width}×${height}`, spec, seed++));
    }
  }
  for (const bitDepth of [1, 2, 4, 8] as const) {
    for (const interlace of [0, 1] as const) {
      const [width, height] = sizes[(bitDepth + interlace + 2) % sizes.length];
      const spec = { width, height, colorType: 3 as const, bitDepth, interlace, idatPieces: 1 + (seed % 2) };
      const base = grayOrPalette(`palette${bitDepth}${interlace ? '-adam7' : ''} ${width}×${height}`, spec, seed++);
      out.push(base);
    }
  }
  // A palette file with tRNS, for the tRNS mutations.
  const trnsSpec = { width: 20, height: 11, colorType: 3 as const, bitDepth: 4 as const, interlace: 0 as const };
  const trnsIds = seededIds(20, 11, 16, 99, 6);
  const trnsPlte = seededPalette(16, 99);
  out.push({
    name: 'palette4+tRNS 20×11', width: 20, height: 11, ids: trnsIds, table: GENERATED, plte: trnsPlte,
    bytes: testPngWrite({ ...trnsSpec, samples: trnsIds, plte: trnsPlte, trns: new Uint8Array([0, 128, 255, 7]) }),
  });
  for (const colorType of [2, 6] as const) {
    for (const interlace of [0, 1] as const) {
      const spec = { width: 17, height: 12, colorType, bitDepth: 8 as const, interlace, idatPieces: 2 };
      out.push(colourCoded(`${colorType === 2 ? 'rgb' : 'rgba'}${interlace ? '-adam7' : ''} 17×12`, spec, seed++));
    }
  }
  // Our own encoder (Up filter, fflate deflate).
  const own = (name: string, width: number, height: number, count: number, enc: Parameters<typeof labelMapToPng>[1]) => {
    const ids = seededIds(width, height, count, seed++, 8);
    const bytes = labelMapToPng({ width, height, ids: count > 256 ? Uint16Array.from(ids) : Uint8Array.from(ids) }, enc);
    const plte = enc.kind === 'palette' ? enc.colors : null;
    out.push({ name, bytes, width, height, ids, table: GENERATED, plte });
  };
  own('encoder gray8 40×25', 40, 25, 30, { kind: 'gray', bitDepth: 8 });
  own('encoder gray16 21×14', 21, 14, 1000, { kind: 'gray', bitDepth: 16 });
  own('encoder palette 29×16', 29, 16, 40, { kind: 'palette', colors: seededPalette(40, 7) });
  return out;
}
