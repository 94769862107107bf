import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { labelMapUpscale, labelScaleFactor, photoFit, predictionFit } from '../../src/core/labelScale.ts';
import { pythonRefRequire } from '../reference/pythonRef.ts';
import { rngCreate } from '../support/paint.ts';

// Nearest-neighbour upscaling by a whole factor k: output pixel (x, y) takes input pixel (⌊x/k⌋, ⌊y/k⌋)
// (the definition of nearest-neighbour resampling at an integer ratio).

describe('labelMapUpscale', () => {
  it('agrees with the per-pixel definition for 8- and 16-bit maps', () => {
    const rng = rngCreate(9);
    for (const [w, h, k, wide] of [[7, 5, 2, false], [3, 4, 3, true], [1, 1, 4, false]] as const) {
      const ids = wide ? new Uint16Array(w * h).map(() => Math.floor(rng() * 60000)) : new Uint8Array(w * h).map(() => Math.floor(rng() * 255));
      const up = labelMapUpscale({ width: w, height: h, ids }, k);
      expect([up.width, up.height, up.ids.constructor]).toEqual([w * k, h * k, ids.constructor]);
      for (let y = 0; y < h * k; y++) for (let x = 0; x < w * k; x++) expect(up.ids[y * w * k + x]).toBe(ids[Math.floor(y / k) * w + Math.floor(x / k)]);
    }
  });

  it('scales only by one whole factor in both directions', () => {
    expect(labelScaleFactor(640, 480, 320, 240)).toBe(2);
    expect(labelScaleFactor(640, 480, 160, 120)).toBe(4);
    expect(labelScaleFactor(640, 480, 320, 120)).toBe(0);
    expect(labelScaleFactor(640, 480, 640, 480)).toBe(0);
    expect(labelScaleFactor(640, 480, 300, 240)).toBe(0);
  });

  it('predictionFit keeps same-size maps, scales whole fractions (stored ids too), and names both files otherwise', () => {
    const map = { width: 2, height: 1, ids: new Uint8Array([1, 2]), stored: new Uint8Array([7, 8]) };
    const same = predictionFit({ file: 't.png', width: 2, height: 1 }, { file: 'p.png', map });
    expect(same.ok && same.value.factor).toBe(1);
    const up = predictionFit({ file: 't.png', width: 4, height: 2 }, { file: 'p.png', map });
    expect(up.ok && [up.value.factor, [...up.value.map.ids], [...up.value.map.stored]]).toEqual([2, [1, 1, 2, 2, 1, 1, 2, 2], [7, 7, 8, 8, 7, 7, 8, 8]]);
    const bad = predictionFit({ file: 't.png', width: 5, height: 2 }, { file: 'p.png', map });
    expect(bad.ok ? '' : bad.error).toBe("p.png: is 2×1 pixels but t.png is 5×2; a prediction must have the label's size or a whole fraction of it (1/2, 1/3, …, same in both directions)");
  });
});

// Photos: a photo k times the label's size is averaged over k × k blocks, the mean rounded half up
// (numpy: img.reshape(h, k, w, k, 4).mean(axis=(1, 3)), then floor(x + 0.5)); a photo 1/k of it is
// repeated (numpy.repeat along both axes, the definition of nearest neighbour at an integer ratio).
describe('photoFit', () => {
  const numpyFit = (rgba: Uint8Array, w: number, h: number, k: number, down: boolean): Uint8Array => {
    const py = down
      ? `a=a.reshape(${h / k},${k},${w / k},${k},4).astype(np.float64).mean(axis=(1,3)); a=np.floor(a+0.5).astype(np.uint8)`
      : `a=np.repeat(np.repeat(a.reshape(${h},${w},4),${k},axis=0),${k},axis=1)`;
    const r = spawnSync('python3', ['-c', `import sys, numpy as np\na=np.frombuffer(sys.stdin.buffer.read(),dtype=np.uint8)\n${py}\nsys.stdout.buffer.write(np.ascontiguousarray(a).tobytes())`], { input: rgba, maxBuffer: 1 << 26 });
    if (r.status !== 0) throw new Error(String(r.stderr));
    return new Uint8Array(r.stdout);
  };

  it('averages a photo k times the label size and repeats one 1/k of it, as numpy does', () => {
    pythonRefRequire();
    const rng = rngCreate(21);
    for (const [tw, th, k] of [[6, 4, 2], [5, 3, 3], [4, 2, 4], [3, 3, 16]] as const) {
      const big = new Uint8Array(tw * k * th * k * 4).map(() => Math.floor(rng() * 256));
      const down = photoFit({ file: 't.png', width: tw, height: th }, { file: 'p.jpg', width: tw * k, height: th * k, rgba: big });
      if (!down.ok) throw new Error(down.error);
      expect(down.value.note).toBe(`p.jpg: averaged down ×${k} to the label's size`);
      expect(Buffer.from(down.value.rgba).equals(Buffer.from(numpyFit(big, tw * k, th * k, k, true))), `down ${k}`).toBe(true);
      const small = new Uint8Array(tw * th * 4).map(() => Math.floor(rng() * 256));
      // An unaligned view, as a decoder may hand over.
      const unaligned = new Uint8Array(small.length + 1).subarray(1);
      unaligned.set(small);
      const up = photoFit({ file: 't.png', width: tw * k, height: th * k }, { file: 'p.jpg', width: tw, height: th, rgba: unaligned });
      if (!up.ok) throw new Error(up.error);
      expect(Buffer.from(up.value.rgba).equals(Buffer.from(numpyFit(small, tw, th, k, false))), `up ${k}`).toBe(true);
    }
  });

  it('keeps a same-size photo and names both files when the sizes do not fit', () => {
    const rgba = new Uint8Array(16);
    const same = photoFit({ file: 't.png', width: 2, height: 2 }, { file: 'p.png', width: 2, height: 2, rgba });
    expect(same.ok && same.value.rgba === rgba && same.value.note).toBe(null);
    const bad = photoFit({ file: 't.png', width: 4, height: 2 }, { file: 'p.png', width: 3, height: 2, rgba: new Uint8Array(24) });
    expect(bad.ok ? null : bad.error).toBe("p.png: is 3×2 pixels but t.png is 4×2; a photo must have the label's size, a whole multiple or a whole fraction of it (same in both directions)");
  });
});
