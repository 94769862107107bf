import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { CLASS_IDS, IGNORE, objectsRefRun, sequenceMake, type Frame } from '../reference/objectsRef.ts';
import { pythonRefRequire, reportDifferences } from '../reference/pythonRef.ts';
import { scoreCli } from './scoreRun.ts';

// Flicker, objects and iIoU through the real scorer (threads, PNG files, pairing, sequences by name)
// against test/reference/objects_ref.py: scipy.ndimage.label with a 3×3 structure for the objects, a
// numpy reading of Cordts et al., CVPR 2016, §3.2 for iIoU and of src/docs/metrics.md for flip-back.

let dir = '';
let frames: Frame[] = [];

function write(path: string, bytes: Uint8Array | string): void {
  mkdirSync(join(path, '..'), { recursive: true });
  writeFileSync(path, bytes);
}

beforeAll(() => {
  pythonRefRequire();
  dir = mkdtempSync(join(tmpdir(), 'hairline-scene-'));
  frames = [
    ...sequenceMake(['dock_0001', 'dock_0002', 'dock_0003', 'dock_0004', 'dock_0005'], 120, 80, 51),
    ...sequenceMake(['gate_0007', 'gate_0008', 'gate_0012'], 64, 48, 61, 0.25),
    ...sequenceMake(['overview'], 40, 30, 71),
  ];
  for (const f of frames) {
    write(join(dir, 'truth', `${f.name}_gt.png`), labelMapToPng(f.truth, { kind: 'gray', bitDepth: 8 }));
    write(join(dir, 'pred', `${f.name}.png`), labelMapToPng(f.pred, { kind: 'gray', bitDepth: 8 }));
    write(join(dir, 'inst', `${f.name}_inst.png`), labelMapToPng({ ...f.truth, ids: f.instances }, { kind: 'gray', bitDepth: 16 }));
  }
  write(join(dir, 'classes.json'), JSON.stringify({ ignore: IGNORE, classes: CLASS_IDS.map((id) => ({ id, name: `c${id}`, color: `#0${id}0${id}0${id}` })) }));
});
afterAll(() => dir && rmSync(dir, { recursive: true, force: true }));

describe('npm run score: flicker, objects and iIoU against the reference', () => {
  it('agree to 1e-9 on every frame and dataset value', () => {
    const out = join(dir, 'report.json');
    const r = scoreCli(['--truth', join(dir, 'truth'), '--pred', join(dir, 'pred'), '--instances', join(dir, 'inst'),
      '--classes', join(dir, 'classes.json'), '--out', out, '--workers', '2']);
    expect(r.stderr).not.toMatch(/warning|failed/);
    expect(r.status).toBe(0);
    const ours = JSON.parse(readFileSync(out, 'utf8'));
    const ref = objectsRefRun(frames) as {
      frames: { name: string; flipBack: number | null; flipBackVoid: number | null; smallObjectRecall: number | null }[];
      objectsBySize: unknown; objectsBySizePerClass: unknown[]; iIoU: { mean: number | null; perClass: (number | null)[] };
      flipBack: number | null; flipBackVoid: number | null;
    };
    const pick = (f: { name: string; flipBack: unknown; flipBackVoid: unknown; smallObjectRecall: unknown }) =>
      ({ name: f.name, flipBack: f.flipBack, flipBackVoid: f.flipBackVoid, smallObjectRecall: f.smallObjectRecall });
    expect(reportDifferences(ours.frames.map(pick), ref.frames.map(pick))).toEqual([]);
    const d = ours.dataset;
    expect(reportDifferences(
      { objectsBySize: d.objectsBySize, perClass: d.objectsBySizePerClass.map((c: { bins: unknown }) => c.bins), iIoU: d.iIoU.perClass.map((c: { value: unknown }) => c.value), iIoUMean: d.iIoU.mean, flipBack: d.flipBack, flipBackVoid: d.flipBackVoid },
      { objectsBySize: ref.objectsBySize, perClass: ref.objectsBySizePerClass, iIoU: ref.iIoU.perClass, iIoUMean: ref.iIoU.mean, flipBack: ref.flipBack, flipBackVoid: ref.flipBackVoid },
    )).toEqual([]);
    // Sequences by name: dock has 3 interior frames, gate 1 (a gap in the numbers is no break), overview none.
    expect(ours.frames.filter((f: { flipBack: number | null }) => f.flipBack !== null).map((f: { name: string }) => f.name))
      .toEqual(['dock_0002', 'dock_0003', 'dock_0004', 'gate_0008']);
    expect(d.iIoU.mean).toBeGreaterThan(0);
  });

  it('without instance maps there is no iIoU; an unreadable neighbour costs only that frame its flicker, with a warning', () => {
    writeFileSync(join(dir, 'pred', 'dock_0004.png'), 'not a png');
    const r = scoreCli(['--truth', join(dir, 'truth'), '--pred', join(dir, 'pred'), '--classes', join(dir, 'classes.json'), '--workers', '1']);
    expect(r.status).toBe(3); // dock_0004 itself fails
    const report = JSON.parse(r.stdout);
    expect(report.dataset.iIoU).toBeUndefined();
    const fb = Object.fromEntries(report.frames.map((f: { name: string; flipBack: number | null }) => [f.name, f.flipBack]));
    expect(fb.dock_0003).toBeNull();
    expect(fb.dock_0005).toBeNull();
    expect(fb.dock_0002).not.toBeNull();
    expect(r.stderr).toMatch(/warning: .*dock_0004\.png.*flicker of pred not computed on this frame/);
  });
});
