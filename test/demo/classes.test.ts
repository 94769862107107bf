import { describe, expect, it } from 'vitest';
import { classTableFromText } from '../../src/core/classTable.ts';
import { DEMO_CLASS, DEMO_CLASS_COUNT, demoClassesJson, demoClassTable, demoPalette } from '../../src/demo/classes.ts';

describe('demo classes', () => {
  it('lists the twelve Kestrel Quay classes, ids 0..11, with void 255', () => {
    const t = demoClassTable();
    expect(t.ignore).toBe(255);
    expect(t.classes.map((c) => c.name)).toEqual([
      'sky', 'water', 'quay', 'rail', 'container', 'crane', 'truck', 'person', 'bollard', 'light mast', 'building', 'vegetation',
    ]);
    expect(t.classes.map((c) => c.id)).toEqual(Array.from({ length: DEMO_CLASS_COUNT }, (_, i) => i));
    expect(DEMO_CLASS.vegetation).toBe(11);
  });

  it('writes classes.json that the users’ parser accepts (schema of src/docs/design.md)', () => {
    const text = JSON.stringify(demoClassesJson());
    const parsed = classTableFromText(text);
    expect(parsed.ok).toBe(true);
    expect(Object.keys(JSON.parse(text)).sort()).toEqual(['classes', 'ignore']);
  });

  it('uses colours that stay apart (no two within 60 in RGB distance)', () => {
    const p = demoPalette(DEMO_CLASS_COUNT);
    for (let a = 0; a < DEMO_CLASS_COUNT; a++) {
      for (let b = a + 1; b < DEMO_CLASS_COUNT; b++) {
        const d = Math.hypot(p[a * 3] - p[b * 3], p[a * 3 + 1] - p[b * 3 + 1], p[a * 3 + 2] - p[b * 3 + 2]);
        expect(d, `${a} vs ${b}`).toBeGreaterThan(60);
      }
    }
  });
});
