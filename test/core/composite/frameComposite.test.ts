import { describe, expect, it } from 'vitest';
import { compositePaletteFromTable, MARK_COLORS, type MarkColors } from '../../../src/core/composite/compositePalette.ts';
import { frameComposite } from '../../../src/core/composite/frameComposite.ts';
import { LAYER_KEYS, layerSettingsDefault, type LayerSettings } from '../../../src/core/composite/layerSettings.ts';
import { compositeReference } from './compositeReference.ts';
import { frameRandom } from './randomFrame.ts';
import { layersRandom } from './randomLayers.ts';

function composite(...args: Parameters<typeof frameComposite>): Uint8Array {
  const r = frameComposite(...args);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

function firstDifference(a: Uint8Array, b: Uint8Array, width: number): string | null {
  for (let i = 0; i < a.length; i++) {
    if (a[i] !== b[i]) {
      const p = i >> 2;
      return `pixel (${p % width}, ${(p / width) | 0}) channel ${i & 3}: ${a[i]} vs ${b[i]}`;
    }
  }
  return null;
}

describe('frameComposite against a plain per-pixel reference (seeded random frames and settings)', () => {
  const cases = [
    { name: '8-bit ids', seed: 11, w: 37, h: 23, opts: {} },
    { name: '16-bit ids', seed: 12, w: 31, h: 29, opts: { wide: true } },
    { name: 'no photo, no band bins', seed: 13, w: 19, h: 17, opts: { photo: false, bins: false } },
    { name: 'one run', seed: 14, w: 40, h: 9, opts: { runs: 1 } },
  ];
  for (const c of cases) {
    it(`equals the reference byte for byte: ${c.name}`, () => {
      const { frame, table } = frameRandom(c.seed, c.w, c.h, c.opts);
      const marks: MarkColors = { ...MARK_COLORS };
      const palette = compositePaletteFromTable(table, marks);
      const runs = Object.keys(frame.preds);
      const ids = table.classes.map((k) => k.id);
      for (let k = 0; k < 60; k++) {
        const layers = layersRandom(c.seed * 1000 + k, c.w, c.h, runs, ids);
        const got = composite(frame, layers, palette);
        const want = compositeReference(frame, layers, table, marks);
        expect(firstDifference(got, want, c.w), `settings #${k}: ${JSON.stringify(layers)}`).toBeNull();
      }
    });
  }

  it('uses the marks it is given (changed colours reach every layer)', () => {
    const { frame, table } = frameRandom(21, 24, 18);
    const marks = Object.fromEntries(Object.entries(MARK_COLORS).map(([k, v]) => [k, (v * 7919 + 12345) & 0xffffff])) as MarkColors;
    const palette = compositePaletteFromTable(table, marks);
    for (let k = 0; k < 20; k++) {
      const layers = layersRandom(5000 + k, 24, 18, Object.keys(frame.preds), table.classes.map((c) => c.id));
      expect(firstDifference(composite(frame, layers, palette), compositeReference(frame, layers, table, marks), 24)).toBeNull();
    }
  });

  it('draws a sub-rectangle exactly as the same pixels of the whole frame', () => {
    const { frame, table } = frameRandom(31, 33, 27);
    const palette = compositePaletteFromTable(table);
    const layers = layersRandom(77, 33, 27, Object.keys(frame.preds), table.classes.map((c) => c.id));
    layers.void.on = true;
    layers.highlight = { on: true, opacity: 200, side: 'both', boxes: [{ x: 5, y: 4, width: 9, height: 7 }], thickness: 2 };
    const full = composite(frame, layers, palette);
    const rect = { x: 7, y: 3, width: 13, height: 11 };
    const part = composite(frame, layers, palette, { rect });
    for (let y = 0; y < rect.height; y++) {
      const a = full.subarray(((rect.y + y) * 33 + rect.x) * 4, ((rect.y + y) * 33 + rect.x + rect.width) * 4);
      expect([...part.subarray(y * rect.width * 4, (y + 1) * rect.width * 4)]).toEqual([...a]);
    }
    const bad = frameComposite(frame, layers, palette, { rect: { x: 30, y: 0, width: 5, height: 2 } });
    expect(bad.ok).toBe(false);
  });
});

describe('frameComposite: toggling a layer off restores the photo', () => {
  it('for every layer, on changes some pixel and off gives back the photo bytes exactly', () => {
    const { frame, table } = frameRandom(41, 30, 22);
    const palette = compositePaletteFromTable(table);
    const photoOnly = layerSettingsDefault();
    for (const k of LAYER_KEYS) photoOnly[k].on = k === 'photo';
    photoOnly.runA = 'run1';
    photoOnly.runB = 'run2';
    photoOnly.highlight.boxes = [{ x: 3, y: 3, width: 10, height: 6 }];
    const base = composite(frame, photoOnly, palette);
    for (let i = 0; i < 30 * 22; i++) {
      expect([...base.subarray(i * 4, i * 4 + 3)]).toEqual([...frame.photo!.subarray(i * 4, i * 4 + 3)]);
      expect(base[i * 4 + 3]).toBe(255);
    }
    for (const k of LAYER_KEYS) {
      if (k === 'photo') continue;
      const on: LayerSettings = structuredClone(photoOnly);
      on[k].on = true;
      on[k].opacity = 255;
      expect(firstDifference(composite(frame, on, palette), base, 30), `layer ${k} drew nothing`).not.toBeNull();
      on[k].on = false;
      expect(firstDifference(composite(frame, on, palette), base, 30)).toBeNull();
    }
  });
});
