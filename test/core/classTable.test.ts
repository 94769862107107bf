import { describe, expect, it } from 'vitest';
import {
  classTableColorIndex,
  classTableFromJson,
  classTableFromText,
  classTableGenerated,
  paletteColor,
} from '../../src/core/classTable.ts';
import { deltaE76 } from './colorDifference.ts';

const good = {
  ignore: 255,
  classes: [
    { id: 2, name: 'quay', color: '#8A8170' },
    { id: 0, name: 'water', color: '#1f5f8b' },
  ],
};

function errorOf(json: unknown): string {
  const r = classTableFromJson(json, 'data/classes.json');
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('classTableFromJson (schema of src/docs/design.md "Inputs")', () => {
  it('reads a valid table, sorts by id and lower-cases colours', () => {
    const r = classTableFromJson(good);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.classes.map((c) => c.id)).toEqual([0, 2]);
    expect(r.value.classes[1].color).toBe('#8a8170');
    expect(r.value.ignore).toBe(255);
    expect(r.value.generated).toBe(false);
  });

  it('defaults ignore to 255 and accepts ignoreColor', () => {
    const r = classTableFromJson({ ignoreColor: '#000000', classes: [{ id: 1, name: 'a', color: '#ffffff' }] });
    expect(r.ok && r.value.ignore).toBe(255);
    expect(r.ok && r.value.ignoreColor).toBe('#000000');
    if (r.ok) expect(classTableColorIndex(r.value).get(0x000000)).toBe(255);
  });

  it('names the file and the problem for each kind of bad table', () => {
    expect(errorOf([])).toMatch(/^data\/classes\.json: expected a JSON object/);
    expect(errorOf({ classes: [{ id: 1, name: 'a', color: '#000001' }, { id: 1, name: 'b', color: '#000002' }] })).toMatch(
      /id 1 is used twice/,
    );
    expect(errorOf({ classes: [{ id: 1, name: 'a', color: '#00000A' }, { id: 2, name: 'b', color: '#00000a' }] })).toMatch(
      /colour #00000a is used twice/,
    );
    expect(errorOf({ ignoreColor: '#000000', classes: [{ id: 1, name: 'a', color: '#000000' }] })).toMatch(
      /"ignoreColor" and class #1/,
    );
    expect(errorOf({ classes: [{ id: 65535, name: 'a', color: '#000001' }] })).toMatch(/ids must be integers 0..65534/);
    expect(errorOf({ classes: [{ id: -1, name: 'a', color: '#000001' }] })).toMatch(/ids must be integers/);
    expect(errorOf({ classes: [{ id: 1.5, name: 'a', color: '#000001' }] })).toMatch(/ids must be integers/);
    expect(errorOf({ ignore: 7, classes: [{ id: 7, name: 'a', color: '#000001' }] })).toMatch(/which is the "ignore"/);
    expect(errorOf({ classes: [{ id: 1, name: 'a', color: 'red' }] })).toMatch(/has colour "red"; use "#rrggbb"/);
    expect(errorOf({ classes: [{ id: 1, name: 'a', color: '#12345' }] })).toMatch(/use "#rrggbb"/);
    expect(errorOf({ classes: [{ id: 1, name: ' ', color: '#123456' }] })).toMatch(/non-empty "name"/);
    expect(errorOf({ ignore: 'x', classes: [] })).toMatch(/"ignore" must be an integer/);
    expect(errorOf({ ignoreColor: 12, classes: [] })).toMatch(/"ignoreColor" must be a colour/);
    expect(errorOf({ classes: [] })).toMatch(/"classes" is empty/);
    expect(errorOf({ classes: {} })).toMatch(/"classes" must be an array/);
  });

  it('reports malformed JSON text with the file name', () => {
    const r = classTableFromText('{ "classes": [', 'x/classes.json');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/^x\/classes\.json: is not valid JSON/);
  });
});

describe('classTableGenerated (no table given)', () => {
  it('names ids by number, skips ignore, and is deterministic', () => {
    const t = classTableGenerated(3, 2);
    expect(t.classes.map((c) => [c.id, c.name])).toEqual([
      [0, '0'],
      [1, '1'],
      [3, '3'],
    ]);
    expect(t.generated).toBe(true);
    expect(classTableGenerated(3, 2)).toEqual(t);
  });

  it('keeps neighbouring ids distinguishable: CIE76 ΔE*ab ≥ 20 between ids i and i+1, i+2 (CIE 15:2004)', () => {
    // ΔE*ab ≈ 2.3 is a just-noticeable difference (Sharma, "Digital Color Imaging Handbook", from memory);
    // 20 is a clearly different colour at a glance (common practice for categorical palettes).
    let worst = Infinity;
    for (let id = 0; id < 256; id++) {
      worst = Math.min(worst, deltaE76(paletteColor(id), paletteColor(id + 1)), deltaE76(paletteColor(id), paletteColor(id + 2)));
    }
    expect(worst).toBeGreaterThanOrEqual(20);
  });
});
