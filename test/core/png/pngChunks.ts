// Chunk-level access to PNG files for the fuzz tests, written from ISO/IEC 15948 §5.3 on node:zlib;
// it shares no code with src/core/png, so a bug there cannot hide the same bug here.
import { crc32, deflateRawSync, constants, inflateSync } from 'node:zlib';
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

/**
 * Returns a zlib stream (RFC 1950) that inflates to `megabytes` MiB of zeros, at close to deflate's
 * limit of about 1032:1: one raw deflate piece for 1 MiB of zeros ending in a sync flush (a non-final
 * block; RFC 1951 §3.2.3), repeated — its back-references only ever reach zeros — then an empty final
 * fixed-Huffman block and the true Adler-32.
 */
export function testDeflateBomb(megabytes: number): Uint8Array {
  const piece = deflateRawSync(Buffer.alloc(1 << 20), { level: 9, finishFlush: constants.Z_SYNC_FLUSH });
  const total = megabytes * (1 << 20);
  const adler = Buffer.alloc(4);
  adler.writeUInt32BE(adler32OfZeros(total));
  // 0x78 0xda: deflate, 32K window, level 9; 0x03 0x00: BFINAL=1, BTYPE=01, then end-of-block (7 zero bits).
  return new Uint8Array(Buffer.concat([Buffer.from([0x78, 0xda]), ...Array.from({ length: megabytes }, () => piece), Buffer.from([0x03, 0x00]), adler]));
}
