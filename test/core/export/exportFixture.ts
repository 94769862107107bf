// Three seeded frames whose label maps use every kind of source encoding the export must keep:
// gray 8, gray 16, 4-bit palette, 2-bit gray and colour-coded RGB, written by the test PNG writer
// (test/core/png/pngTestWriter.ts, from ISO/IEC 15948, sharing no code with src/core/png).
import type { ClassTable } from '../../../src/core/classTable.ts';
import { frameDecode } from '../../../src/core/decodedFrame.ts';
import type { TileExportSource } from '../../../src/core/export/tilesExport.ts';
import type { FrameFileReader } from '../../../src/core/frameFiles.ts';
import { fail, ok } from '../../../src/core/result.ts';
import { seededPalette, testTable } from '../png/fixtures.ts';
import { seededIds, seededRandom } from '../png/seeded.ts';
import { testPngWrite } from '../png/pngTestWriter.ts';

export const W = 97;
export const H = 61;
export const RUNS = ['run-a', 'run-b'];
export const TABLE: ClassTable = testTable([0, 1, 2, 3, 4], 11, 255, '#000000');
export const PALETTE16 = seededPalette(16, 5);
/** A frame name with a climbing path, a sub-folder, CJK, a comma, quotes and a control character. */
export const NASTY_FRAME = '../weird/名前, "x"\u0007';

export interface FixtureFrame {
  name: string;
  /** The ids as generated (what every crop must hold), row-major. */
  truth: number[];
  preds: Record<string, number[]>;
  truthPng: Uint8Array;
  predPngs: Record<string, Uint8Array>;
  photo: Uint8Array | null;
  /** Expected source / written encoding names of truth and runs. */
  encodings: Record<string, [string, string]>;
}

function idsFrom(list: number[], seed: number): number[] {
  return seededIds(W, H, list.length, seed, 9).map((i) => list[i]);
}

function gray(ids: number[], bitDepth: 2 | 8 | 16): Uint8Array {
  return testPngWrite({ width: W, height: H, colorType: 0, bitDepth, interlace: 0, samples: ids });
}

function rgb(ids: number[]): Uint8Array {
  const colour = new Map(TABLE.classes.map((c) => [c.id, parseInt(c.color.slice(1), 16)]));
  colour.set(255, 0x000000);
  const samples = ids.flatMap((id) => {
    const c = colour.get(id)!;
    return [c >> 16, (c >> 8) & 255, c & 255];
  });
  return testPngWrite({ width: W, height: H, colorType: 2, bitDepth: 8, interlace: 1, samples });
}

function photo(seed: number): Uint8Array {
  const rnd = seededRandom(seed);
  const p = new Uint8Array(W * H * 4);
  for (let i = 0; i < p.length; i++) p[i] = i % 4 === 3 ? 255 : Math.floor(rnd() * 256);
  return p;
}

/** Returns the three fixture frames. */
export function fixtureFrames(): FixtureFrame[] {
  const t1 = idsFrom([0, 1, 2, 3, 4, 255], 1);
  const a1 = idsFrom([0, 1, 2, 3, 4, 300, 1000], 2);
  const b1 = idsFrom([...Array(16).keys()], 3);
  const t2 = idsFrom([0, 1, 2, 3], 4);
  const a2 = idsFrom([0, 1, 2, 3, 4, 255], 5);
  const t3 = idsFrom([0, 1, 2, 3, 4, 255], 6);
  const a3 = idsFrom([0, 1, 2, 3, 4], 7);
  const b3 = idsFrom([0, 1, 2, 3, 4, 255], 8);
  return [
    {
      name: 'f-gray8', truth: t1, preds: { 'run-a': a1, 'run-b': b1 },
      truthPng: gray(t1, 8),
      predPngs: { 'run-a': gray(a1, 16), 'run-b': testPngWrite({ width: W, height: H, colorType: 3, bitDepth: 4, interlace: 0, samples: b1, plte: PALETTE16 }) },
      photo: photo(9), encodings: { truth: ['gray8', 'gray8'], 'run-a': ['gray16', 'gray16'], 'run-b': ['palette4', 'palette8'] },
    },
    {
      name: NASTY_FRAME, truth: t2, preds: { 'run-a': a2 },
      truthPng: gray(t2, 2), predPngs: { 'run-a': gray(a2, 8) },
      photo: null, encodings: { truth: ['gray2', 'gray8'], 'run-a': ['gray8', 'gray8'] },
    },
    {
      name: 'f-rgb', truth: t3, preds: { 'run-a': a3, 'run-b': b3 },
      truthPng: rgb(t3), predPngs: { 'run-a': rgb(a3), 'run-b': rgb(b3) },
      photo: photo(10), encodings: { truth: ['rgb', 'rgb'], 'run-a': ['rgb', 'rgb'], 'run-b': ['rgb', 'rgb'] },
    },
  ];
}

/** A fixture file: its name in messages and its bytes (null: the file cannot be read). */
interface MemoryFile {
  file: string;
  bytes: Uint8Array | null;
}

/**
 * Returns a source decoding the fixture's PNGs on each load through the app's and the CLI's frame
 * decoder (frameDecode), counting loads; photos are the fixture's RGBA as they are.
 */
export function fixtureSource(frames: FixtureFrame[], onLoad: (name: string) => void = () => {}): TileExportSource {
  const photos = new Map(frames.map((f) => [`images/${f.name}.png`, f.photo]));
  const reader: FrameFileReader<MemoryFile> = {
    bytes: async (m) => {
      if (!m.bytes) throw new Error('no such file');
      return m.bytes;
    },
    photo: async (m) => ok({ width: W, height: H, rgba: photos.get(m.file)! }),
  };
  return {
    async frameLoad(name) {
      onLoad(name);
      const f = frames.find((x) => x.name === name);
      if (!f) return fail(`truth/${name}.png`, 'no such file');
      return frameDecode({
        name,
        truth: { file: `truth/${name}.png`, bytes: f.truthPng },
        preds: RUNS.map((run) => ({ run, file: f.predPngs[run] ? { file: `${run}/${name}.png`, bytes: f.predPngs[run] } : null })),
        photo: f.photo ? { file: `images/${name}.png`, bytes: null } : null,
        table: TABLE,
      }, reader);
    },
  };
}
