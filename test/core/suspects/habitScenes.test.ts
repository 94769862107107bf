import { describe, expect, it } from 'vitest';
import { suspectQueueOfResults } from '../../../src/core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS, type SuspectSettings } from '../../../src/core/suspects/suspectSettings.ts';
import { habitSceneBuild, rankingFigures, type HabitScene, type SceneOptions } from '../../support/habitScenes.ts';

// The likely-label-mistake ranking on generated yard scenes (test/support/habitScenes.ts, fixed seeds)
// with 12 planted label mistakes of six sorts in 24 frames of 192×128, and model errors: every run's
// own blobs of wrong classes and, where said, a shared habit (the shed read as a container in 60 % of
// the frames by the runs named, while the label is right). Two of the planted mistakes are of the
// habit's own pair (a container labelled building), so only the photo can tell them from the habit.
// Measured: precision among the top M (M = planted mistakes) and recall of the mistakes within the top
// 2M; a suspect finds a mistake as in test/cli/suspects.test.ts (IoU ≥ 0.3 or 80 % inside).
//
// Figures at these seeds (P@M / R@2M): shared habit with photos 1.00 / 1.00; shared habit without
// photos 0.83 / 0.83 (the two mistakes of the habit's pair sink with it: nothing but the photo tells
// them apart); one run with photos 1.00 / 1.00; independent runs (the habit in one run only) 1.00 / 1.00;
// the shared habit with photos but common confusion and appearance switched off 0.83 / 1.00.
// The target of the issue: P@M ≥ 0.9 on shared habits without losing recall within 2M.

const SCENES: Record<string, SceneOptions> = {
  'shared habit, photos': { seed: 11, frames: 24, runs: 2, habitShare: 0.6, photos: true },
  'shared habit, no photos': { seed: 12, frames: 24, runs: 2, habitShare: 0.6, photos: false },
  'one run, photos': { seed: 13, frames: 24, runs: 1, habitShare: 0.6, photos: true },
  'independent runs, photos': { seed: 14, frames: 24, runs: 2, habitShare: 0.6, habitRuns: 1, photos: true },
};
const built = new Map<string, HabitScene>();
const scene = (name: string) => {
  let s = built.get(name);
  if (!s) built.set(name, (s = habitSceneBuild(SCENES[name])));
  return s;
};
const figures = (name: string, settings: SuspectSettings = SUSPECT_DEFAULTS) => {
  const s = scene(name);
  const f = rankingFigures(suspectQueueOfResults(s.results, String, settings), s.mistakes);
  console.log(`${name}: P@${f.m} ${f.precision.toFixed(2)}, R@${2 * f.m} ${f.recall.toFixed(2)}`);
  return f;
};

describe('ranking on scenes with planted label mistakes and model habits', () => {
  it('every scene plants 12 mistakes, and the habit covers many frames', () => {
    for (const name of Object.keys(SCENES)) expect(scene(name).mistakes.length).toBe(12);
    expect(scene('shared habit, photos').habits.length).toBeGreaterThanOrEqual(14);
  });

  it('shared habit with photos: precision 1.00 in the top M, recall 1.00 in the top 2M (target ≥ 0.9)', () => {
    const f = figures('shared habit, photos');
    expect(f.precision).toBeGreaterThanOrEqual(0.9);
    expect(f.recall).toBeGreaterThanOrEqual(0.9);
  }, 60_000);

  it('the shared habit is what common confusion and appearance answer: without them the same scene falls to 0.83', () => {
    const off = figures('shared habit, photos', { ...SUSPECT_DEFAULTS, recurrenceMinFrames: 1e6, weightAppearance: 0 });
    expect(off.precision).toBeLessThan(0.9);
  }, 60_000);

  it('shared habit without photos: 0.83 / 0.83 (the habit pair\'s own mistakes cannot be told apart)', () => {
    const f = figures('shared habit, no photos');
    expect(f.precision).toBeGreaterThanOrEqual(0.8);
    expect(f.recall).toBeGreaterThanOrEqual(0.8);
  }, 60_000);

  it('one run with photos: 1.00 / 1.00', () => {
    const f = figures('one run, photos');
    expect(f.precision).toBeGreaterThanOrEqual(0.9);
    expect(f.recall).toBeGreaterThanOrEqual(0.9);
  }, 60_000);

  it('independent runs: 1.00 / 1.00', () => {
    const f = figures('independent runs, photos');
    expect(f.precision).toBeGreaterThanOrEqual(0.9);
    expect(f.recall).toBeGreaterThanOrEqual(0.9);
  }, 60_000);
});
