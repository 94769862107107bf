// The composite's input checks, its clamping of settings, and the band-bin helper the tests rely on.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { compositePaletteFromTable } from '../../../src/core/composite/compositePalette.ts';
import { compositeFrameCheck, FRAME_SIDE_MAX } from '../../../src/core/composite/compositeFrame.ts';
import { compositeParams, LAYER_INDEX } from '../../../src/core/composite/compositeParams.ts';
import { frameComposite } from '../../../src/core/composite/frameComposite.ts';
import { HIGHLIGHT_BOXES_MAX, layerSettingsDefault } from '../../../src/core/composite/layerSettings.ts';
import { bandBinsBrute, bandBinsOf } from './bandBinsBrute.ts';
import { frameRandom, tableOf } from './randomFrame.ts';

describe('compositeFrameCheck', () => {
  const ok = frameRandom(1, 10, 8).frame;
  it('accepts a consistent frame and reports its size', () => {
    expect(compositeFrameCheck(ok)).toEqual({ ok: true, value: { width: 10, height: 8 } });
  });
  it('names the part whose size is wrong', () => {
    const pred = { width: 9, height: 8, ids: new Uint8Array(72) };
    const r = compositeFrameCheck({ ...ok, preds: { ...ok.preds, late: pred } }, 'f007');
    expect(r).toEqual({ ok: false, error: 'f007: prediction "late" is 9×8 pixels but the ground truth is 10×8' });
    expect(compositeFrameCheck({ ...ok, photo: new Uint8Array(10) }).ok).toBe(false);
    expect(compositeFrameCheck({ ...ok, bandBins: new Uint8Array(79) }).ok).toBe(false);
  });
  it('refuses frames longer than FRAME_SIDE_MAX on a side, with a message', () => {
    const wide = { width: FRAME_SIDE_MAX + 1, height: 1, ids: new Uint8Array(FRAME_SIDE_MAX + 1) };
    const r = frameComposite({ truth: wide, preds: {}, photo: null, bandBins: null }, layerSettingsDefault(), compositePaletteFromTable(tableOf([0], 255)));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/8193×1 pixels; the viewer shows frames up to 8192 pixels/);
    const edge = { width: FRAME_SIDE_MAX, height: 1, ids: new Uint8Array(FRAME_SIDE_MAX) };
    expect(compositeFrameCheck({ truth: edge, preds: {}, photo: null, bandBins: null }).ok).toBe(true);
  });
});

describe('compositeParams', () => {
  const { frame, table } = frameRandom(2, 10, 8);
  const palette = compositePaletteFromTable(table);
  it('rounds and clamps out-of-range numbers instead of failing', () => {
    const s = layerSettingsDefault();
    s.photo.opacity = 300.7;
    s.truth = { on: true, opacity: -4, side: 'both' };
    s.band = { on: true, opacity: 99.5, side: 'both', width: 90 };
    s.void.period = 7;
    const p = compositeParams(frame, s, palette);
    expect(p.layers[LAYER_INDEX.photo + 1]).toBe(255);
    expect(p.layers[LAYER_INDEX.truth]).toBe(0); // opacity 0 draws nothing
    expect(p.layers[LAYER_INDEX.band + 1]).toBe(100);
    expect(p.layers[LAYER_INDEX.band + 2]).toBe(64);
    expect(p.layers[LAYER_INDEX.void + 2]).toBe(6);
  });
  it(`keeps at most ${HIGHLIGHT_BOXES_MAX} non-empty boxes`, () => {
    const s = layerSettingsDefault();
    s.highlight.boxes = Array.from({ length: 40 }, (_, i) => ({ x: i, y: 0, width: i % 5 === 0 ? 0 : 2, height: 2 }));
    const p = compositeParams(frame, s, palette);
    expect(p.layers[LAYER_INDEX.highlight + 3]).toBe(HIGHLIGHT_BOXES_MAX);
    expect([...p.boxes.subarray(0, 8)]).toEqual([1, 0, 3, 2, 2, 0, 4, 2]);
  });
});

describe('band bins helper (test support) against its definition and scipy', () => {
  it('the fast form equals checking every boundary pixel', () => {
    for (const seed of [3, 4, 5]) {
      const { frame } = frameRandom(seed, 47, 31, { bins: false });
      expect([...bandBinsOf(frame.truth)]).toEqual([...bandBinsBrute(frame.truth)]);
    }
    const one = { width: 6, height: 4, ids: new Uint8Array(24) }; // one label: no boundary, all bins capped
    expect([...bandBinsOf(one)]).toEqual(Array(24).fill(65));
  });
  it('equals min(ceil(scipy.ndimage.distance_transform_edt), 65) to the boundary', () => {
    const { frame } = frameRandom(6, 150, 90, { bins: false });
    const t = frame.truth;
    const script = `
import sys, json, numpy as np
from scipy import ndimage
d = json.load(sys.stdin)
g = np.array(d['ids']).reshape(d['h'], d['w'])
b = np.zeros(g.shape, bool)
b[:, :-1] |= g[:, :-1] != g[:, 1:]; b[:, 1:] |= g[:, 1:] != g[:, :-1]
b[:-1, :] |= g[:-1, :] != g[1:, :]; b[1:, :] |= g[1:, :] != g[:-1, :]
e = ndimage.distance_transform_edt(~b)
print(json.dumps(np.minimum(np.ceil(e), 65).astype(int).ravel().tolist()))`;
    const r = spawnSync('python3', ['-c', script], { input: JSON.stringify({ w: t.width, h: t.height, ids: [...t.ids] }), encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    expect([...bandBinsOf(t)]).toEqual(JSON.parse(r.stdout));
  });
});
