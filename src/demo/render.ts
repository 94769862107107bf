// One render of the scene through one camera: background classes, objects (front to back,
// depth-tested), then colour for what still shows background, water reflections, the hood. The same code makes the photo, the true label map and the
// predictions' label maps; only the instance→class table and the hood class differ.
import type { DemoCamera } from './camera.ts';
import { Drawer } from './draw.ts';
import { hoodPass } from './finish.ts';
import { backgroundShade, groundPass } from './ground.ts';
import { rasterScratch, type RasterTarget } from './raster.ts';
import type { DemoScene } from './scene.ts';
import { waterPass } from './water.ts';

/** What one render draws: class per instance (DRAW_SKIP hides it), the hood's class, photo or labels. */
export interface RenderSpec {
  instClass: Uint8Array;
  hoodClass: number;
  photo: boolean;
}

/**
 * Returns the buffers of `scene` seen by `cam` and drawn as `spec` says. They are scratch buffers,
 * reused by the next render of the same size and kind: copy out what must be kept.
 */
export function sceneRender(scene: DemoScene, cam: DemoCamera, spec: RenderSpec): RasterTarget {
  const t = rasterScratch(cam.width, cam.height, spec.photo, 0);
  groundPass(t, cam);
  const d = new Drawer(cam, t, spec.instClass);
  const objs = scene.objects;
  const order: number[] = [];
  const keys = new Float64Array(objs.length);
  const slope = (cam.cx + 2) / cam.f;
  for (let k = 0; k < objs.length; k++) {
    const o = objs[k];
    if (spec.instClass[o.inst] === 254) continue;
    const dx = o.x + o.vx * cam.time - cam.x;
    const dz = o.z + o.vz * cam.time - cam.z;
    const xc = dx * cam.cos - dz * cam.sin;
    const zc = dx * cam.sin + dz * cam.cos;
    if (zc + o.r < 0.25) continue;
    if (Math.abs(xc) - o.r * 1.5 > Math.max(0, zc) * slope) continue;
    keys[k] = zc;
    order.push(k);
  }
  order.sort((a, b) => keys[a] - keys[b]);
  for (const k of order) {
    const o = objs[k];
    if (d.begin(o.inst)) o.draw(d, o.vx * cam.time, o.vz * cam.time);
  }
  if (spec.photo) {
    backgroundShade(t, cam, scene.seed);
    waterPass(t, cam, scene.seed);
  }
  hoodPass(t, cam, spec.hoodClass);
  return t;
}
