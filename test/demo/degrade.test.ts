import { describe, expect, it } from 'vitest';
import { demoCamera } from '../../src/demo/camera.ts';
import { DEMO_CLASS } from '../../src/demo/classes.ts';
import { labelsDegrade, type DegradeSettings } from '../../src/demo/degrade.ts';
import { sceneRender } from '../../src/demo/render.ts';
import { demoScene } from '../../src/demo/scene.ts';
import { labelsDegradeReference } from './degradeReference.ts';

function settings(stride: number, wobble: number, time: number): DegradeSettings {
  const gain = new Float32Array(16).fill(1);
  gain[DEMO_CLASS.person] = 2.4;
  gain[DEMO_CLASS.rail] = 0.8;
  return { stride, wobble, gain, thin: [DEMO_CLASS.crane, DEMO_CLASS.lightMast, DEMO_CLASS.rail], thinBreak: 0.4, jitter: 0.5, seed: 77, time };
}

describe('labelsDegrade', () => {
  it('matches the plain reference on demo label maps, except at exact ties', () => {
    const scene = demoScene(1);
    for (const [frame, stride, wobble, w, h] of [[5, 8, 2.5, 300, 150], [30, 4, 1, 256, 128], [40, 3, 0, 203, 97]] as const) {
      const labels = sceneRender(scene, demoCamera(frame, 48, w, h), { instClass: scene.baseClass, hoodClass: 254, photo: false }).label.slice();
      const s = settings(stride, wobble, frame);
      const fast = labelsDegrade(labels, w, h, s);
      const ref = labelsDegradeReference(labels, w, h, s);
      let diff = 0;
      for (let i = 0; i < fast.length; i++) {
        if (fast[i] === ref.ids[i]) continue;
        diff++;
        expect(ref.margin[i], `pixel ${i}`).toBeLessThan(1e-5);
      }
      expect(diff).toBeLessThan(fast.length * 1e-4);
    }
  });

  it('keeps a uniform map uniform and rounds a square corner', () => {
    const w = 64;
    const h = 64;
    const flat = new Uint8Array(w * h).fill(2);
    expect(labelsDegrade(flat, w, h, settings(8, 2, 0)).every((v) => v === 2)).toBe(true);
    const square = new Uint8Array(w * h).fill(2);
    for (let y = 16; y < 48; y++) for (let x = 16; x < 48; x++) square[y * w + x] = 4;
    const out = labelsDegrade(square, w, h, { ...settings(8, 0, 0), jitter: 0 });
    expect(out[32 * w + 32]).toBe(4); // centre kept
    expect(out[16 * w + 16]).toBe(2); // the corner pixel rounded off
    expect(out[16 * w + 32]).toBe(4); // mid-edge kept
  });
});
