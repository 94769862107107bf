// Seeded mutations of valid PNGs for the fuzz tests. Most work on chunks and rewrite every length and
// CRC afterwards, so the damage gets past the CRC check into inflate, unfiltering and unpacking; the
// "raw-" ones change the inflated image data and recompress it, so they reach unfiltering with a
// valid zlib stream. The "file-" ones damage the bytes as they are, CRCs left stale.
import { deflateSync } from 'node:zlib';
import { testChunkCrc, testChunksOf, testIdatStream, testPngOf, testRawOf, testWithIdat, type TestChunk } from './pngChunks.ts';

/** A mutant: its bytes and the mutations that made it, e.g. "chunk-flip IDAT + file-truncate". */
export interface Mutant {
  bytes: Uint8Array;
  ops: string;
}

type Rnd = () => number;
const int = (rnd: Rnd, n: number) => Math.floor(rnd() * n);
const pick = <T>(rnd: Rnd, list: readonly T[]): T => list[int(rnd, list.length)];

/** Returns a chunk index, IDAT and IHDR most often, since that is where decoding work happens. */
function chunkPick(rnd: Rnd, chunks: TestChunk[]): number {
  const wanted = pick(rnd, ['IDAT', 'IDAT', 'IHDR', 'PLTE', 'tRNS', 'any'] as const);
  const idx = chunks.map((c, i) => (wanted === 'any' || c.type === wanted ? i : -1)).filter((i) => i >= 0);
  return idx.length > 0 ? pick(rnd, idx) : int(rnd, chunks.length);
}

function withData(chunks: TestChunk[], i: number, data: Uint8Array): TestChunk[] {
  return chunks.map((c, k) => (k === i ? { type: c.type, data } : c));
}

function bitsFlip(rnd: Rnd, data: Uint8Array): Uint8Array {
  const out = data.slice();
  if (out.length === 0) return out;
  for (let n = 1 + int(rnd, 4); n > 0; n--) out[int(rnd, out.length)] ^= 1 << int(rnd, 8);
  return out;
}

function bytesOverwrite(rnd: Rnd, data: Uint8Array): Uint8Array {
  const out = data.slice();
  if (out.length === 0) return out;
  const at = int(rnd, out.length);
  for (let k = 0, n = 1 + int(rnd, 8); k < n && at + k < out.length; k++) out[at + k] = pick(rnd, [0, 0xff, 0x80, 0x7f, int(rnd, 256)]);
  return out;
}

function randomBytes(rnd: Rnd, n: number): Uint8Array {
  return Uint8Array.from({ length: n }, () => int(rnd, 256));
}

/** IHDR field values worth trying: PNG's limits, the pixel limit's edges, forbidden depth/type pairs. */
const SIZES = [0, 1, 2, 7, 255, 256, 4096, 10000, 10001, 60000, 65535, 65536, 0x7fffffff, 0x80000000, 0xffffffff];
const DEPTHS = [0, 1, 2, 3, 4, 5, 7, 8, 9, 12, 16, 24, 32, 255];
const TYPES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 16, 255];

function ihdrMutate(rnd: Rnd, ihdr: Uint8Array): { data: Uint8Array; what: string } {
  const d = Buffer.from(ihdr);
  const which = pick(rnd, ['width', 'height', 'size', 'depth', 'type', 'depth+type', 'interlace', 'method'] as const);
  if (which === 'width' || which === 'height') {
    const v = rnd() < 0.3 ? d.readUInt32BE(which === 'width' ? 0 : 4) + pick(rnd, [-1, 1, 2, 8]) : pick(rnd, SIZES);
    d.writeUInt32BE(v >>> 0, which === 'width' ? 0 : 4);
  } else if (which === 'size') {
    d.writeUInt32BE(pick(rnd, SIZES), 0);
    d.writeUInt32BE(pick(rnd, SIZES), 4);
  } else if (which === 'depth') d[8] = pick(rnd, DEPTHS);
  else if (which === 'type') d[9] = pick(rnd, TYPES);
  else if (which === 'depth+type') {
    d[8] = pick(rnd, DEPTHS);
    d[9] = pick(rnd, TYPES);
  } else if (which === 'interlace') d[12] = pick(rnd, [0, 1, 2, 255]);
  else d[pick(rnd, [10, 11])] = pick(rnd, [1, 8, 255]);
  return { data: new Uint8Array(d), what: `${which} → ${d.readUInt32BE(0)}×${d.readUInt32BE(4)} depth ${d[8]} type ${d[9]} interlace ${d[12]}` };
}

