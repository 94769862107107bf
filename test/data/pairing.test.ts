import { describe, expect, it } from 'vitest';
import { datasetPair, fileStem } from '../../src/data/pairing.ts';

describe('fileStem', () => {
  it('drops only the last extension and keeps folders', () => {
    expect(fileStem('a/b.c.png')).toBe('a/b.c');
    expect(fileStem('f.png')).toBe('f');
    expect(fileStem('noext')).toBe('noext');
    expect(fileStem('dir.v2/noext')).toBe('dir.v2/noext');
  });
});

describe('datasetPair (layout of src/docs/design.md "Inputs": images/, truth/, predictions/<run>/)', () => {
  it('pairs by stem in natural order and reports every unpaired file', () => {
    const p = datasetPair({
      images: ['f10.jpg', 'f2.png', 'f1.webp', 'orphan.png', 'notes.txt', '.DS_Store'],
      truth: ['f1.png', 'f10.png', 'f2.png'],
      predictions: { 'run-b': ['f1.png', 'f2.png', 'f10.png', 'extra.png'], 'run-a': ['f1.png', 'f10.png'] },
    });
    expect(p.frames.map((f) => f.name)).toEqual(['f1', 'f2', 'f10']);
    expect(p.runs).toEqual(['run-a', 'run-b']);
    expect(p.frames[2]).toEqual({
      name: 'f10',
      image: 'f10.jpg',
      truth: 'f10.png',
      predictions: { 'run-a': 'f10.png', 'run-b': 'f10.png' },
      confidence: {},
    });
    expect(p.frames[1].predictions['run-a']).toBeNull();
    const reasons = p.unpaired.map((u) => `${u.folder}/${u.file}: ${u.reason}`).sort();
    expect(reasons).toEqual(
      [
        'images/notes.txt: not a supported file type here (expected .png, .jpg, .jpeg, .webp)',
        'images/orphan.png: no ground-truth file with this frame key',
        'predictions/run-a/f2: run "run-a" has no prediction for frame f2',
        'predictions/run-b/extra.png: no ground-truth file with this frame key',
      ].sort(),
    );
  });

  it('leaves out a frame whose stem occurs twice in one folder, saying so', () => {
    const p = datasetPair({ images: [], truth: ['a.png', 'b.png'], predictions: { r: ['a.png', 'b.png', 'b.PNG'] } });
    expect(p.frames.map((f) => f.name)).toEqual(['a', 'b']);
    expect(p.frames[1].predictions.r).toBeNull();
    expect(p.unpaired.filter((u) => u.folder === 'predictions/r').length).toBe(3);
  });

  it('frames without a photo are kept with image null', () => {
    const p = datasetPair({ images: [], truth: ['x.png'], predictions: {} });
    expect(p.frames).toHaveLength(1);
    expect(p.frames[0].image).toBeNull();
    expect(p.unpaired).toEqual([]);
  });
});
