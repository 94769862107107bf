import { fail, ok, type Result } from '../result.ts';
import { MARK_INDEX, type CompositePalette } from './compositePalette.ts';
import { aroundOf, compositeFrameCheck, type CompositeFrame } from './compositeFrame.ts';
import { compositeParams, LAYER_INDEX } from './compositeParams.ts';
import type { LayerSettings, PixelBox } from './layerSettings.ts';

/** Returns `dst` blended toward `src` by `a` (0..255), rounded to nearest: the one blend both paths use. */
export function mix8(dst: number, src: number, a: number): number {
  return ((a * src + (255 - a) * dst + 127) / 255) | 0;
}

/**
 * Returns the frame drawn with `layers` as RGBA bytes (alpha 255), for the whole frame or for
 * `options.rect` (then rect.width·rect.height·4 bytes, hatch and curtain still in frame coordinates).
 * This is the reference the viewer's shader matches byte for byte, and the path used without WebGL.
 * Hot loop: flat typed arrays and hoisted locals, no allocation or closure per pixel.
 */
export function frameComposite(
  frame: CompositeFrame,
  layers: LayerSettings,
  palette: CompositePalette,
  options: { rect?: PixelBox; out?: Uint8Array } = {},
): Result<Uint8Array> {
  const size = compositeFrameCheck(frame);
  if (!size.ok) return size;
  const W = size.value.width, H = size.value.height;
  const rect = options.rect ?? { x: 0, y: 0, width: W, height: H };
  const rx = rect.x, ry = rect.y, rw = rect.width, rh = rect.height;
  if (!(Number.isInteger(rx) && Number.isInteger(ry) && Number.isInteger(rw) && Number.isInteger(rh) && rw >= 1 && rh >= 1 && rx >= 0 && ry >= 0 && rx + rw <= W && ry + rh <= H)) {
    return fail('frame', `rectangle ${rx},${ry} ${rw}×${rh} is not inside the ${W}×${H} frame`);
  }
  const out = options.out ?? new Uint8Array(rw * rh * 4);
  if (out.length !== rw * rh * 4) return fail('frame', `output buffer holds ${out.length} bytes, ${rw * rh * 4} needed`);

  const P = compositeParams(frame, layers, palette);
  const L = P.layers;
  const photoM = L[LAYER_INDEX.photo], photoA = L[LAYER_INDEX.photo + 1];
  const truthM = L[LAYER_INDEX.truth], truthA = L[LAYER_INDEX.truth + 1];
  const predM = L[LAYER_INDEX.pred], predA = L[LAYER_INDEX.pred + 1];
  const bandM = L[LAYER_INDEX.band], bandA = L[LAYER_INDEX.band + 1], bandW = L[LAYER_INDEX.band + 2];
  const disM = L[LAYER_INDEX.disagree], disA = L[LAYER_INDEX.disagree + 1], disMode = L[LAYER_INDEX.disagree + 2];
  const cmpM = L[LAYER_INDEX.compare], cmpA = L[LAYER_INDEX.compare + 1];
  const voidM = L[LAYER_INDEX.void], voidA = L[LAYER_INDEX.void + 1], period = L[LAYER_INDEX.void + 2];
  const half = period >> 1;
  const flkM = L[LAYER_INDEX.flicker], flkA = L[LAYER_INDEX.flicker + 1];
  const hlM = L[LAYER_INDEX.highlight], hlA = L[LAYER_INDEX.highlight + 1];
  const soloOn = P.solo[0] === 1, soloC = P.solo[1], soloA = P.solo[2];
  const M = P.marks;
  const bgR = M[MARK_INDEX.background], bgG = M[MARK_INDEX.background + 1], bgB = M[MARK_INDEX.background + 2];
  const oWrong = MARK_INDEX.wrong, oInvalid = MARK_INDEX.invalid, oFixed = MARK_INDEX.fixed, oBroke = MARK_INDEX.broke;
  const oBand = MARK_INDEX.band, oLight = MARK_INDEX.hatchLight, oDark = MARK_INDEX.hatchDark;
  const oDim = MARK_INDEX.dim, oHl = MARK_INDEX.highlight, oFlk = MARK_INDEX.flicker, oFlkLight = MARK_INDEX.flickerLight;
  const ignore = P.ignore, curtainX = P.curtainX;
  const pal = palette.rgba;
  const photo = frame.photo ?? new Uint8Array(4);
  const truth = frame.truth.ids;
  const hasA = P.runA !== null;
  const pa = P.runA !== null ? frame.preds[P.runA].ids : truth;
  const pb = P.runB !== null ? frame.preds[P.runB].ids : truth;
  const bins = frame.bandBins ?? new Uint8Array(0);
  const around = flkM !== 0 ? aroundOf(frame, P.runA) : null;
  const before = around ? around.prev.ids : truth, after = around ? around.next.ids : truth;
  const ring = hlM !== 0 ? ringMask(P.boxes, L[LAYER_INDEX.highlight + 3], L[LAYER_INDEX.highlight + 2], rx, ry, rw, rh) : null;

  let w = 0;
  for (let y = ry; y < ry + rh; y++) {
    const row = y * W;
    for (let x = rx; x < rx + rw; x++) {
      const i = row + x;
      const bit = x < curtainX ? 1 : 2;
      let r = bgR, g = bgG, b = bgB;
      const t = truth[i];
      const valid = t !== ignore;
      const p = hasA ? pa[i] : -1;
      if (photoM & bit) {
        const o = i * 4;
        r = mix8(r, photo[o], photoA); g = mix8(g, photo[o + 1], photoA); b = mix8(b, photo[o + 2], photoA);
      }
      if (truthM & bit && valid) {
        const o = t * 4;
        r = mix8(r, pal[o], truthA); g = mix8(g, pal[o + 1], truthA); b = mix8(b, pal[o + 2], truthA);
      }
      if (predM & bit) {
        const o = p * 4;
        r = mix8(r, pal[o], predA); g = mix8(g, pal[o + 1], predA); b = mix8(b, pal[o + 2], predA);
      }
      if (bandM & bit && bins[i] <= bandW) {
        r = mix8(r, M[oBand], bandA); g = mix8(g, M[oBand + 1], bandA); b = mix8(b, M[oBand + 2], bandA);
      }
      if (disM & bit && valid && p !== t) {
        const isClass = pal[p * 4 + 3] === 255;
        let cr: number, cg: number, cb: number, a = disA;
        if (disMode === 1 || (disMode === 2 && isClass)) {
          const o = (disMode === 1 ? t : p) * 4; // colour by the truth / the predicted class
          cr = pal[o]; cg = pal[o + 1]; cb = pal[o + 2];
        } else {
          const o = isClass ? oWrong : oInvalid;
          cr = M[o]; cg = M[o + 1]; cb = M[o + 2];
          // Not a class: horizontal bands, every other pair of rows at half strength.
          if (!isClass && (y & 2) !== 0) a = disA >> 1;
        }
        r = mix8(r, cr, a); g = mix8(g, cg, a); b = mix8(b, cb, a);
      }
      if (cmpM & bit && valid) {
        const aRight = p === t, bRight = pb[i] === t;
        if (aRight !== bRight) {
          const o = bRight ? oFixed : oBroke;
          // Broke: stripes rising to the right (the void's fall), half strength where (x − y) mod 8 ≥ 4.
          const a = !bRight && ((x - y) & 7) >= 4 ? cmpA >> 1 : cmpA;
          r = mix8(r, M[o], a); g = mix8(g, M[o + 1], a); b = mix8(b, M[o + 2], a);
        }
      }
      if (voidM & bit && !valid) {
        const o = (x + y) % period < half ? oLight : oDark;
        r = mix8(r, M[o], voidA); g = mix8(g, M[o + 1], voidA); b = mix8(b, M[o + 2], voidA);
      }
      if (flkM & bit && before[i] === after[i] && p !== before[i]) {
        // Flips back: a fill where the truth is a class, a checker of 2-pixel cells where it is not.
        const o = pal[t * 4 + 3] === 255 || ((x ^ y) & 2) === 0 ? oFlk : oFlkLight;
        r = mix8(r, M[o], flkA); g = mix8(g, M[o + 1], flkA); b = mix8(b, M[o + 2], flkA);
      }
      if (soloOn && t !== soloC && p !== soloC) {
        r = mix8(r, M[oDim], soloA); g = mix8(g, M[oDim + 1], soloA); b = mix8(b, M[oDim + 2], soloA);
      }
      if (ring !== null && hlM & bit && ring[(y - ry) * rw + (x - rx)]) {
        r = mix8(r, M[oHl], hlA); g = mix8(g, M[oHl + 1], hlA); b = mix8(b, M[oHl + 2], hlA);
      }
      out[w] = r; out[w + 1] = g; out[w + 2] = b; out[w + 3] = 255;
      w += 4;
    }
  }
  return ok(out);
}

/** Returns 1 per rect pixel lying in the outline (`thick` pixels just outside) of at least one box, else 0. */
function ringMask(boxes: Int32Array, count: number, thick: number, rx: number, ry: number, rw: number, rh: number): Uint8Array {
  const mask = new Uint8Array(rw * rh);
  for (let k = 0; k < count; k++) {
    const x0 = boxes[k * 4], y0 = boxes[k * 4 + 1], x1 = boxes[k * 4 + 2], y1 = boxes[k * 4 + 3];
    const ya = Math.max(y0 - thick, ry), yb = Math.min(y1 + thick, ry + rh);
    const xa = Math.max(x0 - thick, rx), xb = Math.min(x1 + thick, rx + rw);
    for (let y = ya; y < yb; y++) {
      const inside = y >= y0 && y < y1;
      for (let x = xa; x < xb; x++) if (!inside || x < x0 || x >= x1) mask[(y - ry) * rw + (x - rx)] = 1;
    }
  }
  return mask;
}