/** Returns the zlib stream of `raw` at a random level (0 = stored blocks), in 1 to 3 IDAT chunks. */
function recompressed(rnd: Rnd, chunks: TestChunk[], raw: Uint8Array): TestChunk[] {
  return testWithIdat(chunks, deflateSync(raw, { level: pick(rnd, [0, 1, 6, 9]) }), 1 + int(rnd, 3));
}

/** Returns the bytes per filtered row (filter byte included) of a non-interlaced image, or 0 when interlaced. */
function rowStride(ihdr: Uint8Array): number {
  const d = Buffer.from(ihdr);
  const channels: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };
  if (d.length !== 13 || d[12] !== 0 || !channels[d[9]]) return 0;
  return 1 + Math.ceil((d.readUInt32BE(0) * d[8] * channels[d[9]]) / 8);
}

/** The chunk-level mutations; each returns the new chunk list and a short description. */
const CHUNK_OPS: Record<string, (rnd: Rnd, c: TestChunk[]) => { chunks: TestChunk[]; what?: string }> = {
  'chunk-flip': (rnd, c) => {
    const i = chunkPick(rnd, c);
    return { chunks: withData(c, i, bitsFlip(rnd, c[i].data)), what: c[i].type };
  },
  'chunk-overwrite': (rnd, c) => {
    const i = chunkPick(rnd, c);
    return { chunks: withData(c, i, bytesOverwrite(rnd, c[i].data)), what: c[i].type };
  },
  'chunk-truncate': (rnd, c) => {
    const i = chunkPick(rnd, c);
    return { chunks: withData(c, i, c[i].data.subarray(0, int(rnd, c[i].data.length))), what: c[i].type };
  },
  'chunk-extend': (rnd, c) => {
    const i = chunkPick(rnd, c);
    const extra = rnd() < 0.5 ? new Uint8Array(1 + int(rnd, 64)) : randomBytes(rnd, 1 + int(rnd, 64));
    return { chunks: withData(c, i, Buffer.concat([c[i].data, extra])), what: c[i].type };
  },
  'ihdr-field': (rnd, c) => {
    if (c[0].type !== 'IHDR' || c[0].data.length !== 13) return { chunks: c, what: '(skipped: no IHDR first)' };
    const { data, what } = ihdrMutate(rnd, c[0].data);
    return { chunks: withData(c, 0, data), what };
  },
  'raw-flip': (rnd, c) => recompress(rnd, c, (raw) => (rnd() < 0.5 ? bitsFlip(rnd, raw) : bytesOverwrite(rnd, raw))),
  'raw-filter-type': (rnd, c) => {
    const stride = rowStride(c[0].data);
    return recompress(rnd, c, (raw) => {
      const out = raw.slice();
      const rows = stride > 0 ? Math.max(1, Math.floor(out.length / stride)) : 1;
      out[int(rnd, rows) * stride] = pick(rnd, [0, 1, 2, 3, 4, 5, 9, 128, 255]);
      return out;
    });
  },
  'raw-truncate': (rnd, c) => recompress(rnd, c, (raw) => raw.subarray(0, int(rnd, raw.length))),
  'raw-extend': (rnd, c) => recompress(rnd, c, (raw) => Buffer.concat([raw, rnd() < 0.5 ? new Uint8Array(1 + int(rnd, 2000)) : randomBytes(rnd, 1 + int(rnd, 2000))])),
  'zlib-header': (rnd, c) => {
    const z = Buffer.from(testIdatStream(c));
    const kind = pick(rnd, ['method', 'window', 'dictionary', 'check'] as const);
    if (kind === 'method') z[0] = (z[0] & 0xf0) | pick(rnd, [0, 7, 9, 15]);
    else if (kind === 'window') z[0] = (z[0] & 0x0f) | (pick(rnd, [8, 9, 15]) << 4);
    else if (kind === 'dictionary') z[1] |= 0x20;
    if (kind !== 'check') z[1] = (z[1] & 0xe0) | (31 - ((z[0] * 256 + (z[1] & 0xe0)) % 31)) % 31; // keep FCHECK right
    else z[1] ^= 1 + int(rnd, 31);
    return { chunks: testWithIdat(c, z, 1 + int(rnd, 2)), what: kind };
  },
  'zlib-tail': (rnd, c) => {
    const z = testIdatStream(c);
    const kind = pick(rnd, ['no-adler', 'half-adler', 'bad-adler', 'garbage-after'] as const);
    let out: Uint8Array = z;
    if (kind === 'no-adler') out = z.subarray(0, z.length - 4);
    else if (kind === 'half-adler') out = z.subarray(0, z.length - 2);
    else if (kind === 'bad-adler') out = Buffer.concat([z.subarray(0, z.length - 4), bitsFlip(rnd, z.subarray(z.length - 4))]);
    else out = Buffer.concat([z, randomBytes(rnd, 1 + int(rnd, 40))]);
    return { chunks: testWithIdat(c, out), what: kind };
  },
  'zlib-empty': (rnd, c) => {
    // A zlib header with no deflate data, with an empty stored block, or a complete empty stream.
    const stream = pick(rnd, [[0x78, 0x9c], [0x78, 0x9c, 0, 0, 0, 1], [0x78, 0x9c, 0x01, 0, 0, 0xff, 0xff, 0, 0, 0, 1], [0x78, 0x9c, 0x03, 0x00, 0, 0, 0, 1], []]);
    return { chunks: testWithIdat(c, new Uint8Array(stream)), what: stream.map((b) => b.toString(16)).join(' ') };
  },
  'chunk-duplicate': (rnd, c) => {
    const i = chunkPick(rnd, c);
    const at = 1 + int(rnd, c.length);
    return { chunks: [...c.slice(0, at), c[i], ...c.slice(at)], what: `${c[i].type} at ${at}` };
  },
  'chunk-remove': (rnd, c) => {
    const type = pick(rnd, ['IHDR', 'PLTE', 'IDAT', 'IEND', 'tRNS'] as const);
    return { chunks: c.filter((k) => k.type !== type), what: type };
  },
  'chunk-reorder': (rnd, c) => {
    const i = int(rnd, c.length);
    const moved = c[i];
    const rest = c.filter((_, k) => k !== i);
    const at = int(rnd, rest.length + 1);
    return { chunks: [...rest.slice(0, at), moved, ...rest.slice(at)], what: `${moved.type} to ${at}` };
  },
  'chunk-insert': (rnd, c) => {
    const type = pick(rnd, ['ZZZZ', 'IDAX', 'tEXt', 'prIv', 'zzzz', 'IDAT', 'IEND', 'PLTE', 'tRNS', 'a1b2', '\0\0\0\0']);
    const data = type === 'IDAT' || type === 'IEND' ? new Uint8Array(0) : randomBytes(rnd, pick(rnd, [0, 1, 3, 6, 30, 300]));
    const at = 1 + int(rnd, c.length);
    return { chunks: [...c.slice(0, at), { type, data }, ...c.slice(at)], what: `${JSON.stringify(type)} at ${at}` };
  },
  'idat-split': (rnd, c) => {
    const z = testIdatStream(c);
    const pieces = testWithIdat(c, z, pick(rnd, [2, 7, z.length]));
    // Sprinkle empty IDAT chunks between the pieces.
    const out: TestChunk[] = [];
    for (const k of pieces) {
      out.push(k);
      if (k.type === 'IDAT' && rnd() < 0.3) out.push({ type: 'IDAT', data: new Uint8Array(0) });
    }
    return { chunks: out };
  },
  'plte-short': (rnd, c) => {
    const i = c.findIndex((k) => k.type === 'PLTE');
    if (i < 0) return { chunks: c };
    const entries = Math.max(1, int(rnd, c[i].data.length / 3));
    return { chunks: withData(c, i, c[i].data.subarray(0, entries * 3)), what: `${entries} entries` };
  },
  'plte-length': (rnd, c) => {
    const n = pick(rnd, [0, 1, 2, 4, 765, 768, 769, 771, 3000]);
    const data = randomBytes(rnd, n);
    const i = c.findIndex((k) => k.type === 'PLTE');
    return { chunks: i >= 0 ? withData(c, i, data) : [c[0], { type: 'PLTE', data }, ...c.slice(1)], what: `${n} bytes` };
  },
  'trns-odd': (rnd, c) => {
    const data = randomBytes(rnd, pick(rnd, [0, 1, 2, 5, 6, 7, 257, 300]));
    const at = c.findIndex((k) => k.type === 'IDAT');
    return { chunks: [...c.slice(0, at).filter((k) => k.type !== 'tRNS'), { type: 'tRNS', data }, ...c.slice(at)], what: `${data.length} bytes` };
  },
  trailing: (_rnd, c) => ({ chunks: c, what: 'bytes after IEND' }),
};

