// Chunk-level access to PNG files for the fuzz tests, written from ISO/IEC 15948 §5.3 on node:zlib;
// it shares no code with src/core/png, so a bug there cannot hide the same bug here.
import { crc32, inflateSync } from 'node:zlib';
import { testChunk, testPngFromChunks } from './pngTestWriter.ts';

/** One chunk of a PNG: its four-byte type (latin1) and data. */
export interface TestChunk {
  type: string;
  data: Uint8Array;
}

/** Returns the chunks of a well-formed PNG in file order (IEND included); throws on a malformed one. */
export function testChunksOf(png: Uint8Array): TestChunk[] {
  const b = Buffer.from(png.buffer, png.byteOffset, png.byteLength);
  const out: TestChunk[] = [];
  for (let off = 8; off < b.length; ) {
    const length = b.readUInt32BE(off);
    if (off + 12 + length > b.length) throw new Error(`testChunksOf: chunk at ${off} runs past the end`);
    out.push({ type: b.toString('latin1', off + 4, off + 8), data: new Uint8Array(b.subarray(off + 8, off + 8 + length)) });
    off += 12 + length;
  }
  return out;
}

/** Returns a PNG file of these chunks, each with its true length and CRC-32. */
export function testPngOf(chunks: TestChunk[]): Uint8Array {
  return testPngFromChunks(chunks.map((c) => testChunk(c.type, c.data)));
}

/** Returns the CRC-32 (node:zlib) of a chunk's type and data, as PNG stores it after the data. */
export function testChunkCrc(type: string, data: Uint8Array): number {
  return crc32(Buffer.concat([Buffer.from(type, 'latin1'), data])) >>> 0;
}

/** Returns the concatenated IDAT data (the zlib stream) of a chunk list. */
export function testIdatStream(chunks: TestChunk[]): Buffer {
  return Buffer.concat(chunks.filter((c) => c.type === 'IDAT').map((c) => c.data));
}

/** Returns the inflated (filtered, uncompressed) image data of a valid PNG's chunks (node:zlib inflateSync). */
export function testRawOf(chunks: TestChunk[]): Buffer {
  return inflateSync(testIdatStream(chunks));
}

/** Returns the chunks with every IDAT replaced by `stream` split into `pieces` IDAT chunks where the first IDAT was. */
export function testWithIdat(chunks: TestChunk[], stream: Uint8Array, pieces = 1): TestChunk[] {
  const at = chunks.findIndex((c) => c.type === 'IDAT');
  const rest = chunks.filter((c) => c.type !== 'IDAT');
  const step = Math.max(1, Math.ceil(stream.length / pieces));
  const idats: TestChunk[] = [];
  for (let i = 0; i < stream.length; i += step) idats.push({ type: 'IDAT', data: stream.subarray(i, i + step) });
  if (idats.length === 0) idats.push({ type: 'IDAT', data: new Uint8Array(0) });
  const insertAt = at < 0 ? rest.length - 1 : at;
  return [...rest.slice(0, insertAt), ...idats, ...rest.slice(insertAt)];
}

/** Returns the Adler-32 (RFC 1950 §8.2) of `count` zero bytes: a stays 1, b grows by 1 per byte. */
function adler32OfZeros(count: number): number {
  return (((count % 65521) << 16) | 1) >>> 0;
}

/** A bit writer for deflate (RFC 1951 §3.1.1): values LSB first, Huffman codes most significant bit first. */
function bitWriter() {
  const bytes: number[] = [];
  let bit = 0;
  const put = (b: number) => {
    if (bit === 0) bytes.push(0);
    bytes[bytes.length - 1] |= b << bit;
    bit = (bit + 1) & 7;
  };
  return {
    bytes,
    aligned: () => bit === 0,
    value: (v: number, n: number) => { for (let i = 0; i < n; i++) put((v >> i) & 1); },
    code: (c: number, n: number) => { for (let i = n - 1; i >= 0; i--) put((c >> i) & 1); },
  };
}

/**
 * Returns a zlib stream (RFC 1950) that inflates to `megabytes` MiB of zeros at deflate's limit of
 * 1032:1, in one final dynamic-Huffman block (RFC 1951 §3.2.7) with three length/literal codes —
 * 285 (a 258-byte copy) in 1 bit, literal 0 and end-of-block in 2 — and one 1-bit distance code
 * (distance 1). Both 1-bit codes are 0, so after a literal 0 the copies are nothing but zero bits:
 * 4 copies (1,032 bytes of output) per zero byte of stream.
 */
export function testDeflateBomb(megabytes: number): Uint8Array {
  const total = megabytes * (1 << 20);
  const w = bitWriter();
  w.value(1, 1); // BFINAL
  w.value(2, 2); // BTYPE 10: dynamic Huffman
  w.value(286 - 257, 5); // HLIT: 286 length/literal codes
  w.value(0, 5); // HDIST: 1 distance code
  w.value(18 - 4, 4); // HCLEN: 18 code length code lengths, in the order of §3.2.7
  const clLengths: Record<number, number> = { 18: 1, 1: 2, 2: 2 }; // canonical codes: 18 → 0, 1 → 10, 2 → 11
  for (const sym of [16, 17, 18, 0, 8, 7, 9, 6, 10, 5, 11, 4, 12, 3, 13, 2, 14, 1]) w.value(clLengths[sym] ?? 0, 3);
  const length1 = () => w.code(2, 2), length2 = () => w.code(3, 2);
  const zeros = (n: number) => { w.code(0, 1); w.value(n - 11, 7); };
  length2(); // literal 0
  zeros(138); zeros(117); // literals 1..255: unused
  length2(); // 256, end-of-block
  zeros(28); // 257..284: unused
  length1(); // 285, a copy of 258 bytes
  length1(); // distance code 0 (distance 1)
  // Canonical codes: 285 → 0, literal 0 → 10, end-of-block → 11; distance 0 → 0.
  w.code(2, 2); // literal 0
  const copies = Math.floor((total - 1) / 258);
  let zeroBits = 2 * copies;
  for (; zeroBits > 0 && !w.aligned(); zeroBits--) w.value(0, 1);
  const body = Math.floor(zeroBits / 8);
  // Still mid-byte only when the copies ran out first (body is then 0): finish in the same writer.
  const tail = w.aligned() ? bitWriter() : w;
  tail.value(0, zeroBits - 8 * body);
  for (let i = total - 1 - 258 * copies; i > 0; i--) tail.code(2, 2); // the last few zeros as literals
  tail.code(3, 2); // end-of-block
  const adler = Buffer.alloc(4);
  adler.writeUInt32BE(adler32OfZeros(total));
  const rest = tail === w ? [] : [Buffer.alloc(body), Buffer.from(tail.bytes)];
  return new Uint8Array(Buffer.concat([Buffer.from([0x78, 0xda]), Buffer.from(w.bytes), ...rest, adler]));
}
