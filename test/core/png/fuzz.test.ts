// Seeded fuzzing of the label decoder, the photo decoder and the frame scoring job. Every mutant must
// give a per-frame error naming its file, or exactly the image an independent reader (pngReference.ts,
// on node:zlib) sees in it; never a throw, a hang or a memory blow-up. The time and memory bounds are
// hang and bomb guards, far above normal costs, not speed checks (those live in test/bench/).
import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { classTableColorIndex, classTableGenerated } from '../../../src/core/classTable.ts';
import { frameJobScore, type FrameJobResult } from '../../../src/core/frameJob.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../../src/core/metrics/settings.ts';
import { labelMapFromPng, type DecodedLabelMap } from '../../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { pngRawSize } from '../../../src/core/png/adam7.ts';
import { labelMapToPng } from '../../../src/core/png/encode.ts';
import { pngBitsPerPixel, pngHeaderRead } from '../../../src/core/png/header.ts';
import { pngInflate, pngPlatformInflateUse } from '../../../src/core/png/inflate.ts';
import { nodeInflate } from '../../../src/cli/nodeInflate.ts';
import { type Result } from '../../../src/core/result.ts';
import { FUZZ_RGB_TABLE, fuzzBases, type FuzzBase } from './fuzzBases.ts';
import { testChunksOf, testDeflateBomb } from './pngChunks.ts';
import { mutantMake, type Mutant } from './pngMutate.ts';
import { referenceDecode } from './pngReference.ts';
import { callTimed, errorClass, memoryWatch } from './fuzzWatch.ts';
import { testChunk, testIhdr, testPngFromChunks } from './pngTestWriter.ts';
import { seededRandom } from './seeded.ts';

const SEED = 15948;
const MUTANTS = 1500;
/** A hang guard for one call on a loaded 2-core machine; normal decodes here take well under 50 ms. */
const CALL_MS_MAX = 2000;
/** Peak memory growth allowed over the whole run: far below what one decoded bomb would take. */
const RSS_GROWTH_MAX = 300 * 2 ** 20;

const bases = fuzzBases();
const rnd = seededRandom(SEED);
const mutants: { base: FuzzBase; m: Mutant; file: string }[] = Array.from({ length: MUTANTS }, (_, i) => {
  const base = bases[i % bases.length];
  return { base, m: mutantMake(base.bytes, rnd), file: `truth/fuzz-${i}.png` };
});
const decoded: Result<DecodedLabelMap>[] = [];

/** Returns a description of how `map` differs from what the reference reader sees in `bytes`, or ''. */
function referenceMismatch(map: DecodedLabelMap, base: FuzzBase, bytes: Uint8Array): string {
  const ref = referenceDecode(bytes);
  if (typeof ref === 'string') {
    // node:zlib refuses some streams fflate reads (e.g. a stored block whose NLEN is not ~LEN); ours
    // checked the Adler-32 of what it read, so such a file must hold exactly its original image.
    const same = map.width === base.width && map.height === base.height && map.ids.every((v, p) => v === base.ids[p]);
    return same ? '' : `reference refuses (${ref}) but ours decoded a changed image`;
  }
  if (ref.width !== map.width || ref.height !== map.height) return `size ${map.width}×${map.height}, reference ${ref.width}×${ref.height}`;
  const colour = ref.colorType === 2 || ref.colorType === 6;
  const index = classTableColorIndex(base.table);
  for (let p = 0; p < ref.values.length; p++) {
    const want = colour ? index.get(ref.values[p]) : ref.values[p];
    if (map.ids[p] !== want) return `pixel ${p}: ours ${map.ids[p]}, reference ${want}`;
  }
  if (map.encoding.kind === 'palette' && ref.plte && !map.encoding.colors.every((c, k) => c === ref.plte![k])) return 'palette colours differ';
  return '';
}