/** Recompresses changed image data; leaves the chunks alone when an earlier mutation broke the stream. */
function recompress(rnd: Rnd, c: TestChunk[], change: (raw: Uint8Array) => Uint8Array): { chunks: TestChunk[]; what?: string } {
  let raw: Uint8Array;
  try {
    raw = testRawOf(c);
  } catch {
    return { chunks: c, what: '(skipped: stream already broken)' };
  }
  return { chunks: recompressed(rnd, c, change(raw)) };
}

/** The byte-level mutations on a whole file; CRCs are left as they are unless the op rewrites one. */
const FILE_OPS: Record<string, (rnd: Rnd, b: Uint8Array) => { bytes: Uint8Array; what?: string }> = {
  'file-flip': (rnd, b) => ({ bytes: bitsFlip(rnd, b) }),
  'file-overwrite': (rnd, b) => ({ bytes: bytesOverwrite(rnd, b) }),
  'file-truncate': (rnd, b) => {
    const n = int(rnd, b.length);
    return { bytes: b.slice(0, n), what: `at ${n}` };
  },
  'file-length-lie': (rnd, b) => lengthLie(rnd, b, false),
  'file-length-lie-crc': (rnd, b) => lengthLie(rnd, b, true),
};

/** Rewrites one chunk's length field; with `crc`, also writes a CRC valid for the lied extent where it fits. */
function lengthLie(rnd: Rnd, bytes: Uint8Array, crc: boolean): { bytes: Uint8Array; what: string } {
  const b = Buffer.from(bytes);
  const starts: number[] = [];
  for (let off = 8; off + 12 <= b.length; off += 12 + b.readUInt32BE(off)) starts.push(off);
  const off = pick(rnd, starts);
  const length = b.readUInt32BE(off);
  const lie = pick(rnd, [length + 1, length + 1 + int(rnd, 64), Math.max(0, length - 1 - int(rnd, 8)), 0, 0x80000000 + int(rnd, 1000), 0xffffffff, int(rnd, 0x100000000), b.length]) >>> 0;
  b.writeUInt32BE(lie, off);
  if (crc && off + 12 + lie <= b.length) b.writeUInt32BE(testChunkCrc(b.toString('latin1', off + 4, off + 8), b.subarray(off + 8, off + 8 + lie)), off + 8 + lie);
  return { bytes: new Uint8Array(b), what: `${b.toString('latin1', off + 4, off + 8)} ${length} → ${lie}` };
}

