// The demo sequence as a whole: determinism, the PNG files read back through the users' decoder (and
// pngjs as a second decoder), the answer key against the pixels, and what the sequence contains.
import { PNG } from 'pngjs';
import { beforeAll, describe, expect, it } from 'vitest';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { DEMO_CLASS_COUNT, DEMO_IGNORE, demoClassTable } from '../../src/demo/classes.ts';
import { demoAnswerKey, demoFrame, demoFrameRaster, type DemoFrameRaster } from '../../src/demo/frame.ts';
import { MISTAKE_KINDS } from '../../src/demo/mistakePlan.ts';
import type { DemoMistake } from '../../src/demo/mistakes.ts';
import { DEMO_RUNS } from '../../src/demo/runs.ts';

const O = { width: 512, height: 256, frames: 48, seed: 1 };
let seq: DemoFrameRaster[] = [];

beforeAll(() => {
  seq = Array.from({ length: O.frames }, (_, i) => demoFrameRaster(i, O));
});

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  return a.length === b.length && Buffer.compare(Buffer.from(a), Buffer.from(b)) === 0;
}

describe('determinism', () => {
  it('gives identical bytes for the same seed, whatever was generated before', () => {
    const first = demoFrame(7, O);
    demoFrame(30, O);
    demoFrame(3, { ...O, width: 320, height: 160 });
    const again = demoFrame(7, O);
    expect(sameBytes(first.photoPng, again.photoPng)).toBe(true);
    expect(sameBytes(first.truthPng, again.truthPng)).toBe(true);
    for (const run of DEMO_RUNS) expect(sameBytes(first.predPngs[run], again.predPngs[run])).toBe(true);
    expect(again.mistakes).toEqual(first.mistakes);
  });

  it('gives different frames for a different seed', () => {
    const a = demoFrame(12, O);
    const b = demoFrame(12, { ...O, seed: 2 });
    expect(sameBytes(a.photoPng, b.photoPng)).toBe(false);
    expect(sameBytes(a.truthPng, b.truthPng)).toBe(false);
  });
});

describe('files', () => {
  it('truth PNGs decode through labelMapFromPng to table ids or void, equal to the generated truth', () => {
    const table = demoClassTable();
    for (const i of [0, 9, 16, 33, 47]) {
      const f = demoFrame(i, O);
      const d = labelMapFromPng(f.truthPng, { file: `${f.name}.png`, table });
      expect(d.ok).toBe(true);
      if (!d.ok) continue;
      expect(d.value.encoding).toEqual({ kind: 'gray', bitDepth: 8 });
      expect(d.value.width).toBe(O.width);
      for (const id of new Set(d.value.ids)) expect(id < DEMO_CLASS_COUNT || id === DEMO_IGNORE).toBe(true);
      expect(Array.from(d.value.ids)).toEqual(Array.from(seq[i].truth.ids));
    }
  });

  it('run-a is 8-bit gray and run-b a palette PNG, both decoding to the generated predictions', () => {
    const f = demoFrame(20, O);
    const a = labelMapFromPng(f.predPngs['run-a'], { file: 'run-a.png' });
    const b = labelMapFromPng(f.predPngs['run-b'], { file: 'run-b.png' });
    expect(a.ok && a.value.encoding.kind).toBe('gray');
    expect(b.ok && b.value.encoding.kind).toBe('palette');
    if (!a.ok || !b.ok) return;
    expect(Array.from(a.value.ids)).toEqual(Array.from(seq[20].preds['run-a'].ids));
    expect(Array.from(b.value.ids)).toEqual(Array.from(seq[20].preds['run-b'].ids));
  });

  it('photos are RGB PNGs that pngjs (a second decoder) reads back to the generated pixels', () => {
    const f = demoFrame(5, O);
    const png = PNG.sync.read(Buffer.from(f.photoPng));
    expect([png.width, png.height]).toEqual([O.width, O.height]);
    expect(png.colorType).toBe(2); // truecolour without alpha (ISO/IEC 15948 §11.2.2)
    const rgb = seq[5].photo;
    let diff = 0;
    for (let i = 0; i < O.width * O.height; i++) for (let k = 0; k < 3; k++) diff += png.data[i * 4 + k] !== rgb[i * 3 + k] ? 1 : 0;
    expect(diff).toBe(0);
  });

  it('the truth label PNG matches pngjs byte for byte (second decoder)', () => {
    const f = demoFrame(16, O);
    const png = PNG.sync.read(Buffer.from(f.truthPng), { skipRescale: true });
    const ids = seq[16].truth.ids;
    let diff = 0;
    for (let i = 0; i < ids.length; i++) diff += png.data[i * 4] !== ids[i] ? 1 : 0;
    expect(diff).toBe(0);
  });
});

