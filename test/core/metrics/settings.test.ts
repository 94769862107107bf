import { describe, expect, it } from 'vitest';
import {
  boundaryFTolerance, boundaryIoUDilation, roundHalfEven, scoreSettingsCheck, squaredDistanceLimit, DEFAULT_SCORE_SETTINGS,
} from '../../../src/core/metrics/settings.ts';

describe('Boundary IoU dilation (Cheng et al., CVPR 2021; rounding as Python 3 round)', () => {
  it('rounds half to even, as src/docs/metrics.md requires for 75×100 (0.02 · 125 = 2.5 → 2)', () => {
    expect(boundaryIoUDilation(75, 100, 0.02)).toBe(2);
    expect(roundHalfEven(2.5)).toBe(2);
    expect(roundHalfEven(3.5)).toBe(4);
    expect(roundHalfEven(-0.5)).toBe(0); // Python: round(-0.5) == 0
    expect(roundHalfEven(2.4999)).toBe(2);
    expect(roundHalfEven(2.5001)).toBe(3);
  });
  it('is 46 px at 2048×1024 (0.02 · 2289.7) and never below 1', () => {
    expect(boundaryIoUDilation(2048, 1024, 0.02)).toBe(46);
    expect(boundaryIoUDilation(5, 5, 0.02)).toBe(1);
    expect(boundaryIoUDilation(5, 5, 0)).toBe(1);
  });
});

describe('Boundary F tolerance (Csurka et al., BMVC 2013; 0.75 % of the diagonal)', () => {
  it('is 0.0075 · diagonal pixels', () => {
    expect(boundaryFTolerance(3, 4, 0.0075)).toBeCloseTo(0.0375, 15);
    expect(boundaryFTolerance(2048, 1024, 0.0075)).toBeCloseTo(17.173, 3);
  });
  it('turns θ into the largest squared pixel distance within it, comparing through Math.sqrt', () => {
    expect(squaredDistanceLimit(17.173)).toBe(294); // √294 = 17.146 ≤ θ < √295 = 17.176
    expect(squaredDistanceLimit(1)).toBe(1);
    expect(squaredDistanceLimit(Math.SQRT2)).toBe(2);
    expect(squaredDistanceLimit(0.5)).toBe(0);
    expect(squaredDistanceLimit(-1)).toBe(-1);
    for (let n = 1; n < 2000; n++) {
      const theta = Math.sqrt(n); // ties: a distance of exactly θ is within θ
      expect(squaredDistanceLimit(theta)).toBe(n);
      expect(squaredDistanceLimit(theta * (1 - 1e-12))).toBe(n - 1);
    }
  });
});

describe('scoreSettingsCheck', () => {
  it('accepts the defaults and names a bad setting', () => {
    expect(scoreSettingsCheck(DEFAULT_SCORE_SETTINGS).ok).toBe(true);
    const bad = scoreSettingsCheck({ ...DEFAULT_SCORE_SETTINGS, biouDilationRatio: -1 });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error).toContain('biouDilationRatio');
    expect(scoreSettingsCheck({ ...DEFAULT_SCORE_SETTINGS, ignore: 70000 }).ok).toBe(false);
  });
});
