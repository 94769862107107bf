// Seeded fuzzing of the label decoder, the photo decoder and the frame scoring job. Every mutant must
// give a per-frame error naming its file, or exactly the image an independent reader (pngReference.ts,
// on node:zlib) sees in it; never a throw, a hang or a memory blow-up. The time and memory bounds are
// hang and bomb guards, far above normal costs, not speed checks (those live in test/bench/).
import { describe, expect, it } from 'vitest';
import { classTableColorIndex } from '../../../src/core/classTable.ts';
import { frameJobScore, type FrameJobResult } from '../../../src/core/frameJob.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../../src/core/metrics/settings.ts';
import { labelMapFromPng, type DecodedLabelMap } from '../../../src/core/png/decodeLabel.ts';
import { photoFromPng } from '../../../src/core/png/decodePhoto.ts';
import { type Result } from '../../../src/core/result.ts';
import { fuzzBases, type FuzzBase } from './fuzzBases.ts';
import { mutantMake, type Mutant } from './pngMutate.ts';
import { referenceDecode } from './pngReference.ts';
import { seededRandom } from './seeded.ts';
import { callTimed, errorClass, memoryWatch } from './fuzzWatch.ts';

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

  it("frameJobScore with each mutant as truth and as prediction: the decoder's error on that frame or run, or scores", () => {
    const problems: string[] = [];
    let scored = 0;
    mutants.forEach(({ base, m, file }, i) => {
      const r = decoded[i];
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
  // METRICS.md: void ground truth is left out of the confusion matrix, every other truth pixel is counted once.
  const counted = run.stats!.confusion.reduce((a, b) => a + b, 0);
  let nonVoid = 0;
  for (let p = 0; p < truthIds.length; p++) if (truthIds[p] !== DEFAULT_SCORE_SETTINGS.ignore) nonVoid++;
  return counted === nonVoid ? '' : `confusion counts ${counted} pixels, the truth has ${nonVoid} non-void`;
}
