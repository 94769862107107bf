// Each layer's meaning on small constructed frames, read pixel by pixel.
import { describe, expect, it } from 'vitest';
import { compositePaletteFromTable, MARK_COLORS } from '../../../src/core/composite/compositePalette.ts';
import type { CompositeFrame } from '../../../src/core/composite/compositeFrame.ts';
import { frameComposite } from '../../../src/core/composite/frameComposite.ts';
import { LAYER_KEYS, layerSettingsDefault, type LayerSettings } from '../../../src/core/composite/layerSettings.ts';
import { deltaE76 } from '../colorDifference.ts';
import { tableOf } from './randomFrame.ts';

const table = tableOf([1, 2, 3], 255); // colours #3d7a9e, #c9b458, #6d4f8f
const palette = compositePaletteFromTable(table);
const M = MARK_COLORS;

function allOff(): LayerSettings {
  const s = layerSettingsDefault();
  for (const k of LAYER_KEYS) {
    s[k].on = false;
    s[k].opacity = 255;
  }
  s.runA = 'a';
  return s;
}

function frameOf(width: number, truth: number[], preds: Record<string, number[]>, photo?: number[]): CompositeFrame {
  const height = truth.length / width;
  const map = (ids: number[]) => ({ width, height, ids: Uint8Array.from(ids) });
  return {
    truth: map(truth),
    preds: Object.fromEntries(Object.entries(preds).map(([k, v]) => [k, map(v)])),
    photo: photo ? Uint8Array.from(photo) : null,
    bandBins: null,
  };
}

/** Returns each pixel as 0xRRGGBB. */
function pixels(frame: CompositeFrame, layers: LayerSettings): number[] {
  const r = frameComposite(frame, layers, palette);
  if (!r.ok) throw new Error(r.error);
  const out: number[] = [];
  for (let i = 0; i < r.value.length; i += 4) out.push((r.value[i] << 16) | (r.value[i + 1] << 8) | r.value[i + 2]);
  return out;
}

describe('disagreement layer', () => {
  // Pixels: agree, wrong class, id 9 (not a class), predicted void, void truth with any prediction.
  const frame = frameOf(5, [1, 1, 1, 2, 255], { a: [1, 2, 9, 255, 3] });
  it('marks wrong-class and not-a-class predictions in their two colours, only on valid pixels', () => {
    const s = allOff();
    s.disagree.on = true;
    expect(pixels(frame, s)).toEqual([M.background, M.wrong, M.invalid, M.invalid, M.background]);
  });
  it('colours by the truth class or by the predicted class in the other modes', () => {
    const s = allOff();
    s.disagree.on = true;
    s.disagree.mode = 'truth';
    expect(pixels(frame, s)).toEqual([M.background, 0x3d7a9e, 0x3d7a9e, 0xc9b458, M.background]);
    s.disagree.mode = 'pred';
    expect(pixels(frame, s)).toEqual([M.background, 0xc9b458, M.invalid, M.invalid, M.background]);
  });
  it('draws nothing without a chosen run, or for a run the frame does not have', () => {
    const s = allOff();
    s.disagree.on = true;
    s.runA = null;
    expect(pixels(frame, s)).toEqual(Array(5).fill(M.background));
    s.runA = 'nope';
    expect(pixels(frame, s)).toEqual(Array(5).fill(M.background));
  });
  it('uses colours far from each other and from the other marks (CIE76 ΔE*ab > 25)', () => {
    const keys = ['wrong', 'invalid', 'fixed', 'broke', 'band', 'highlight'] as const;
    for (const a of keys) for (const b of keys) if (a < b) expect(deltaE76(M[a], M[b]), `${a} vs ${b}`).toBeGreaterThan(25);
  });
});

describe('void layer', () => {
  it('hatches void pixels with stripes of (x + y) mod period, and leaves valid pixels alone', () => {
    const w = 12, h = 6;
    const truth = Array.from({ length: w * h }, (_, i) => (i % w < 10 ? 255 : 1));
    const s = allOff();
    s.void.on = true;
    s.void.period = 6;
    const got = pixels(frameOf(w, truth, { a: truth }), s);
    for (let y = 0; y < h; y++) {
      for (let x = 0; x < w; x++) {
        const want = x >= 10 ? M.background : (x + y) % 6 < 3 ? M.hatchLight : M.hatchDark;
        expect(got[y * w + x], `(${x}, ${y})`).toBe(want);
      }
    }
  });
  it('stays visible over any photo: the two stripes differ by ΔE*ab > 20 at the default opacity', () => {
    const photoColors = [0x000000, 0xffffff, 0x808080, 0xff0000, 0x00ff00, 0x0000ff, 0xffff00, 0x7f6a55, 0x1a2b3c];
    const s = allOff();
    s.photo.on = true;
    s.void.on = true;
    s.void.opacity = layerSettingsDefault().void.opacity;
    s.void.period = 2;
    for (const c of photoColors) {
      const photo = [c >> 16, (c >> 8) & 255, c & 255, 255, c >> 16, (c >> 8) & 255, c & 255, 255];
      const [light, dark] = pixels(frameOf(2, [255, 255], { a: [1, 1] }, photo), s);
      expect(deltaE76(light, dark), `photo #${c.toString(16)}`).toBeGreaterThan(20);
    }
  });
});

