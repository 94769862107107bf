import { describe, expect, it } from 'vitest';
import { layoutFromPaths } from '../../src/data/layout.ts';
import { datasetPair } from '../../src/data/pairing.ts';

// Instance maps (src/docs/metrics.md "Instance-weighted IoU") pair with frames like any other role.
describe('instance maps as a role', () => {
  it('pair by frame key, suffix stripped, and a frame without one gets null', () => {
    const p = datasetPair({
      truth: ['a_0001_gt.png', 'a_0002_gt.png'],
      images: [],
      predictions: { r: ['a_0001_pred.png', 'a_0002_pred.png'] },
      instances: ['a_0001_inst.png', 'b_0009_inst.png'],
    });
    expect(p.frames.map((f) => f.instance)).toEqual(['a_0001_inst.png', null]);
    expect(p.unpaired.some((u) => u.folder === 'instances' && u.file === 'b_0009_inst.png')).toBe(true);
  });

  it('are left out of frames when the dataset has none', () => {
    const p = datasetPair({ truth: ['x1.png'], images: [], predictions: { r: ['x1.png'] } });
    expect('instance' in p.frames[0]).toBe(false);
  });

  it('are found in a folder named instances/ at the dataset root', () => {
    const l = layoutFromPaths(['truth/k1.png', 'predictions/m/k1.png', 'instances/k1.png'], null);
    expect(l.ok && l.value.listing.instances).toEqual(['k1.png']);
    expect(l.ok && l.value.dirs.instances).toBe('instances');
  });
});
