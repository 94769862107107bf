// A deliberately plain PNG writer for tests, written from the W3C PNG specification (ISO/IEC 15948):
// chunk layout §5.3, sample packing §7.2, Adam7 §8.2 (the 8×8 pass pattern, not a step table),
// filters §9.2. It shares no code with src/core/png; zlib and CRC-32 come from node:zlib.
import { crc32, deflateSync } from 'node:zlib';

/** Adam7 pass number (1..7) of each pixel position modulo 8, as printed in ISO/IEC 15948 §8.2. */
const ADAM7_PATTERN = [
  [1, 6, 4, 6, 2, 6, 4, 6],
  [7, 7, 7, 7, 7, 7, 7, 7],
  [5, 6, 5, 6, 5, 6, 5, 6],
  [7, 7, 7, 7, 7, 7, 7, 7],
  [3, 6, 4, 6, 3, 6, 4, 6],
  [7, 7, 7, 7, 7, 7, 7, 7],
  [5, 6, 5, 6, 5, 6, 5, 6],
  [7, 7, 7, 7, 7, 7, 7, 7],
];

const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

export interface TestPngSpec {
  width: number;
  height: number;
  colorType: 0 | 2 | 3 | 4 | 6;
  bitDepth: 1 | 2 | 4 | 8 | 16;
  interlace: 0 | 1;
  /** width*height*channels sample values, row-major. */
  samples: ArrayLike<number>;
  plte?: Uint8Array;
  trns?: Uint8Array;
  /** Split the zlib stream over this many IDAT chunks (default 1). */
  idatPieces?: number;
}

/** Returns a PNG chunk: length, type, data, CRC-32 of type+data. */
export function testChunk(type: string, data: Uint8Array): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, 'latin1');
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])) >>> 0, 0);
  return Buffer.concat([head, data, crc]);
}

/** Returns the PNG signature followed by the given chunks. */
export function testPngFromChunks(chunks: Buffer[]): Uint8Array {
  return new Uint8Array(Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), ...chunks]));
}

/** Returns the 13-byte IHDR payload. */
export function testIhdr(width: number, height: number, bitDepth: number, colorType: number, interlace: number): Buffer {
  const b = Buffer.alloc(13);
  b.writeUInt32BE(width, 0);
  b.writeUInt32BE(height, 4);
  b[8] = bitDepth;
  b[9] = colorType;
  b[12] = interlace;
  return b;
}

/** Packs one scanline of pixels (each a list of channel samples) MSB-first into bytes. */
function packRow(pixels: number[][], bitDepth: number): number[] {
  const bits: number[] = [];
  for (const px of pixels) {
    for (const s of px) for (let b = bitDepth - 1; b >= 0; b--) bits.push((s >> b) & 1);
  }
  while (bits.length % 8 !== 0) bits.push(0);
  const out: number[] = [];
  for (let i = 0; i < bits.length; i += 8) {
    let v = 0;
    for (let k = 0; k < 8; k++) v = (v << 1) | bits[i + k];
    out.push(v);
  }
  return out;
}

function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
  if (pa <= pb && pa <= pc) return a;
  return pb <= pc ? b : c;
}

/** Filters a list of packed rows, cycling filter types 0..4 row by row so every one is exercised. */
function filterRows(rows: number[][], bytesPerPixel: number, firstType: number): number[] {
  const out: number[] = [];
  rows.forEach((row, y) => {
    const type = (firstType + y) % 5;
    const prior = y > 0 ? rows[y - 1] : row.map(() => 0);
    out.push(type);
    row.forEach((x, i) => {
      const a = i >= bytesPerPixel ? row[i - bytesPerPixel] : 0;
      const b = prior[i];
      const c = i >= bytesPerPixel ? prior[i - bytesPerPixel] : 0;
      const pred = [0, a, b, Math.floor((a + b) / 2), paeth(a, b, c)][type];
      out.push((x - pred + 256) & 255);
    });
  });
  return out;
}

/** Returns the raw (filtered, uncompressed) image data for a spec. */
export function testRawImageData(spec: TestPngSpec): Buffer {
  const { width, height, bitDepth, interlace, samples } = spec;
  const ch = CHANNELS[spec.colorType];
  const bytesPerPixel = Math.max(1, (ch * bitDepth) / 8);
  const pixel = (x: number, y: number) => {
    const px: number[] = [];
    for (let c = 0; c < ch; c++) px.push(samples[(y * width + x) * ch + c]);
    return px;
  };
  const passes = interlace ? [1, 2, 3, 4, 5, 6, 7] : [0];
  const out: number[] = [];
  for (const pass of passes) {
    const rows: number[][] = [];
    for (let y = 0; y < height; y++) {
      const row: number[][] = [];
      for (let x = 0; x < width; x++) if (pass === 0 || ADAM7_PATTERN[y % 8][x % 8] === pass) row.push(pixel(x, y));
      if (row.length > 0) rows.push(packRow(row, bitDepth));
    }
    // A pass with no pixels contributes nothing at all, not even filter bytes (§8.2).
    for (const b of filterRows(rows, bytesPerPixel, pass)) out.push(b);
  }
  return Buffer.from(out);
}

/** Returns a complete PNG file for a spec. */
export function testPngWrite(spec: TestPngSpec): Uint8Array {
  const z = deflateSync(testRawImageData(spec));
  const pieces = spec.idatPieces ?? 1;
  const chunks = [testChunk('IHDR', testIhdr(spec.width, spec.height, spec.bitDepth, spec.colorType, spec.interlace))];
  if (spec.plte) chunks.push(testChunk('PLTE', spec.plte));
  if (spec.trns) chunks.push(testChunk('tRNS', spec.trns));
  const step = Math.ceil(z.length / pieces);
  for (let i = 0; i < z.length; i += step) chunks.push(testChunk('IDAT', z.subarray(i, i + step)));
  chunks.push(testChunk('IEND', new Uint8Array(0)));
  return testPngFromChunks(chunks);
}