describe(`fuzz: ${MUTANTS} mutants of ${bases.length} valid label PNGs (seed ${SEED})`, () => {
  it('the reference reader and pngjs agree on every base, and labelMapFromPng decodes each exactly', () => {
    for (const base of bases) {
      const ref = referenceDecode(base.bytes);
      if (typeof ref === 'string') throw new Error(`${base.name}: reference refuses a valid base (${ref})`);
      const map = labelMapFromPng(base.bytes, { file: base.name, table: base.table });
      if (!map.ok) throw new Error(map.error);
      expect(Array.from(map.value.ids), base.name).toEqual(base.ids);
      expect(referenceMismatch(map.value, base, base.bytes), base.name).toBe('');
    }
  });

  it('labelMapFromPng: an error naming the file or the image the reference sees; no throw, hang or blow-up', () => {
    const problems: string[] = [];
    const classes = new Map<string, number>();
    const memory = memoryWatch();
    let slowest = { ms: 0, what: '' }, okChanged = 0;
    mutants.forEach(({ base, m, file }, i) => {
      const { value: r, ms, thrown } = callTimed(() => labelMapFromPng(m.bytes, { file, table: base.table }));
      memory.sample();
      if (ms > slowest.ms) slowest = { ms, what: `#${i} ${base.name}: ${m.ops}` };
      if (ms > CALL_MS_MAX) problems.push(`#${i} took ${ms.toFixed(0)} ms: ${m.ops}`);
      if (!r) return void problems.push(`#${i} threw ${thrown}: ${base.name}: ${m.ops}`);
      decoded[i] = r;
      if (!r.ok) {
        if (!r.error.startsWith(`${file}: `)) problems.push(`#${i} message does not start with the file: ${r.error}`);
        classes.set(errorClass(r.error), (classes.get(errorClass(r.error)) ?? 0) + 1);
        return;
      }
      const wrong = referenceMismatch(r.value, base, m.bytes);
      if (wrong) problems.push(`#${i} ${base.name}: ${m.ops}: ${wrong}`);
      if (r.value.ids.some((v, p) => v !== base.ids[p]) || r.value.ids.length !== base.ids.length) okChanged++;
    });
    expect(problems).toEqual([]);
    expect(memory.growth()).toBeLessThan(RSS_GROWTH_MAX);
    // The damage reached past the CRC check: inflate, the checksum, unfiltering and the id lookup all objected.
    const seen = [...classes.keys()].join('\n');
    for (const deep of [/cannot be decompressed/, /stops before/, /fails its checksum/, /image data holds/, /unknown filter type/, /not in classes\.json/, /above the limit/]) {
      expect(seen).toMatch(deep);
    }
    expect(classes.size).toBeGreaterThanOrEqual(30);
    // And some mutants decode to a different, still valid image (it reached unpacking and was read right).
    expect(okChanged).toBeGreaterThanOrEqual(20);
    if (process.env.FUZZ_REPORT) {
      const errors = [...classes.values()].reduce((a, b) => a + b, 0);
      console.log(`fuzz: ${MUTANTS} mutants, ${errors} errors in ${classes.size} classes, ${MUTANTS - errors} decoded (${okChanged} to a changed image); slowest ${slowest.ms.toFixed(1)} ms (${slowest.what}); peak RSS growth ${(memory.growth() / 2 ** 20).toFixed(0)} MB`);
      for (const [k, n] of [...classes].sort((a, b) => b[1] - a[1])) console.log(String(n).padStart(5), k);
    }
  });

  it('photoFromPng: an error naming the file or width×height×4 RGBA bytes; no throw or hang', () => {
    const problems: string[] = [];
    mutants.forEach(({ base, m, file }, i) => {
      const { value: r, ms, thrown } = callTimed(() => photoFromPng(m.bytes, { file }));
      if (ms > CALL_MS_MAX) problems.push(`#${i} took ${ms.toFixed(0)} ms`);
      if (!r) problems.push(`#${i} threw ${thrown}: ${base.name}: ${m.ops}`);
      else if (!r.ok && !r.error.startsWith(`${file}: `)) problems.push(`#${i} message does not name the file: ${r.error}`);
      else if (r.ok && r.value.rgba.length !== r.value.width * r.value.height * 4) problems.push(`#${i} RGBA length ${r.value.rgba.length}`);
    });
    expect(problems).toEqual([]);
  });

  it('the one-call (fflate and node:zlib) and the stepped inflate give the same answer for every mutant stream', () => {
    const problems: string[] = [];
    let compared = 0;
    mutants.forEach(({ m }, i) => {
      const header = pngHeaderRead(m.bytes, 'f');
      let parts: Uint8Array[];
      try {
        parts = testChunksOf(m.bytes).filter((c) => c.type === 'IDAT').map((c) => c.data);
      } catch {
        return; // not walkable as chunks: never reaches inflate
      }
      if (!header.ok || parts.length === 0) return;
      const { width, height, interlace } = header.value;
      const expected = pngRawSize(width, height, pngBitsPerPixel(header.value), interlace);
      if (expected > 1e8) return;
      const total = parts.reduce((n, p) => n + p.length, 0);
      const whole = pngInflate(parts, total, expected, 'f', true);
      const stepped = pngInflate(parts, total, expected, 'f', false);
      // The platform's inflate (node:zlib, as the command line's threads use) first: the same answer again.
      pngPlatformInflateUse(nodeInflate);
      const native = pngInflate(parts, total, expected, 'f', true);
      pngPlatformInflateUse(null);
      compared++;
      const agree = (a: typeof whole) => a.ok && stepped.ok ? a.value.length === stepped.value.length && a.value.every((v, k) => v === stepped.value[k]) : !a.ok && !stepped.ok && a.error === stepped.error;
      if (!agree(whole) || !agree(native)) {
        problems.push(`#${i} ${m.ops}: whole ${whole.ok ? 'ok' : whole.error} / node:zlib ${native.ok ? 'ok' : native.error} / stepped ${stepped.ok ? 'ok' : stepped.error}`);
      }
    });
    expect(problems).toEqual([]);
    expect(compared).toBeGreaterThan(MUTANTS / 2);
  });

  it("frameJobScore with each mutant as truth and as prediction: the decoder's error on that frame or run, or scores", () => {
    const problems: string[] = [];
    let scored = 0;
    mutants.forEach(({ base, m, file }, i) => {
      const r = decoded[i] ?? labelMapFromPng(m.bytes, { file, table: base.table }); // when run on its own
      const good = { file: 'predictions/run/ok.png', bytes: base.bytes };
      const mine = { file, bytes: m.bytes };
      const job = (truth: typeof good, pred: typeof good) =>
        callTimed(() => frameJobScore({ name: `fuzz-${i}`, truth, preds: [{ run: 'run', file: pred }], table: base.table, settings: DEFAULT_SCORE_SETTINGS }));
      for (const role of ['truth', 'prediction'] as const) {
        const { value: res, ms, thrown } = role === 'truth' ? job(mine, { ...good, file: 'truth/ok.png' }) : job({ ...good, file: 'truth/ok.png' }, mine);
        if (ms > CALL_MS_MAX) problems.push(`#${i} ${role} took ${ms.toFixed(0)} ms`);
        if (!res) {
          problems.push(`#${i} ${role} threw ${thrown}: ${base.name}: ${m.ops}`);
          continue;
        }
        const wrong = jobMismatch(res, r, role, file, role === 'truth' && r.ok ? r.value.ids : base.ids);
        if (wrong) problems.push(`#${i} ${role}: ${wrong}: ${base.name}: ${m.ops}`);
        if (res.runs[0].stats) scored++;
      }
    });
    expect(problems).toEqual([]);
    expect(scored).toBeGreaterThan(MUTANTS / 5);
  });
});