const CHUNK_NAMES = Object.keys(CHUNK_OPS);
const FILE_NAMES = Object.keys(FILE_OPS);

/**
 * Returns a mutant of a valid PNG: one or two chunk-level mutations (lengths and CRCs rewritten),
 * then, one time in four, a byte-level one on top; or a byte-level one alone one time in five.
 */
export function mutantMake(png: Uint8Array, rnd: Rnd): Mutant {
  let chunks = testChunksOf(png);
  const ops: string[] = [];
  let bytes: Uint8Array;
  if (rnd() < 0.2) bytes = png;
  else {
    for (let n = rnd() < 0.25 ? 2 : 1; n > 0; n--) {
      const name = pick(rnd, CHUNK_NAMES);
      const r = CHUNK_OPS[name](rnd, chunks);
      chunks = r.chunks;
      ops.push(r.what ? `${name} ${r.what}` : name);
    }
    bytes = testPngOf(chunks);
    if (ops.some((o) => o.startsWith('trailing'))) bytes = Buffer.concat([bytes, randomBytes(rnd, 1 + int(rnd, 100))]);
  }
  if (ops.length === 0 || rnd() < 0.25) {
    const name = pick(rnd, FILE_NAMES);
    const r = FILE_OPS[name](rnd, bytes);
    bytes = r.bytes;
    ops.push(r.what ? `${name} ${r.what}` : name);
  }
  return { bytes: new Uint8Array(bytes), ops: ops.join(' + ') };
}