describe('answer key', () => {
  let key: DemoMistake[] = [];
  beforeAll(() => {
    key = demoAnswerKey(O);
  });

  it('equals the mistakes reported by the frames, frame by frame', () => {
    expect(key).toEqual(seq.flatMap((f) => f.mistakes));
  });

  it('holds 15–25 mistakes of every kind, spread over the sequence', () => {
    expect(key.length).toBeGreaterThanOrEqual(15);
    expect(key.length).toBeLessThanOrEqual(25);
    for (const kind of MISTAKE_KINDS) expect(key.some((m) => m.kind === kind)).toBe(true);
    const frames = new Set(key.map((m) => m.frame));
    expect(frames.size).toBeGreaterThanOrEqual(12);
    const first = seq.findIndex((f) => f.name === key[0].frame);
    const last = seq.findIndex((f) => f.name === key[key.length - 1].frame);
    expect(last - first).toBeGreaterThan(O.frames / 2);
  });

  it('has class swaps only in runs of 2–3 consecutive frames', () => {
    const idx = key.filter((m) => m.kind === 'class-swap').map((m) => seq.findIndex((f) => f.name === m.frame));
    const runs: number[][] = [];
    for (const i of idx) {
      const run = runs[runs.length - 1];
      if (run && i === run[run.length - 1] + 1) run.push(i);
      else runs.push([i]);
    }
    expect(runs.length).toBeGreaterThan(0);
    for (const r of runs) expect(r.length === 2 || r.length === 3).toBe(true);
  });

  it('boxes lie inside their frame, and every truth pixel that differs from the true scene is in a box', () => {
    for (const f of seq) {
      const own = key.filter((m) => m.frame === f.name);
      for (const m of own) {
        const [x0, y0, x1, y1] = m.bbox;
        expect(0 <= x0 && x0 < x1 && x1 <= O.width && 0 <= y0 && y0 < y1 && y1 <= O.height).toBe(true);
      }
      const t = f.truth.ids;
      const s = f.scene.ids;
      let outside = 0;
      for (let y = 0; y < O.height; y++) {
        for (let x = 0; x < O.width; x++) {
          const i = y * O.width + x;
          if (t[i] === s[i]) continue;
          if (!own.some((m) => x >= m.bbox[0] && x < m.bbox[2] && y >= m.bbox[1] && y < m.bbox[3])) outside++;
        }
      }
      expect(outside, f.name).toBe(0);
    }
  });

  it('each box covers pixels whose truth differs from the true scene in the stated way', () => {
    for (const m of key) {
      const f = seq.find((x) => x.name === m.frame)!;
      const [x0, y0, x1, y1] = m.bbox;
      let stated = 0;
      for (let y = y0; y < y1; y++) {
        for (let x = x0; x < x1; x++) {
          const i = y * O.width + x;
          if (f.scene.ids[i] === m.trueClass && f.truth.ids[i] === m.labelledClass) stated++;
        }
      }
      expect(stated, `${m.frame} ${m.kind}`).toBeGreaterThan(0);
      if (m.kind === 'void-over-object') expect(m.labelledClass).toBe(DEMO_IGNORE);
      if (m.kind === 'sloppy-outline' || m.kind === 'unlabelled' || m.kind === 'wrong-class') expect(m.labelledClass).not.toBe(m.trueClass);
    }
  });

  it('each mistake is a real disagreement: both runs mostly predict the true scene where the truth was changed', () => {
    for (const m of key) {
      const f = seq.find((x) => x.name === m.frame)!;
      const [x0, y0, x1, y1] = m.bbox;
      for (const run of DEMO_RUNS) {
        const p = f.preds[run].ids;
        let changed = 0;
        let disagree = 0;
        for (let y = y0; y < y1; y++) {
          for (let x = x0; x < x1; x++) {
            const i = y * O.width + x;
            if (f.truth.ids[i] === f.scene.ids[i]) continue;
            changed++;
            if (p[i] !== f.truth.ids[i]) disagree++;
          }
        }
        expect(disagree / changed, `${m.frame} ${m.kind} ${run}`).toBeGreaterThan(0.5);
      }
    }
  });
});

describe('content', () => {
  it('shows every class somewhere in the sequence, and void in every ground truth', () => {
    const seen = new Set<number>();
    for (const f of seq) for (const id of new Set(f.scene.ids)) seen.add(id);
    for (let c = 0; c < DEMO_CLASS_COUNT; c++) expect(seen.has(c), `class ${c}`).toBe(true);
    for (const f of seq) expect(f.truth.ids.includes(DEMO_IGNORE)).toBe(true);
  });

  it('puts the hood (void) across the bottom of every frame', () => {
    for (const f of [seq[0], seq[47]]) {
      const row = (O.height - 1) * O.width;
      for (let x = 0; x < O.width; x++) expect(f.scene.ids[row + x]).toBe(DEMO_IGNORE);
    }
  });

  it('changes from frame to frame as the vehicle moves, but stays one scene', () => {
    const diffShare = (a: ArrayLike<number>, b: ArrayLike<number>) => {
      let n = 0;
      for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) n++;
      return n / a.length;
    };
    const near = diffShare(seq[10].scene.ids, seq[11].scene.ids);
    const far = diffShare(seq[10].scene.ids, seq[40].scene.ids);
    expect(near).toBeGreaterThan(0);
    expect(near).toBeLessThan(far);
  });
});
