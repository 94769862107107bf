// A zlib stream (RFC 1950) of deflate blocks (RFC 1951) with dynamic Huffman codes and no string
// matching. Photos with sensor noise give LZ77 almost nothing to match, so this is as small as a
// fast general compressor's output and several times quicker; it runs anywhere (browser, worker,
// Node). Hot loops: flat typed arrays, no allocation per byte.
import { adler32 } from '../core/png/adler32.ts';

/** Bytes coded under one Huffman table: big enough to amortise the table, small enough to follow the image. */
const BLOCK = 1 << 16;
/** Order in which code-length code lengths are sent (RFC 1951 §3.2.7). */
const CL_ORDER = [16, 17, 18, 0, 8, 7, 9, 6, 10, 5, 11, 4, 12, 3, 13, 2, 14, 1, 15];

/** Returns Huffman code lengths (at most `maxLen` bits) for `freq`; zero-frequency symbols get 0. */
export function huffmanLengths(freq: ArrayLike<number>, maxLen: number): Uint8Array {
  const n = freq.length;
  const f = Array.from(freq);
  for (;;) {
    const lengths = new Uint8Array(n);
    const used = f.map((v, s) => [v, s] as const).filter(([v]) => v > 0);
    if (used.length === 1) {
      lengths[used[0][1]] = 1;
      return lengths;
    }
    // two-queue Huffman construction over the symbols sorted by frequency
    used.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    const weight: number[] = used.map(([v]) => v);
    const parent: number[] = new Array(used.length).fill(-1);
    const merged: number[] = [];
    let i = 0;
    let j = 0;
    const take = () => {
      const m = merged.length;
      if (i < used.length && (j >= m || weight[i] <= weight[merged[j]])) return i++;
      return merged[j++];
    };
    while (used.length - i + merged.length - j > 1) {
      const a = take();
      const b = take();
      const node = weight.length;
      weight.push(weight[a] + weight[b]);
      parent.push(-1);
      parent[a] = node;
      parent[b] = node;
      merged.push(node);
    }
    let longest = 0;
    for (let k = 0; k < used.length; k++) {
      let d = 0;
      for (let p = parent[k]; p !== -1; p = parent[p]) d++;
      lengths[used[k][1]] = d;
      if (d > longest) longest = d;
    }
    if (longest <= maxLen) return lengths;
    // too deep: flatten the distribution and build again (rare; converges as frequencies even out)
    for (let s = 0; s < n; s++) if (f[s] > 0) f[s] = Math.max(1, f[s] >> 1);
  }
}

/** Returns the canonical codes of `lengths` (RFC 1951 §3.2.2), bit-reversed for LSB-first output. */
export function huffmanCodes(lengths: Uint8Array): Uint16Array {
  const count = new Uint16Array(16);
  for (const l of lengths) if (l) count[l]++;
  const next = new Uint16Array(16);
  let code = 0;
  for (let b = 1; b < 16; b++) {
    code = (code + count[b - 1]) << 1;
    next[b] = code;
  }
  const out = new Uint16Array(lengths.length);
  for (let s = 0; s < lengths.length; s++) {
    const l = lengths[s];
    if (!l) continue;
    let c = next[l]++;
    let r = 0;
    for (let k = 0; k < l; k++) (r = (r << 1) | (c & 1)), (c >>= 1);
    out[s] = r;
  }
  return out;
}

/** Returns the zlib stream of `data`: Huffman-coded literals only (deflate strategy "Huffman only"). */
export function zlibHuffmanOnly(data: Uint8Array): Uint8Array {
  const out = new Uint8Array(data.length * 2 + 1024); // ≤ 15 bits per byte plus block headers
  let pos = 2;
  out[0] = 0x78; // deflate, 32 KiB window
  out[1] = 0x01; // no dictionary, fastest; (0x78 * 256 + 0x01) % 31 === 0
  let bits = 0;
  let nbits = 0;
  const put = (value: number, n: number) => {
    bits |= value << nbits;
    nbits += n;
    while (nbits >= 8) {
      out[pos++] = bits & 255;
      bits >>>= 8;
      nbits -= 8;
    }
  };
  const freq = new Uint32Array(257);
  for (let start = 0; start < data.length || start === 0; start += BLOCK) {
    const end = Math.min(data.length, start + BLOCK);
    freq.fill(0);
    for (let i = start; i < end; i++) freq[data[i]]++;
    freq[256] = 1; // end of block
    if (end === start) freq[0] = 1; // an empty input still needs a complete two-symbol code
    const lit = huffmanLengths(freq, 15);
    const litCode = huffmanCodes(lit);
    // the code lengths: 257 literal/length codes, then one distance code of length 0 (none used)
    const seq = new Uint8Array(258);
    seq.set(lit);
    const clFreq = new Uint32Array(19);
    for (const l of seq) clFreq[l]++;
    if (clFreq.filter((v) => v > 0).length === 1) clFreq[seq[0] === 0 ? 1 : 0] = 1;
    const cl = huffmanLengths(clFreq, 7);
    const clCode = huffmanCodes(cl);
    let hclen = 19;
    while (hclen > 4 && cl[CL_ORDER[hclen - 1]] === 0) hclen--;
    put(end === data.length ? 1 : 0, 1); // BFINAL
    put(2, 2); // BTYPE: dynamic Huffman
    put(0, 5); // HLIT: 257 codes
    put(0, 5); // HDIST: 1 code
    put(hclen - 4, 4);
    for (let k = 0; k < hclen; k++) put(cl[CL_ORDER[k]], 3);
    for (const l of seq) put(clCode[l], cl[l]);
    // the hot loop: bit buffer in locals, whole bytes flushed at once
    let b = bits;
    let nb = nbits;
    let p = pos;
    for (let i = start; i < end; i++) {
      const sym = data[i];
      b |= litCode[sym] << nb;
      nb += lit[sym];
      if (nb >= 16) {
        out[p++] = b & 255;
        out[p++] = (b >>> 8) & 255;
        b >>>= 16;
        nb -= 16;
      }
    }
    bits = b;
    nbits = nb;
    pos = p;
    put(litCode[256], lit[256]);
    if (end === data.length) break;
  }
  if (nbits > 0) put(0, 8 - nbits);
  const a = adler32(data);
  out[pos++] = a >>> 24;
  out[pos++] = (a >>> 16) & 255;
  out[pos++] = (a >>> 8) & 255;
  out[pos++] = a & 255;
  return out.slice(0, pos);
}
