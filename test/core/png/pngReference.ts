// A deliberately plain PNG reader for the fuzz tests, written from the W3C PNG specification
// (ISO/IEC 15948) on node:zlib: chunks and CRCs §5.3, IHDR §11.2.2, filters §9.2, Adam7 §8.2 (the
// 8×8 pass pattern), sample packing §7.2. It shares no code with src/core/png and answers what a
// file holds with the leniencies src/core/png documents taken into account: bytes after IEND,
// ancillary chunks (tRNS included) and chunk order are ignored, a palette index may lie past the
// palette's end (index = id), image data past the image's end is ignored. It does not check the
// Adler-32 (src/core/png does): it is only asked what a file that src/core/png accepted holds.
import { constants, crc32, inflateRawSync } from 'node:zlib';

/** What a PNG holds per pixel: gray sample, palette index, or 0xRRGGBB (alpha dropped). */
export interface ReferenceImage {
  width: number;
  height: number;
  colorType: number;
  bitDepth: number;
  /** Flat r,g,b of the last PLTE chunk, or null. */
  plte: Uint8Array | null;
  values: number[];
}

const ALLOWED: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };
const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };
const PATTERN = ['16462646', '77777777', '56565656', '77777777', '36463646', '77777777', '56565656', '77777777'];

/** Returns the inflated stream's first `need` bytes, ignoring what follows (a damaged tail included), or fewer if it holds fewer. */
function inflatePrefix(deflate: Buffer, need: number): Buffer {
  const sync = { finishFlush: constants.Z_SYNC_FLUSH };
  // Doubling prefixes: a stream that inflates to far more than needed is never inflated whole.
  for (let len = 1024; ; len *= 2) {
    const part = deflate.subarray(0, len);
    let out: Buffer;
    try {
      out = inflateRawSync(part, sync);
    } catch {
      // The damage lies inside this prefix: find the longest prefix that still inflates.
      let lo = 0, hi = part.length;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        try {
          inflateRawSync(part.subarray(0, mid), sync);
          lo = mid;
        } catch {
          hi = mid;
        }
      }
      return inflateRawSync(part.subarray(0, lo), sync);
    }
    if (out.length >= need || len >= deflate.length) return out;
  }
}

function paeth(a: number, b: number, c: number): number {
  const p = a + b - c, pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/** Returns the sub-image's pixel positions in row order for pass 1..7, or every position for pass 0. */
function passPositions(width: number, height: number, pass: number): { rows: [number, number][][] } {
  const rows: [number, number][][] = [];
  for (let y = 0; y < height; y++) {
    const row: [number, number][] = [];
    for (let x = 0; x < width; x++) if (pass === 0 || Number(PATTERN[y % 8][x % 8]) === pass) row.push([x, y]);
    if (row.length > 0) rows.push(row);
  }
  return { rows };
}

/** Returns what the file holds, or a short reason it holds no complete image. */
export function referenceDecode(png: Uint8Array): ReferenceImage | string {
  const b = Buffer.from(png.buffer, png.byteOffset, png.byteLength);
  if (b.length < 8 || b.readUInt32BE(0) !== 0x89504e47 || b.readUInt32BE(4) !== 0x0d0a1a0a) return 'signature';
  const idat: Buffer[] = [];
  let plte: Buffer | null = null;
  let ihdr: Buffer | null = null;
  let ended = false;
  for (let off = 8; off + 12 <= b.length && !ended; ) {
    const length = b.readUInt32BE(off);
    if (length > 0x7fffffff || off + 12 + length > b.length) return 'chunk past the end';
    const type = b.toString('latin1', off + 4, off + 8);
    const data = b.subarray(off + 8, off + 8 + length);
    if (!/^[A-Za-z]{4}$/.test(type)) return 'bad chunk type';
    if ((crc32(b.subarray(off + 4, off + 8 + length)) >>> 0) !== b.readUInt32BE(off + 8 + length)) return `CRC of ${type}`;
    if (off === 8 && type !== 'IHDR') return 'IHDR not first';
    if (type === 'IHDR') {
      if (ihdr) return 'second IHDR';
      ihdr = data;
    } else if (type === 'IDAT') idat.push(data);
    else if (type === 'PLTE') plte = data;
    else if (type === 'IEND') ended = true;
    else if (type.charCodeAt(0) < 97) return `unknown critical chunk ${type}`;
    off += 12 + length;
  }
  if (!ended) return 'no IEND';
  if (!ihdr || ihdr.length !== 13) return 'IHDR length';
  const width = ihdr.readUInt32BE(0), height = ihdr.readUInt32BE(4);
  const bitDepth = ihdr[8], colorType = ihdr[9];
  if (!ALLOWED[colorType]?.includes(bitDepth) || ihdr[10] !== 0 || ihdr[11] !== 0 || ihdr[12] > 1) return 'IHDR fields';
  if (width === 0 || height === 0 || width > 0x7fffffff || height > 0x7fffffff) return 'IHDR size';
  if (width * height > 4_000_000) return 'too big for the reference';
  if (colorType === 3 && (!plte || plte.length === 0 || plte.length % 3 !== 0 || plte.length > 768)) return 'palette';
  if (plte && (plte.length === 0 || plte.length % 3 !== 0 || plte.length > 768)) return 'palette length';
  if (idat.length === 0) return 'no IDAT';
  const z = Buffer.concat(idat);
  if (z.length < 2 || (z[0] & 15) !== 8 || z[0] >> 4 > 7 || (z[0] * 256 + z[1]) % 31 !== 0 || z[1] & 32) return 'zlib header';
  const channels = CHANNELS[colorType];
  const bitsPerPixel = channels * bitDepth;
  const passes = ihdr[12] ? [1, 2, 3, 4, 5, 6, 7] : [0];
  const layouts = passes.map((p) => passPositions(width, height, p));
  let need = 0;
  for (const { rows } of layouts) for (const row of rows) need += 1 + Math.ceil((row.length * bitsPerPixel) / 8);
  const raw = inflatePrefix(z.subarray(2), need);
  if (raw.length < need) return 'image data too short';
  const values = new Array<number>(width * height).fill(0);
  const bpp = Math.max(1, bitsPerPixel / 8);
  let at = 0;
  for (const { rows } of layouts) {
    let prior: number[] | null = null;
    for (const row of rows) {
      const n = Math.ceil((row.length * bitsPerPixel) / 8);
      const type = raw[at];
      if (type > 4) return 'filter type';
      const line: number[] = [];
      for (let i = 0; i < n; i++) {
        const a = i >= bpp ? line[i - bpp] : 0, up = prior ? prior[i] : 0, c = prior && i >= bpp ? prior[i - bpp] : 0;
        const pred = [0, a, up, Math.floor((a + up) / 2), paeth(a, up, c)][type];
        line.push((raw[at + 1 + i] + pred) & 255);
      }
      at += 1 + n;
      prior = line;
      row.forEach(([x, y], k) => {
        const s: number[] = [];
        for (let ch = 0; ch < channels; ch++) {
          let v = 0;
          for (let bit = 0; bit < bitDepth; bit++) {
            const pos = (k * channels + ch) * bitDepth + bit;
            v = v * 2 + ((line[pos >> 3] >> (7 - (pos & 7))) & 1);
          }
          s.push(v);
        }
        values[y * width + x] = colorType === 2 || colorType === 6 ? s[0] * 65536 + s[1] * 256 + s[2] : s[0];
      });
    }
  }
  return { width, height, colorType, bitDepth, plte: plte ? new Uint8Array(plte) : null, values };
}
