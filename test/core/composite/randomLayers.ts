// Seeded random layer settings within the documented ranges, for the composite and viewer tests.
import { CURTAIN_SIDES, DISAGREE_MODES, layerSettingsDefault, type LayerBase, type LayerSettings, type PixelBox } from '../../../src/core/composite/layerSettings.ts';
import { seededRandom } from '../png/seeded.ts';

/** Returns random settings for a `width`×`height` frame whose runs are `runs` and classes `classIds`. */
export function layersRandom(seed: number, width: number, height: number, runs: string[], classIds: number[]): LayerSettings {
  const rnd = seededRandom(seed);
  const int = (n: number) => Math.floor(rnd() * n);
  const opacity = () => [0, 255, 128, 1, 254][int(8)] ?? int(256);
  const base = (onOdds: number): LayerBase => ({ on: rnd() < onOdds, opacity: opacity(), side: CURTAIN_SIDES[int(3)] });
  const runPick = () => [null, 'no-such-run', ...runs, ...runs][int(2 + runs.length * 2)];
  const boxes: PixelBox[] = [];
  for (let k = int(5); k > 0; k--) {
    boxes.push({ x: int(width + 10) - 5, y: int(height + 10) - 5, width: int(width / 2) + (rnd() < 0.1 ? 0 : 1), height: int(height / 2) + 1 });
  }
  const s = layerSettingsDefault();
  s.photo = base(0.8);
  s.truth = base(0.5);
  s.pred = base(0.5);
  s.band = { ...base(0.5), width: int(66) === 65 ? 64 : int(65) };
  s.disagree = { ...base(0.6), mode: DISAGREE_MODES[int(3)] };
  s.compare = base(0.5);
  s.void = { ...base(0.6), period: 2 * (1 + int(8)) };
  s.flicker = base(0.6);
  s.highlight = { ...base(0.6), boxes, thickness: 1 + int(4) };
  s.runA = runPick();
  s.runB = runPick();
  s.solo = { on: rnd() < 0.3, classId: rnd() < 0.8 ? classIds[int(classIds.length)] : int(256), dim: opacity() };
  s.curtain = { on: rnd() < 0.4, x: int(width + 4) - 2 };
  return s;
}
