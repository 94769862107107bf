// Overlay colours against colour-vision deficiency, checked with culori (not our code): CIEDE2000
// colour difference (Sharma, Wu & Dalal 2005, "The CIEDE2000 color-difference formula: implementation
// notes, supplementary test data, and mathematical observations") between every pair of overlay
// colours and against the demo's class colours, under normal vision and under protanopia,
// deuteranopia and tritanopia simulated at full severity with the matrices of Machado, Oliveira &
// Fernandes 2009 ("A physiologically-based model for simulation of color vision deficiency", IEEE
// TVCG 15(6)), which culori's filterDeficiency* apply in linear sRGB.
import { differenceCiede2000, filterDeficiencyDeuter, filterDeficiencyProt, filterDeficiencyTrit, parse, type Color } from 'culori';
import { describe, expect, it } from 'vitest';
import { MARK_COLORS, MARK_KEYS, type MarkKey } from '../../../src/core/composite/compositePalette.ts';
import { LAYER_KEYS } from '../../../src/core/composite/layerSettings.ts';
import { LEGEND_SOLO, MARK_LEGEND } from '../../../src/core/composite/markLegend.ts';
import { demoClassesJson } from '../../../src/demo/classes.ts';

const dE = differenceCiede2000();
const DEMO_CLASSES = demoClassesJson().classes;
const VISIONS: Record<string, (c: Color) => Color> = {
  normal: (c) => c,
  protanopia: filterDeficiencyProt(1),
  deuteranopia: filterDeficiencyDeuter(1),
  tritanopia: filterDeficiencyTrit(1),
};
const css = (rgb: number) => `#${rgb.toString(16).padStart(6, '0')}`;
const colour = (hex: string) => parse(hex)!;

/** The marks drawn as flat colour over the picture, which must be told apart by colour alone. */
const OVERLAYS: MarkKey[] = ['wrong', 'invalid', 'fixed', 'broke', 'band', 'highlight', 'flicker'];
/** Pairs shown in the same layer as the two answers of one question. */
const SAME_LAYER: [MarkKey, MarkKey][] = [['wrong', 'invalid'], ['fixed', 'broke']];
// Thresholds, common practice: a CIEDE2000 difference of about 10 reads as a different colour at a
// glance and 20 or more as clearly different hues; we ask 30 within a layer, 18 between any two
// overlays, and 9 against any class colour underneath (the error marks only).
const WITHIN_LAYER = 30;
const BETWEEN_OVERLAYS = 18;
const AGAINST_CLASSES = 9;

describe('overlay colours under colour-vision deficiency (ΔE2000, culori)', () => {
  it('culori reproduces a worked CIEDE2000 example and a full-severity simulation leaves grey unchanged', () => {
    // Sharma et al. 2005, Table 1, pair 1: L*a*b* (50, 2.6772, -79.7751) vs (50, 0, -82.7485): ΔE00 = 2.0425.
    expect(dE({ mode: 'lab65', l: 50, a: 2.6772, b: -79.7751 }, { mode: 'lab65', l: 50, a: 0, b: -82.7485 })).toBeCloseTo(2.0425, 4);
    for (const sim of Object.values(VISIONS)) expect(dE(sim(colour('#808080')), colour('#808080'))).toBeLessThan(0.5);
  });

  for (const [vision, sim] of Object.entries(VISIONS)) {
    it(`keeps overlays apart from each other and from the class colours: ${vision}`, () => {
      const seen = (k: MarkKey) => sim(colour(css(MARK_COLORS[k])));
      const close: string[] = [];
      for (let i = 0; i < OVERLAYS.length; i++) {
        for (let j = i + 1; j < OVERLAYS.length; j++) {
          const [a, b] = [OVERLAYS[i], OVERLAYS[j]];
          const want = SAME_LAYER.some(([x, y]) => (x === a && y === b) || (x === b && y === a)) ? WITHIN_LAYER : BETWEEN_OVERLAYS;
          const d = dE(seen(a), seen(b));
          if (d < want) close.push(`${a}/${b} ${d.toFixed(1)} < ${want}`);
        }
      }
      for (const k of ['wrong', 'invalid', 'fixed', 'broke', 'flicker'] as const) {
        for (const c of DEMO_CLASSES) {
          const d = dE(seen(k), sim(colour(c.color)));
          if (d < AGAINST_CLASSES) close.push(`${k}/${c.name} ${d.toFixed(1)} < ${AGAINST_CLASSES}`);
        }
      }
      expect(close).toEqual([]);
    });
  }
});

describe('legend', () => {
  it('describes every layer and every mark the compositor paints, and no other mark', () => {
    expect(Object.keys(MARK_LEGEND).sort()).toEqual([...LAYER_KEYS].sort());
    // A mark may appear in two entries (the flicker's dark colour is its fill and half its checker).
    const described = new Set([...Object.values(MARK_LEGEND).flat(), LEGEND_SOLO].flatMap((e) => e.marks));
    expect([...described].sort()).toEqual([...MARK_KEYS].sort());
    for (const e of Object.values(MARK_LEGEND).flat()) expect(e.words.length).toBeGreaterThan(3);
  });
});
