// Every file of the kept malformed-PNG corpus (corpus/README.md says what each is) decodes to the
// outcome named there: a per-frame error of the right kind naming the file, or the image the
// independent reader (pngReference.ts) sees. Photo decoding and the frame job must not throw on any.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { classTableGenerated } from '../../../src/core/classTable.ts';
import { frameJobScore } from '../../../src/core/frameJob.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../../src/core/metrics/settings.ts';
import { labelMapFromPng, type DecodedLabelMap } from '../../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { referenceDecode } from './pngReference.ts';
import { pngPlatformInflateUse } from '../../../src/core/png/inflate.ts';
import { nodeInflate } from '../../../src/cli/nodeInflate.ts';

const DIR = join(import.meta.dirname, 'corpus');

/** What each corpus file must give: an error matching the pattern, or a decode passing the check. */
const EXPECTED: Record<string, RegExp | ((map: DecodedLabelMap) => void)> = {
  'empty-deflate.png': /is truncated or damaged: its compressed image data stops before the image is complete$/,
  'zlib-header-only.png': /is truncated or damaged: its compressed image data stops before the image is complete$/,
  'corrupt-stream-valid-crc.png': /is damaged: its image data fails its checksum \(Adler-32\)/,
  'bad-adler-only.png': /is damaged: its image data fails its checksum \(Adler-32\)/,
  'stored-blocks-extra-data.png': (m) => expect([m.width, m.height, m.encoding]).toEqual([21, 14, { kind: 'gray', bitDepth: 16 }]),
  'iend-between-idats.png': /is truncated or damaged: its compressed image data stops before its end$/,
  'stream-cut-after-image.png': /is truncated or damaged: its compressed image data stops before its end$/,
  'deflate-bomb-64mib.png': (m) => expect([m.width, m.height, m.ids.every((v) => v === 0)]).toEqual([100, 100, true]),
  'at-limit-tiny-data.png': /is damaged: its 12 bytes of compressed image data cannot hold the 100,010,000 bytes the image needs$/,
  'just-over-limit.png': /is 10,001×10,000 pixels \(100,010,000 pixels\), above the limit of 100,000,000 pixels; refusing to decode it$/,
  'huge-60000x60000.png': /is 60,000×60,000 pixels \(3,600 megapixels\), above the limit of 100 megapixels/,
  'length-negative.png': /is damaged: its IDAT chunk at byte 33 claims 2,147,483,651 bytes, above PNG's limit of 2\^31−1$/,
  'length-past-end.png': /is truncated: its IDAT chunk needs \d+ bytes but the file ends after \d+$/,
  'length-short-crc-fixed.png': /is damaged: garbage where a chunk should start at byte \d+/,
  'ihdr-twice.png': /is damaged: it has a second IHDR header$/,
  'iend-missing.png': /is truncated: the file ends before its end marker \(IEND\)/,
  'idat-before-plte.png': (m) => expect(m.encoding.kind).toBe('palette'),
  'palette-index-past-end.png': (m) => {
    // Index = id (src/docs/metrics.md): indices past the 5 colours are kept as ids, not clamped or refused.
    expect(m.encoding.kind === 'palette' && m.encoding.colors.length).toBe(15);
    expect(Math.max(...m.ids)).toBeGreaterThan(4);
  },
  'filter-type-5.png': /is damaged: image row data uses unknown filter type 5 \(PNG has 0 to 4\)$/,
  'image-data-short.png': /is damaged: its image data holds 150 bytes, the image needs 210$/,
  'rgb-4-bit.png': /is damaged: bit depth 4 is not allowed for RGB PNGs \(allowed: 8, 16\)$/,
  'zlib-dictionary.png': /cannot be decompressed \(invalid zlib data: need dictionary\)$/,
  'invalid-distance.png': /cannot be decompressed \(invalid distance\)$/,
  'unknown-critical-chunk.png': /uses a "ZZZZ" chunk that is needed to read the image but is not part of PNG/,
  'plte-769-bytes.png': /is damaged: its palette \(PLTE\) has 769 bytes; PNG needs 3 per colour, 1 to 256 colours$/,
  'ids-900-no-table.png': (m) => expect([m.width, m.height, new Set(m.ids).size]).toEqual([30, 30, 900]),
};

/** Files that decode but whose frame job, scored without a class table, fails: the message it must give. */
const JOB_ERROR: Record<string, RegExp> = {
  'ids-900-no-table.png': /^truth\/ids-900-no-table\.png: 900 distinct ids in this frame's ground truth and predictions and no classes\.json; at most 256 classes are scored/,
};

const files = readdirSync(DIR).filter((f) => f.endsWith('.png')).sort();

describe('malformed PNG corpus', () => {
  it('every file has an expected outcome and a README line, and every one named exists', () => {
    const readme = readFileSync(join(DIR, 'README.md'), 'utf8');
    const listed = [...readme.matchAll(/^- `([^`]+\.png)` — /gm)].map((m) => m[1]).sort();
    expect(listed).toEqual(files);
    expect(Object.keys(EXPECTED).sort()).toEqual(files);
  });

  for (const name of files) {
    it(name, () => {
      const bytes = new Uint8Array(readFileSync(join(DIR, name)));
      const file = `truth/${name}`;
      const r = labelMapFromPng(bytes, { file });
      // With node:zlib's inflate first (the command line's threads): the same outcome, byte for byte.
      pngPlatformInflateUse(nodeInflate);
      const native = labelMapFromPng(bytes, { file });
      pngPlatformInflateUse(null);
      expect(native.ok ? Array.from(native.value.ids) : native.error).toEqual(r.ok ? Array.from(r.value.ids) : r.error);
      const want = EXPECTED[name];
      if (want instanceof RegExp) {
        expect(r.ok ? 'decoded' : r.error).toMatch(new RegExp(`^truth/${name.replace('.', '\\.')}: `));
        expect(r.ok ? 'decoded' : r.error).toMatch(want);
      } else {
        if (!r.ok) throw new Error(r.error);
        want(r.value);
        // Whatever was read is what the independent reader sees in the file.
        const ref = referenceDecode(bytes);
        if (typeof ref === 'string') throw new Error(`the reference refuses ${name}: ${ref}`);
        expect(Array.from(r.value.ids)).toEqual(ref.values);
      }
      const photo = photoFromPng(bytes, { file });
      expect(photo.ok || photo.error.startsWith(`${file}: `)).toBe(true);
      // As truth and as prediction against itself: the decoder's own message, or scores.
      const res = frameJobScore({ name, truth: { file, bytes }, preds: [{ run: 'r', file: { file: `predictions/r/${name}`, bytes } }], table: classTableGenerated(-1, 255), settings: DEFAULT_SCORE_SETTINGS });
      const jobError = JOB_ERROR[name];
      if (jobError) expect(res.error).toMatch(jobError);
      else expect(res.error).toBe(r.ok ? null : r.error);
      expect(res.runs[0].stats !== null).toBe(r.ok && !jobError);
    });
  }
});
