import { describe, expect, it } from 'vitest';
import { descriptionFromText } from '../../src/data/description.ts';
import { frameListParse, pairingListed } from '../../src/data/frameList.ts';
import { layoutFromPaths } from '../../src/data/layout.ts';
import { datasetPair } from '../../src/data/pairing.ts';

// hairline.json, folder guessing and list files: README "Your data".

function errorOf(text: string): string {
  const r = descriptionFromText(text);
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('hairline.json', () => {
  it('reads folders as paths or objects', () => {
    const r = descriptionFromText('{"truth":{"folder":"gt","suffix":"_gt_class"},"predictions":{"m":"out/m"},"images":"photos","list":"val.txt"}');
    expect(r.ok && r.value).toEqual({ truth: { folder: 'gt', suffix: '_gt_class' }, predictions: { m: { folder: 'out/m' } }, images: { folder: 'photos' }, list: 'val.txt' });
  });

  it('bad files give one line naming the key and the problem', () => {
    expect(errorOf('{"truth":3}')).toBe('hairline.json: "truth": expected a folder path, or { "folder", "suffix", "pattern" }');
    expect(errorOf('{"truth":"a","colours":1}')).toBe('hairline.json: Unrecognized key: "colours"');
    expect(errorOf('{"truth":{"folder":"a","sufix":"_x"}}')).toBe('hairline.json: "truth": Unrecognized key: "sufix"');
    expect(errorOf('{"truth":"a","predictions":{"m":{"folder":2}}}')).toBe('hairline.json: "predictions.m.folder": expected a path relative to the dataset root');
    expect(errorOf('{"truth":"../elsewhere"}')).toBe('hairline.json: "truth.folder": must be a path inside the dataset root (no leading /, no ..)');
    expect(errorOf('{"truth":{"folder":"a","pattern":"^x$"}}')).toMatch(/^hairline.json: "truth.pattern": is not a regular expression with a group/);
    expect(errorOf('{"images":"a"}')).toBe('hairline.json: "truth": expected a folder path, or { "folder", "suffix", "pattern" }');
    expect(errorOf('{"truth":')).toMatch(/^hairline.json: is not valid JSON/);
  });
});

describe('layoutFromPaths', () => {
  it('recognises role folders by name: a flat prediction folder is one run, a folder of folders is one run each', () => {
    const r = layoutFromPaths(['GT/a.png', 'photos/a.jpg', 'preds/a.png', 'classes.json'], null);
    expect(r.ok && [r.value.listing, r.value.dirs, r.value.classesPath]).toEqual([
      { truth: ['a.png'], images: ['a.jpg'], predictions: { preds: ['a.png'] }, confidence: {} },
      { truth: 'GT', images: 'photos', 'predictions/preds': 'preds' },
      'classes.json',
    ]);
    const runs = layoutFromPaths(['truth/a.png', 'predictions/x/a.png', 'predictions/y/a.png'], null);
    expect(runs.ok && Object.keys(runs.value.listing.predictions)).toEqual(['x', 'y']);
  });

  it('a folder it cannot read says what it expected and what it found', () => {
    const r = layoutFromPaths(['scans/a.png', 'scans/b.png', 'notes.txt'], null);
    expect(r.ok ? '' : r.error).toMatch(/^no ground-truth folder found: expected truth\/ .* or a hairline.json at the root naming the folders .*\. Found: notes.txt, scans\/ \(2 files\)$/);
  });

  it('follows the description: folders, suffix and key pattern', () => {
    const d = descriptionFromText('{"truth":{"folder":"lab","pattern":"^(.+)-lbl$"},"predictions":{"m":"out"}}');
    if (!d.ok) throw new Error(d.error);
    const r = layoutFromPaths(['lab/x1-lbl.png', 'lab/x2-lbl.png', 'lab/readme.png', 'out/x1.png', 'out/x2.png'], d.value);
    if (!r.ok) throw new Error(r.error);
    const p = datasetPair(r.value.listing, r.value.pair);
    expect(p.frames.map((f) => [f.name, f.predictions.m])).toEqual([['x1', 'x1.png'], ['x2', 'x2.png']]);
    expect(p.unpaired).toEqual([{ folder: 'truth', file: 'readme.png', reason: 'does not match the key pattern ^(.+)-lbl$ of hairline.json' }]);
  });
});

describe('list files', () => {
  const pairing = datasetPair({ images: [], truth: ['south/b1.png', 'north/b2.png', 'north/b3.png'], predictions: {} });

  it('keeps the listed frames; blank lines and # comments ignored; flat keys find nested frames', () => {
    const keys = frameListParse('# val\nb1\n\n north/b3.png  # the odd one\n');
    expect(keys).toEqual(['b1', 'north/b3']);
    const r = pairingListed(pairing, keys, 'val.txt');
    expect(r.ok && r.value.frames.map((f) => f.name)).toEqual(['north/b3', 'south/b1']);
  });

  it('a listed frame that does not exist is an error naming it', () => {
    const r = pairingListed(pairing, ['b1', 'b9'], 'val.txt');
    expect(r.ok ? '' : r.error).toBe('val.txt: lists a frame that the dataset does not have: b9');
  });
});