/** Returns how a frame job result disagrees with the mutant's own decode, or ''. */
function jobMismatch(res: FrameJobResult, r: Result<DecodedLabelMap>, role: 'truth' | 'prediction', file: string, truthIds: ArrayLike<number>): string {
  const run = res.runs[0];
  if (!r.ok) {
    // A bad truth fails the frame and every run with its message; a bad prediction fails only its run.
    if (role === 'truth') return res.error === r.error && run.error === r.error ? '' : `expected the frame error "${r.error}", got "${res.error}"`;
    return res.error === null && run.error === r.error ? '' : `expected the run error "${r.error}", got "${run.error}"`;
  }
  if (role === 'truth' && res.error !== null) return res.error.startsWith(`${file}: `) ? '' : `frame error not naming the truth file: ${res.error}`;
  if (run.error !== null) return run.error.includes(file) ? '' : `run error not naming the mutant: ${run.error}`;
  // src/docs/metrics.md: void ground truth is left out of the confusion matrix, every other truth pixel is counted once.
  const counted = run.stats!.confusion.reduce((a, b) => a + b, 0);
  let nonVoid = 0;
  for (let p = 0; p < truthIds.length; p++) if (truthIds[p] !== DEFAULT_SCORE_SETTINGS.ignore) nonVoid++;
  return counted === nonVoid ? '' : `confusion counts ${counted} pixels, the truth has ${nonVoid} non-void`;
}

