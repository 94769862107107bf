import { describe, expect, it } from 'vitest';
import { folderGroups, folderKeys, stemAliases, stemTails } from '../../src/data/frameKeys.ts';
import { datasetPair } from '../../src/data/pairing.ts';

// Frame keys (README "Your data"): the suffix shared by a folder's files is stripped, a nested key pairs
// with a flat one when unambiguous, several encodings per frame become suffix groups.

describe('frame keys', () => {
  it('suffixes start at _ - . and end with a letter, so frame numbers are never suffixes', () => {
    expect(stemTails('k_0001_gt_mask')).toEqual(['_0001_gt_mask', '_gt_mask', '_mask']);
    expect(stemTails('frame_0001')).toEqual([]);
    expect(stemAliases('site/k_gt')).toEqual(['k_gt', 'k']);
  });

  it('strips the suffix the files share, keeping folders in the key', () => {
    expect(folderKeys(['a/x_gt_mask.png', 'b/y_gt_mask.png', 'z_gt_mask.png']).map((k) => k.key)).toEqual(['a/x', 'b/y', 'z']);
    expect(folderKeys(['f_001.png', 'f_002.png']).map((k) => k.key)).toEqual(['f_001', 'f_002']);
    expect(folderKeys(['m_left.png', 'n_right.png']).map((k) => k.key)).toEqual(['m_left', 'n_right']);
    expect(folderKeys(['only_gt.png']).map((k) => k.key)).toEqual(['only_gt']);
  });

  it('several encodings of each frame become groups with the same keys; unrelated stray names do not', () => {
    const keyed = folderKeys(['k1_ids.png', 'k1_color.png', 'k2_ids.png', 'k2_color.png', 'k1_shapes.json', 'k2_shapes.json']);
    expect(folderGroups(keyed).map((g) => [g.tail, g.files.map((f) => f.key)])).toEqual([
      ['_color', ['k1', 'k2']],
      ['_ids', ['k1', 'k2']],
      ['_shapes', ['k1', 'k2']],
    ]);
    expect(folderGroups(folderKeys(['a_gt.png', 'b_gt.png', 'c_gt.png', 'notes_x.png']))).toEqual([]);
  });
});

describe('datasetPair by frame key', () => {
  it('pairs suffixed photos, nested truth and flat predictions', () => {
    const p = datasetPair({
      images: ['k1_photo.jpg', 'k2_photo.jpg'],
      truth: ['east/k1_gt.png', 'west/k2_gt.png'],
      predictions: { m: ['k1_pred.png', 'k2_pred.png'] },
    });
    expect(p.frames.map((f) => [f.name, f.image, f.truth, f.predictions.m])).toEqual([
      ['east/k1', 'k1_photo.jpg', 'east/k1_gt.png', 'k1_pred.png'],
      ['west/k2', 'k2_photo.jpg', 'west/k2_gt.png', 'k2_pred.png'],
    ]);
    expect(p.unpaired).toEqual([]);
    expect(p.ambiguous).toEqual([]);
  });

  it('a single frame pairs through its suffix-free name', () => {
    const p = datasetPair({ images: [], truth: ['k1_gt.png'], predictions: { m: ['k1_pred.png'] } });
    expect(p.frames[0].predictions.m).toBe('k1_pred.png');
  });

  it('never guesses: a flat key matching two nested truth files, and two nested predictions for one frame, are ambiguous', () => {
    const p = datasetPair({ images: [], truth: ['a/k.png', 'b/k.png', 'c/j.png'], predictions: { m: ['k.png', 'x/j.png', 'y/j.png'] } });
    expect(p.ambiguous).toEqual([
      { folder: 'predictions/m', file: 'k.png', candidates: ['truth/a/k.png', 'truth/b/k.png'] },
      { folder: 'predictions/m', file: 'x/j.png', candidates: ['predictions/m/y/j.png', 'truth/c/j.png'] },
      { folder: 'predictions/m', file: 'y/j.png', candidates: ['predictions/m/x/j.png', 'truth/c/j.png'] },
    ]);
    expect(p.frames.every((f) => f.predictions.m === null)).toBe(true);
  });

  it('uses one encoding group and reports the choice; a photo folder that pairs with nothing is a warning', () => {
    const p = datasetPair({
      images: ['zzz.png'],
      truth: ['k1_ids.png', 'k1_color.png', 'k2_ids.png', 'k2_color.png'],
      predictions: {},
    }, { chosen: { truth: '_ids' } });
    expect(p.frames.map((f) => f.truth)).toEqual(['k1_ids.png', 'k2_ids.png']);
    expect(p.groups).toEqual([{ folder: 'truth', groups: [{ tail: '_color', files: 2, sample: 'k1_color.png' }, { tail: '_ids', files: 2, sample: 'k1_ids.png' }], chosen: '_ids', why: 'chosen in the description file' }]);
    expect(p.warnings?.[0]).toMatch(/^none of the 1 photos pairs with a frame/);
  });
});
