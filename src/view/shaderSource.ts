// The one fragment shader that composes every layer. It repeats frameComposite's integer math
// exactly (src/core/composite/frameComposite.ts): ids and colours are fetched texel by texel, turned
// into ints, blended with (a·src + (255−a)·dst + 127) / 255 in integer arithmetic and written as
// v / 255, which the 8-bit target stores back as exactly v. Any change here must be made there too;
// test/browser/viewer.test.ts compares the two byte for byte.
import { MARK_KEYS } from '../core/composite/compositePalette.ts';
import { HIGHLIGHT_BOXES_MAX, LAYER_KEYS } from '../core/composite/layerSettings.ts';

const layerDefines = LAYER_KEYS.map((k, i) => `#define L_${k.toUpperCase()} ${i}`).join('\n');
const markDefines = MARK_KEYS.map((k, i) => `#define M_${k.toUpperCase()} ${i}`).join('\n');

/** Vertex shader: tile-local pixel positions through pixi's projection and world transforms. */
export const VERTEX_SOURCE = `#version 300 es
precision highp float;
in vec2 aPosition;
in vec2 aUV;
uniform mat3 uProjectionMatrix;
uniform mat3 uWorldTransformMatrix;
uniform mat3 uTransformMatrix;
out vec2 vPos;
out vec2 vUV;
void main() {
  mat3 mvp = uProjectionMatrix * uWorldTransformMatrix * uTransformMatrix;
  gl_Position = vec4((mvp * vec3(aPosition, 1.0)).xy, 0.0, 1.0);
  vPos = aPosition;
  vUV = aUV;
}
`;