describe('boundary band layer', () => {
  it('shades exactly the pixels whose bin is ≤ w, for every width 0..64', () => {
    const bins = Uint8Array.from({ length: 66 * 3 }, (_, i) => (i * 7) % 66);
    const truth = Array(66 * 3).fill(1);
    const frame = { ...frameOf(66, truth, { a: truth }), bandBins: bins };
    const s = allOff();
    s.band.on = true;
    for (let w = 0; w <= 64; w++) {
      s.band.width = w;
      const got = pixels(frame, s);
      for (let i = 0; i < bins.length; i++) if ((got[i] === M.band) !== (bins[i] <= w)) throw new Error(`w=${w}, bin ${bins[i]}`);
    }
    // Bin 65 (no boundary within 64 pixels) is never in the band.
    expect(pixels(frame, s).filter((c) => c === M.band).length).toBe([...bins].filter((b) => b <= 64).length);
  });
});

describe('comparison layer', () => {
  it('marks B fixed (A wrong, B right) and B broke (A right, B wrong) on valid pixels only', () => {
    // both right, A wrong B right, A right B wrong, both wrong, void truth
    const frame = frameOf(5, [1, 1, 1, 1, 255], { a: [1, 2, 1, 2, 1], b: [1, 1, 3, 3, 2] });
    const s = allOff();
    s.compare.on = true;
    s.runB = 'b';
    expect(pixels(frame, s)).toEqual([M.background, M.fixed, M.broke, M.background, M.background]);
  });
});

describe('patterns where colour alone cannot carry it', () => {
  const half = (over: number, mark: number) => {
    // mix8 at opacity 127 (255 >> 1): round((127·src + 128·dst) / 255) per channel, worked by hand.
    const ch = (sh: number) => Math.floor((127 * ((mark >> sh) & 255) + 128 * ((over >> sh) & 255) + 127) / 255);
    return (ch(16) << 16) | (ch(8) << 8) | ch(0);
  };
  it('not a class: full strength on rows 0-1, half on rows 2-3, and so on (horizontal bands)', () => {
    const w = 3, h = 8;
    const truth = Array(w * h).fill(1);
    const s = allOff();
    s.disagree.on = true;
    const got = pixels(frameOf(w, truth, { a: Array(w * h).fill(9) }), s);
    for (let y = 0; y < h; y++) {
      for (let x = 0; x < w; x++) expect(got[y * w + x], `(${x}, ${y})`).toBe(y % 4 < 2 ? M.invalid : half(M.background, M.invalid));
    }
    // Another class stays a plain fill.
    expect(new Set(pixels(frameOf(w, truth, { a: Array(w * h).fill(2) }), s))).toEqual(new Set([M.wrong]));
  });
  it('broke: stripes along x − y, half strength where (x − y) mod 8 is 4..7; fixed stays a fill', () => {
    const w = 10, h = 3;
    const truth = Array(w * h).fill(1);
    const s = allOff();
    s.compare.on = true;
    s.runB = 'b';
    const got = pixels(frameOf(w, truth, { a: truth, b: Array(w * h).fill(2) }), s);
    const rows = [];
    for (let y = 0; y < h; y++) rows.push(got.slice(y * w, y * w + w).map((c) => (c === M.broke ? 'B' : c === half(M.background, M.broke) ? 'b' : '?')).join(''));
    expect(rows).toEqual(['BBBBbbbbBB', 'bBBBBbbbbB', 'bbBBBBbbbb']);
    expect(new Set(pixels(frameOf(w, truth, { a: Array(w * h).fill(2), b: truth }), s))).toEqual(new Set([M.fixed]));
  });
});

