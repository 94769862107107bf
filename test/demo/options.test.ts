import { describe, expect, it } from 'vitest';
import { demoFrameName, demoOptionsCheck, DEMO_DEFAULTS } from '../../src/demo/options.ts';

describe('demoOptionsCheck', () => {
  it('fills in the defaults: 48 frames of 1024×512', () => {
    expect(demoOptionsCheck({})).toEqual({ ok: true, value: { width: 1024, height: 512, frames: 48, seed: 1 } });
    expect(DEMO_DEFAULTS.frames).toBe(48);
    expect(demoOptionsCheck({ width: 2048, height: 1024 }).ok).toBe(true);
  });

  it('names the setting that is wrong', () => {
    const bad = [
      [{ width: 10 }, 'width'],
      [{ height: 1.5 }, 'height'],
      [{ frames: 0 }, 'frames'],
      [{ seed: -1 }, 'seed'],
    ] as const;
    for (const [o, word] of bad) {
      const r = demoOptionsCheck(o, 'demo');
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error).toMatch(new RegExp(`^demo: ${word} must be`));
    }
  });
});

describe('demoFrameName', () => {
  it('numbers frames from kq-0001', () => {
    expect(demoFrameName(0)).toBe('kq-0001');
    expect(demoFrameName(47)).toBe('kq-0048');
  });
});