/** Fragment shader: all layers, bottom to top, in integers. */
export const FRAGMENT_SOURCE = `#version 300 es
precision highp float;
precision highp int;
precision highp sampler2D;
${layerDefines}
${markDefines}
#define BOXES_MAX ${HIGHLIGHT_BOXES_MAX}
in vec2 vPos;
in vec2 vUV;
out vec4 fragColor;
uniform sampler2D uPhoto;
uniform sampler2D uTruth;
uniform sampler2D uPredA;
uniform sampler2D uPredB;
uniform sampler2D uPrevA;               // run A at the previous frame of the sequence (flicker)
uniform sampler2D uNextA;               // run A at the next frame
uniform sampler2D uBins;
uniform sampler2D uPalette;
uniform ivec4 uTile;                    // tile origin x, y and size w, h in image pixels
uniform ivec4 uLayers[${LAYER_KEYS.length}];  // side bits, opacity, extra, extra2
uniform ivec4 uSolo;                    // on, class id, dim, has run A
uniform ivec4 uMisc;                    // curtain x, ignore id
uniform ivec4 uMarks[${MARK_KEYS.length}];
uniform ivec4 uBoxes[BOXES_MAX];        // x0, y0, x1, y1

int byteOf(float v) { return int(v * 255.0 + 0.5); }
// Label ids: 8-bit maps are r8 (g reads 0), 16-bit maps rg8 with the low byte in r.
int idAt(sampler2D s, ivec2 p) { vec4 t = texelFetch(s, p, 0); return byteOf(t.r) + 256 * byteOf(t.g); }
ivec4 paletteAt(int id) {
  vec4 t = texelFetch(uPalette, ivec2(id & 255, id >> 8), 0);
  return ivec4(byteOf(t.r), byteOf(t.g), byteOf(t.b), byteOf(t.a));
}
// n / 255 as (n + 1 + (n >> 8)) >> 8: exact for 0 ≤ n < 65535 (checked for every n by the browser
// test through the composite), and much cheaper than integer division in software GL.
ivec3 mix8(ivec3 d, ivec3 s, int a) {
  ivec3 n = a * s + (255 - a) * d + 127;
  return (n + 1 + (n >> 8)) >> 8;
}
bool shows(int layer, int bit) { return (uLayers[layer].x & bit) != 0; }
ivec3 mark(int m) { return uMarks[m].rgb; }

void main() {
  ivec2 lp = clamp(ivec2(floor(vPos)), ivec2(0), uTile.zw - 1);
  ivec2 p = lp + uTile.xy;
  int bit = p.x < uMisc.x ? 1 : 2;
  int ignoreId = uMisc.y;
  ivec3 c = mark(M_BACKGROUND);
  int t = idAt(uTruth, lp);
  bool valid = t != ignoreId;
  int pa = uSolo.w == 1 ? idAt(uPredA, lp) : -1;

  if (shows(L_PHOTO, bit)) {
    vec4 ph = texelFetch(uPhoto, lp, 0);
    c = mix8(c, ivec3(byteOf(ph.r), byteOf(ph.g), byteOf(ph.b)), uLayers[L_PHOTO].y);
  }
  if (shows(L_TRUTH, bit) && valid) c = mix8(c, paletteAt(t).rgb, uLayers[L_TRUTH].y);
  if (shows(L_PRED, bit)) c = mix8(c, paletteAt(pa).rgb, uLayers[L_PRED].y);
  if (shows(L_BAND, bit) && byteOf(texelFetch(uBins, lp, 0).r) <= uLayers[L_BAND].z) {
    c = mix8(c, mark(M_BAND), uLayers[L_BAND].y);
  }
  if (shows(L_DISAGREE, bit) && valid && pa != t) {
    int mode = uLayers[L_DISAGREE].z;
    ivec4 pp = paletteAt(pa);
    bool isClass = pp.a == 255;
    ivec3 col = isClass ? mark(M_WRONG) : mark(M_INVALID);
    int a = uLayers[L_DISAGREE].y;
    if (mode == 1) col = paletteAt(t).rgb;
    else if (mode == 2 && isClass) col = pp.rgb;
    else if (!isClass && (p.y & 2) != 0) a = a >> 1;
    c = mix8(c, col, a);
  }
  if (shows(L_COMPARE, bit) && valid) {
    bool aRight = pa == t;
    bool bRight = idAt(uPredB, lp) == t;
    int a = uLayers[L_COMPARE].y;
    if (!bRight && ((p.x - p.y) & 7) >= 4) a = a >> 1;
    if (aRight != bRight) c = mix8(c, bRight ? mark(M_FIXED) : mark(M_BROKE), a);
  }
  if (shows(L_VOID, bit) && !valid) {
    int period = uLayers[L_VOID].z;
    bool light = (p.x + p.y) % period < period / 2;
    c = mix8(c, light ? mark(M_HATCHLIGHT) : mark(M_HATCHDARK), uLayers[L_VOID].y);
  }
  if (shows(L_FLICKER, bit)) {
    int before = idAt(uPrevA, lp);
    if (before == idAt(uNextA, lp) && pa != before) {
      bool filled = paletteAt(t).a == 255 || ((p.x ^ p.y) & 2) == 0;
      c = mix8(c, filled ? mark(M_FLICKER) : mark(M_FLICKERLIGHT), uLayers[L_FLICKER].y);
    }
  }
  if (uSolo.x == 1 && t != uSolo.y && pa != uSolo.y) c = mix8(c, mark(M_DIM), uSolo.z);
  if (shows(L_HIGHLIGHT, bit)) {
    int thick = uLayers[L_HIGHLIGHT].z;
    int count = uLayers[L_HIGHLIGHT].w;
    bool ring = false;
    for (int k = 0; k < BOXES_MAX; k++) {
      if (k >= count) break;
      ivec4 b = uBoxes[k];
      bool outer = p.x >= b.x - thick && p.x < b.z + thick && p.y >= b.y - thick && p.y < b.w + thick;
      bool inner = p.x >= b.x && p.x < b.z && p.y >= b.y && p.y < b.w;
      if (outer && !inner) ring = true;
    }
    if (ring) c = mix8(c, mark(M_HIGHLIGHT), uLayers[L_HIGHLIGHT].y);
  }
  fragColor = vec4(vec3(c) / 255.0, 1.0);
}
`;
