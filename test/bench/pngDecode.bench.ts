// Decode timings of label PNGs at 2048×1024 (run: npx tsx test/bench/pngDecode.bench.ts).
// Compares labelMapFromPng with upng-js as shipped (pako inflate) and with its inflate swapped for
// fflate's, and with pngjs, on procedurally made label maps (Voronoi regions, 30 classes + void).
import { PNG } from 'pngjs';
import UPNG from 'upng-js';
import { unzlibSync } from 'fflate';
import { classTableFromJson } from '../../src/core/classTable.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { labelMapToPng, rgbaToPng } from '../../src/core/png/encode.ts';
import { photoFromPng } from '../../src/core/png/decodePhoto.ts';
import { testPngWrite } from '../core/png/pngTestWriter.ts';
import { seededColors } from '../core/png/fixtures.ts';
import { seededRandom } from '../core/png/seeded.ts';

const W = 2048, H = 1024, CLASSES = 30;
const rnd = seededRandom(42);
const seeds = Array.from({ length: 120 }, () => ({ x: rnd() * W, y: rnd() * H, id: Math.floor(rnd() * (CLASSES + 1)) }));
const ids = new Uint8Array(W * H);
for (let y = 0; y < H; y++) {
  for (let x = 0; x < W; x++) {
    let best = 0, bd = Infinity;
    for (let s = 0; s < seeds.length; s++) {
      const dx = seeds[s].x - x, dy = seeds[s].y - y, d = dx * dx + dy * dy;
      if (d < bd) { bd = d; best = s; }
    }
    const id = seeds[best].id;
    ids[y * W + x] = id === CLASSES ? 255 : id;
  }
}
const colors = seededColors(CLASSES, 7, [0]);
const table = (() => {
  const r = classTableFromJson({ ignore: 255, ignoreColor: '#000000', classes: colors.map((c, id) => ({ id, name: `c${id}`, color: '#' + c.toString(16).padStart(6, '0') })) });
  if (!r.ok) throw new Error(r.error);
  return r.value;
})();
const rgbOf = (id: number) => (id === 255 ? 0 : colors[id]);
const rgba = new Uint8Array(W * H * 4);
for (let i = 0; i < ids.length; i++) {
  const c = rgbOf(ids[i]);
  rgba[i * 4] = c >> 16; rgba[i * 4 + 1] = (c >> 8) & 255; rgba[i * 4 + 2] = c & 255; rgba[i * 4 + 3] = 255;
}
const ids16 = Uint16Array.from(ids, (v) => v * 257);
const palette = new Uint8Array(768);
colors.forEach((c, i) => palette.set([c >> 16, (c >> 8) & 255, c & 255], i * 3));

const rgbSamples = (withAlpha: boolean) => {
  const ch = withAlpha ? 4 : 3, s = new Uint8Array(W * H * ch);
  for (let i = 0; i < ids.length; i++) { s[i * ch] = rgba[i * 4]; s[i * ch + 1] = rgba[i * 4 + 1]; s[i * ch + 2] = rgba[i * 4 + 2]; if (withAlpha) s[i * ch + 3] = 200; }
  return s;
};
const files: [string, Uint8Array][] = [
  ['gray 8', labelMapToPng({ width: W, height: H, ids }, { kind: 'gray', bitDepth: 8 })],
  ['gray 8 pngjs', new Uint8Array(PNG.sync.write(Object.assign(new PNG({ width: W, height: H }), { data: Buffer.from(ids) }), { colorType: 0, inputColorType: 0, inputHasAlpha: false } as never))],
  ['gray 16', labelMapToPng({ width: W, height: H, ids: ids16 }, { kind: 'gray', bitDepth: 16 })],
  ['palette 8', labelMapToPng({ width: W, height: H, ids }, { kind: 'palette', colors: palette })],
  ['RGB 8', rgbaToPng(W, H, rgba)],
  ['RGBA 8', testPngWrite({ width: W, height: H, colorType: 6, bitDepth: 8, interlace: 0, samples: rgbSamples(true) })],
  ['gray 8 Adam7', testPngWrite({ width: W, height: H, colorType: 0, bitDepth: 8, interlace: 1, samples: ids })],
  ['RGB 8 Adam7', testPngWrite({ width: W, height: H, colorType: 2, bitDepth: 8, interlace: 1, samples: rgbSamples(false) })],
];

function median(f: () => void, runs = 9): number {
  const t: number[] = [];
  for (let i = 0; i < runs; i++) { const s = performance.now(); f(); t.push(performance.now() - s); }
  return t.sort((a, b) => a - b)[runs >> 1];
}
const upng = UPNG as unknown as { decode: ((b: ArrayBuffer) => unknown) & { _inflate: (d: Uint8Array) => Uint8Array } };
const pakoInflate = upng.decode._inflate;
const fflateInflate = (d: Uint8Array) => unzlibSync(d);

console.log(`label PNG decode at ${W}×${H}, median of 9 (ms)`);
console.log('variant        | KB    | labelMapFromPng | upng (pako) | upng (fflate) | pngjs');
for (const [name, bytes] of files) {
  const r = labelMapFromPng(bytes, { file: name, table });
  if (!r.ok) throw new Error(r.error);
  const want = name.startsWith('gray 16') ? ids16 : ids;
  for (let i = 0; i < want.length; i++) if (r.value.ids[i] !== want[i]) throw new Error(`${name}: pixel ${i} wrong`);
  const ours = median(() => labelMapFromPng(bytes, { file: name, table }));
  upng.decode._inflate = pakoInflate;
  const pako = median(() => upng.decode(bytes.slice().buffer));
  upng.decode._inflate = fflateInflate;
  const ffl = median(() => upng.decode(bytes.slice().buffer));
  upng.decode._inflate = pakoInflate;
  const pj = median(() => PNG.sync.read(Buffer.from(bytes), { skipRescale: true } as never), 5);
  const f = (n: number) => n.toFixed(1).padStart(6);
  console.log(`${name.padEnd(14)} | ${String(Math.round(bytes.length / 1024)).padStart(5)} | ${f(ours)}          | ${f(pako)}      | ${f(ffl)}        | ${f(pj)}`);
}
const photo = files[3][1];
console.log(`photoFromPng RGB 8 → RGBA: ${median(() => photoFromPng(photo, { file: 'p' })).toFixed(1)} ms`);
console.log(`labelMapToPng gray 8: ${median(() => labelMapToPng({ width: W, height: H, ids }, { kind: 'gray', bitDepth: 8 }), 5).toFixed(1)} ms`);
console.log(`rgbaToPng RGB: ${median(() => rgbaToPng(W, H, rgba), 3).toFixed(1)} ms`);
