// A plain per-pixel compositor written straight from the layer descriptions in layerSettings.ts, with
// colours read from the class table itself: no palette array, no resolved parameters, no shared code
// with frameComposite. Blending rounds to nearest, (a·src + (255−a)·dst) / 255 → Math.round; 255 is
// odd, so no exact halves occur and this equals the integer form frameComposite uses.
import { colorToRgb24, paletteColor, type ClassTable } from '../../../src/core/classTable.ts';
import type { MarkColors } from '../../../src/core/composite/compositePalette.ts';
import type { CompositeFrame } from '../../../src/core/composite/compositeFrame.ts';
import type { LayerBase, LayerSettings } from '../../../src/core/composite/layerSettings.ts';

type Rgb = [number, number, number];

function rgbOf(v: number): Rgb {
  return [(v >> 16) & 255, (v >> 8) & 255, v & 255];
}

/** Returns the composite of `frame` as RGBA (alpha 255), one pixel at a time. Slow; test frames only. */
export function compositeReference(frame: CompositeFrame, layers: LayerSettings, table: ClassTable, marks: MarkColors): Uint8Array {
  const { width, height } = frame.truth;
  const out = new Uint8Array(width * height * 4);
  const isClass = (id: number) => table.classes.some((c) => c.id === id);
  const colorOf = (id: number): Rgb => {
    const c = table.classes.find((k) => k.id === id);
    if (c) return rgbOf(colorToRgb24(c.color));
    return id === table.ignore ? rgbOf(marks.voidFill) : rgbOf(paletteColor(id));
  };
  const A = layers.runA !== null ? frame.preds[layers.runA] : undefined;
  const B = layers.runB !== null ? frame.preds[layers.runB] : undefined;
  const boxes = layers.highlight.boxes.filter((b) => b.width >= 1 && b.height >= 1).slice(0, 32);
  const t = layers.highlight.thickness;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      let c: Rgb = rgbOf(marks.background);
      const over = (src: Rgb, a: number) => {
        c = [0, 1, 2].map((k) => Math.round((a * src[k] + (255 - a) * c[k]) / 255)) as Rgb;
      };
      const shows = (l: LayerBase) => {
        if (!l.on) return false;
        if (!layers.curtain.on || l.side === 'both') return true;
        return l.side === 'left' ? x < layers.curtain.x : x >= layers.curtain.x;
      };
      const g = frame.truth.ids[i];
      const valid = g !== table.ignore;
      const p = A ? A.ids[i] : undefined;
      if (shows(layers.photo) && frame.photo) {
        over([frame.photo[i * 4], frame.photo[i * 4 + 1], frame.photo[i * 4 + 2]], layers.photo.opacity);
      }
      if (shows(layers.truth) && valid) over(colorOf(g), layers.truth.opacity);
      if (shows(layers.pred) && p !== undefined) over(colorOf(p), layers.pred.opacity);
      if (shows(layers.band) && frame.bandBins && frame.bandBins[i] <= layers.band.width) {
        over(rgbOf(marks.band), layers.band.opacity);
      }
      if (shows(layers.disagree) && p !== undefined && valid && p !== g) {
        const mode = layers.disagree.mode;
        const kind = isClass(p) ? rgbOf(marks.wrong) : rgbOf(marks.invalid);
        const byClass = mode === 'truth' || (mode === 'pred' && isClass(p));
        // Not a class in its own colour: rows in pairs, the odd pairs (⌊y/2⌋ odd) at half opacity, rounded down.
        const halfRow = !byClass && !isClass(p) && Math.floor(y / 2) % 2 === 1;
        over(mode === 'truth' ? colorOf(g) : byClass ? colorOf(p) : kind, halfRow ? Math.floor(layers.disagree.opacity / 2) : layers.disagree.opacity);
      }
      if (shows(layers.compare) && A && B && valid) {
        const aRight = A.ids[i] === g, bRight = B.ids[i] === g;
        if (!aRight && bRight) over(rgbOf(marks.fixed), layers.compare.opacity);
        // Broke: diagonal stripes, half opacity (rounded down) where (x − y) mod 8 (non-negative) is 4..7.
        const halfStripe = (((x - y) % 8) + 8) % 8 >= 4;
        if (aRight && !bRight) over(rgbOf(marks.broke), halfStripe ? Math.floor(layers.compare.opacity / 2) : layers.compare.opacity);
      }
      if (shows(layers.void) && !valid) {
        const light = (x + y) % layers.void.period < layers.void.period / 2;
        over(rgbOf(light ? marks.hatchLight : marks.hatchDark), layers.void.opacity);
      }
      // Flicker: run A's predictions before and after this frame agree and this frame's differs;
      // a fill over truth that is a class, a checker of 2-pixel cells (light where ⌊x/2⌋+⌊y/2⌋ is odd) elsewhere.
      const before = A && layers.runA !== null ? frame.around?.prev[layers.runA] : undefined;
      const after = A && layers.runA !== null ? frame.around?.next[layers.runA] : undefined;
      if (shows(layers.flicker) && A && before && after && before.ids[i] === after.ids[i] && A.ids[i] !== before.ids[i]) {
        const light = !isClass(g) && (Math.floor(x / 2) + Math.floor(y / 2)) % 2 === 1;
        over(rgbOf(light ? marks.flickerLight : marks.flicker), layers.flicker.opacity);
      }
      if (layers.solo.on && g !== layers.solo.classId && p !== layers.solo.classId) over(rgbOf(marks.dim), layers.solo.dim);
      const inRing = boxes.some((b) => {
        const inOuter = x >= b.x - t && x < b.x + b.width + t && y >= b.y - t && y < b.y + b.height + t;
        const inBox = x >= b.x && x < b.x + b.width && y >= b.y && y < b.y + b.height;
        return inOuter && !inBox;
      });
      if (shows(layers.highlight) && inRing) over(rgbOf(marks.highlight), layers.highlight.opacity);
      out.set([c[0], c[1], c[2], 255], i * 4);
    }
  }
  return out;
}