describe('flicker layer', () => {
  // Hand-worked, from the definition in src/docs/metrics.md "Flicker": a pixel flips back at t when
  // pred[t-1] == pred[t+1] and pred[t] != pred[t-1]. Pixels, left to right:
  //   0 steady (1,1,1)          1 flips back (1,2,1)       2 changes for good (1,2,2)
  //   3 changes and back to another (1,2,3)              4 flips back where truth is void (2,3,2)
  //   5 flips back where the truth is id 9, no class (1,3,1)
  const frame: CompositeFrame = {
    ...frameOf(6, [1, 1, 1, 1, 255, 9], { a: [1, 2, 2, 2, 3, 3] }),
    around: {
      prev: { a: { width: 6, height: 1, ids: Uint8Array.of(1, 1, 1, 1, 2, 1) } },
      next: { a: { width: 6, height: 1, ids: Uint8Array.of(1, 1, 2, 3, 2, 1) } },
    },
  };
  it('marks the pixels that flip back, filled over a class and as a checker elsewhere', () => {
    const s = allOff();
    s.flicker.on = true;
    // Row 0, x = 4 and 5: ⌊x/2⌋ + ⌊y/2⌋ = 2, even: the dark cell of the checker.
    expect(pixels(frame, s)).toEqual([M.background, M.flicker, M.background, M.background, M.flicker, M.flicker]);
  });
  it('draws the checker of 2-pixel cells over void truth', () => {
    const w = 6, h = 4;
    const truth = Array(w * h).fill(255);
    const f: CompositeFrame = {
      ...frameOf(w, truth, { a: Array(w * h).fill(2) }),
      around: { prev: { a: { width: w, height: h, ids: new Uint8Array(w * h).fill(1) } }, next: { a: { width: w, height: h, ids: new Uint8Array(w * h).fill(1) } } },
    };
    const s = allOff();
    s.flicker.on = true;
    const got = pixels(f, s);
    const rows = [];
    for (let y = 0; y < h; y++) rows.push(got.slice(y * w, y * w + w).map((c) => (c === M.flicker ? 'D' : c === M.flickerLight ? 'l' : '?')).join(''));
    expect(rows).toEqual(['DDllDD', 'DDllDD', 'llDDll', 'llDDll']);
  });
  it('draws nothing at a sequence end, for another run, or when a neighbour has another size', () => {
    const s = allOff();
    s.flicker.on = true;
    expect(pixels({ ...frame, around: null }, s)).toEqual(Array(6).fill(M.background));
    expect(pixels({ ...frame, preds: { ...frame.preds, b: frame.preds.a } }, { ...s, runA: 'b' })).toEqual(Array(6).fill(M.background));
    const small = { width: 3, height: 2, ids: new Uint8Array(6) };
    expect(pixels({ ...frame, around: { prev: { a: small }, next: frame.around!.next } }, s)).toEqual(Array(6).fill(M.background));
  });
});

describe('solo class', () => {
  it('dims every pixel where neither truth nor prediction is the class', () => {
    const frame = frameOf(4, [1, 2, 2, 255], { a: [2, 1, 2, 3] }, Array(16).fill(200));
    const s = allOff();
    s.photo.on = true;
    s.solo = { on: true, classId: 1, dim: 255 };
    expect(pixels(frame, s)).toEqual([0xc8c8c8, 0xc8c8c8, M.dim, M.dim]);
  });
});

describe('curtain', () => {
  it('shows truth left of x and the prediction from x on, by the layers\' sides', () => {
    const frame = frameOf(4, [1, 1, 1, 1], { a: [2, 2, 2, 2] });
    const s = allOff();
    s.truth.on = true;
    s.pred.on = true;
    s.curtain = { on: true, x: 1 };
    expect(pixels(frame, s)).toEqual([0x3d7a9e, 0xc9b458, 0xc9b458, 0xc9b458]);
    s.curtain.x = 3;
    expect(pixels(frame, s)).toEqual([0x3d7a9e, 0x3d7a9e, 0x3d7a9e, 0xc9b458]);
    s.curtain.on = false; // sides no longer matter: prediction over truth everywhere
    expect(pixels(frame, s)).toEqual(Array(4).fill(0xc9b458));
  });
});

describe('highlight boxes', () => {
  it('outlines each box with a ring just outside it, leaving the box itself visible', () => {
    const w = 8, h = 7;
    const truth = Array(w * h).fill(1);
    const s = allOff();
    s.highlight = { on: true, opacity: 255, side: 'both', boxes: [{ x: 2, y: 2, width: 3, height: 2 }], thickness: 1 };
    const got = pixels(frameOf(w, truth, { a: truth }), s);
    const rows = [];
    for (let y = 0; y < h; y++) rows.push(got.slice(y * w, y * w + w).map((c) => (c === M.highlight ? '#' : '.')).join(''));
    expect(rows).toEqual(['........', '.#####..', '.#...#..', '.#...#..', '.#####..', '........', '........']);
  });
});