describe('decompression bombs, absurd headers and forbidden formats', () => {
  const idat = (z: Uint8Array) => testChunk('IDAT', z);
  const iend = testChunk('IEND', new Uint8Array(0));
  const png = (w: number, h: number, depth: number, type: number, z: Uint8Array, interlace = 0, plte?: Uint8Array) =>
    testPngFromChunks([testChunk('IHDR', testIhdr(w, h, depth, type, interlace)), ...(plte ? [testChunk('PLTE', plte)] : []), idat(z), iend]);
  const tiny = new Uint8Array(deflateSync(Buffer.alloc(100)));

  /** Runs one decode under the hang and memory guards; returns its result. */
  function guarded<T>(f: () => T, rssMax = 64 * 2 ** 20): T {
    const memory = memoryWatch();
    const { value, ms, thrown } = callTimed(f);
    memory.sample();
    if (value === undefined) throw new Error(`threw: ${thrown}`);
    expect(ms).toBeLessThan(CALL_MS_MAX);
    expect(memory.growth()).toBeLessThan(rssMax);
    return value;
  }

  it('huge declared sizes with tiny data are refused from IHDR or from the data size, before allocating', () => {
    const cases: [number, number, number, number, RegExp][] = [
      [60000, 60000, 8, 0, /60,000×60,000 pixels \(3,600 megapixels\), above the limit of 100 megapixels/],
      [10001, 10000, 8, 0, /10,001×10,000 pixels \(100,010,000 pixels\), above the limit of 100,000,000 pixels/],
      [0x7fffffff, 1, 1, 0, /above the limit of 100 megapixels/],
      // Exactly at the limit: the 100 MB (8-bit) and 200 MB (16-bit) buffers are never allocated.
      [10000, 10000, 8, 0, /its 12 bytes of compressed image data cannot hold the 100,010,000 bytes the image needs/],
      [10000, 10000, 16, 0, /its 12 bytes of compressed image data cannot hold the 200,010,000 bytes the image needs/],
    ];
    for (const [w, h, depth, type, message] of cases) {
      const bytes = png(w, h, depth, type, tiny);
      const label = guarded(() => labelMapFromPng(bytes, { file: 'truth/big.png' }));
      const photo = guarded(() => photoFromPng(bytes, { file: 'truth/big.png' }));
      expect(label.ok ? '' : label.error).toMatch(message);
      expect(photo.ok ? '' : photo.error).toMatch(message);
    }
    // A photo may be 16-bit RGBA: 800 MB for the samples alone.
    const rgba16 = guarded(() => photoFromPng(png(10000, 10000, 16, 6, tiny), { file: 'images/big.png' }));
    expect(rgba16.ok ? '' : rgba16.error).toMatch(/cannot hold the 800,010,000 bytes the image needs/);
  });

  it('a 1 MB stream inflating to 1 GiB under a 100×100 header is cut off after the image: decoded, no blow-up', () => {
    // Inflated whole, even into a buffer that drops what does not fit, this takes far longer than the
    // guard (measured here: 400 MiB in 3.5–4.7 s, 4 GiB in over 8 minutes).
    const bytes = png(100, 100, 8, 0, testDeflateBomb(1024));
    expect(bytes.length).toBeLessThan(1.1e6);
    const r = guarded(() => labelMapFromPng(bytes, { file: 'truth/bomb.png' }));
    if (!r.ok) throw new Error(r.error);
    // The header declares 100×100 and the stream's first 10,100 bytes are zeros: filter 0, id 0 everywhere.
    expect([r.value.width, r.value.height, r.value.ids.every((v) => v === 0)]).toEqual([100, 100, true]);
    const valid = labelMapToPng({ width: 100, height: 100, ids: new Uint8Array(10000) }, { kind: 'gray', bitDepth: 8 });
    for (const [truth, pred] of [[bytes, valid], [valid, bytes]]) {
      const res = guarded(() =>
        frameJobScore({ name: 'bomb', truth: { file: 'truth/bomb.png', bytes: truth }, preds: [{ run: 'r', file: { file: 'predictions/r/bomb.png', bytes: pred } }], table: classTableGenerated(-1, 255), settings: DEFAULT_SCORE_SETTINGS }),
      );
      expect(res.runs[0].stats?.confusion.reduce((a, b) => a + b, 0)).toBe(10000);
    }
  });

  it('bombs under palette Adam7, 16-bit and a 3000×3000 header: cut off at the declared size', () => {
    const bomb = testDeflateBomb(400);
    const plte = new Uint8Array(48).map((_, i) => i * 5);
    for (const [w, h, depth, type, interlace] of [[64, 64, 4, 3, 1], [50, 30, 16, 0, 0], [3000, 3000, 8, 0, 0]]) {
      const r = guarded(() => labelMapFromPng(png(w, h, depth, type, bomb, interlace, type === 3 ? plte : undefined), { file: 'truth/bomb.png' }), 128 * 2 ** 20);
      if (!r.ok) throw new Error(r.error);
      expect([r.value.width, r.value.height, r.value.ids.every((v) => v === 0)]).toEqual([w, h, true]);
    }
  });

  it('every colour type × bit depth pair: the forbidden ones are refused from IHDR (ISO/IEC 15948 §11.2.2 table)', () => {
    const allowed: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };
    const z = new Uint8Array(deflateSync(Buffer.alloc(4 * 65)));
    for (let type = 0; type <= 8; type++) {
      for (const depth of [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 12, 15, 16, 17, 32, 255]) {
        const r = guarded(() => labelMapFromPng(png(8, 4, depth, type, z, 0, type === 3 ? new Uint8Array(6) : undefined), { file: 'f.png', table: FUZZ_RGB_TABLE }));
        const error = r.ok ? '' : r.error;
        if (!allowed[type]) expect(error).toBe(`f.png: is damaged: colour type ${type} does not exist in PNG`);
        else if (!allowed[type].includes(depth)) expect(error).toMatch(new RegExp(`^f\\.png: is damaged: bit depth ${depth} is not allowed for .* PNGs \\(allowed: ${allowed[type].join(', ')}\\)$`));
        else expect(error).not.toMatch(/bit depth|colour type/);
      }
    }
  });
});
