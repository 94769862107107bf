import { describe, expect, it } from 'vitest';
import { labelMapUpscale, labelScaleFactor, predictionFit } from '../../src/core/labelScale.ts';
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
