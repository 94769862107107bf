// Hostile input stays bounded, through the real scorer under a 1.5 GB data-size limit (prlimit
// --data; typed arrays past it fail to allocate): 16-bit maps holding thousands of ids and no class
// table, huge class tables, a file far larger than its PNG header allows, runs named like object
// members, class names with bidi controls and no length limit.
import { spawnSync } from 'node:child_process';
import { closeSync, mkdirSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { labelMapToPng } from '../../src/core/png/encode.ts';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'hairline-bounds-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs the real scorer with at most 1.5 GB of data memory (util-linux prlimit). */
function scoreLimited(args: string[]): { status: number; stdout: string; stderr: string; seconds: number } {
  const t0 = Date.now();
  const r = spawnSync('prlimit', ['--data=1500000000', process.execPath, '--import', 'tsx', 'src/cli/score.ts', ...args], {
    cwd: ROOT, encoding: 'utf8', timeout: 120_000, maxBuffer: 1 << 26,
  });
  if (r.error) throw new Error(`this test needs prlimit (Debian package util-linux): ${r.error.message}`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr, seconds: (Date.now() - t0) / 1000 };
}

/** Writes `frames` 30×30 16-bit truth/prediction pairs whose ids come from `idOf(frame, pixel)`. */
function ids16(root: string, frames: number, idOf: (f: number, p: number) => number): void {
  for (const sub of ['truth', 'pred']) mkdirSync(join(root, sub), { recursive: true });
  for (let f = 0; f < frames; f++) {
    const ids = new Uint16Array(900).map((_, p) => idOf(f, p));
    const png = labelMapToPng({ width: 30, height: 30, ids }, { kind: 'gray', bitDepth: 16 });
    writeFileSync(join(root, 'truth', `f${String(f).padStart(2, '0')}.png`), png);
    writeFileSync(join(root, 'pred', `f${String(f).padStart(2, '0')}.png`), png);
  }
}

const table = (n: number, name = (i: number) => `c${i}`) =>
  JSON.stringify({ ignore: 65535, classes: Array.from({ length: n }, (_, i) => ({ id: i, name: name(i), color: `#${(i * 2654435761 % 0xffffff).toString(16).padStart(6, '0')}` })) });

describe('hostile input is bounded (real CLI, 1.5 GB data limit)', () => {
  it('six 16-bit frames holding 5,400 distinct ids and no class table: each frame fails with a clear message', () => {
    const root = join(dir, 'ids');
    ids16(root, 6, (f, p) => f * 900 + p);
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--workers', '1', '--out', join(dir, 'ids.json')]);
    expect(r.status, r.stderr).toBe(3);
    const report = JSON.parse(readFileSync(join(dir, 'ids.json'), 'utf8'));
    for (const f of report.frames) {
      expect(f.error).toMatch(/: \d+ distinct ids in this frame's ground truth and predictions and no classes\.json; at most 256 classes are scored/);
    }
  });

  it('frames of 180 ids each adding up past 256 without a table: frames beyond the bound fail, the rest are scored', () => {
    const root = join(dir, 'union');
    ids16(root, 30, (f, p) => f * 180 + (p % 180));
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--workers', '1', '--out', join(dir, 'union.json')]);
    expect(r.status, r.stderr).toBe(3);
    const report = JSON.parse(readFileSync(join(dir, 'union.json'), 'utf8'));
    expect(report.frames[0].error).toBeNull();
    const failed = report.frames.filter((f: { error: string | null }) => f.error);
    expect(failed.length).toBe(29);
    expect(failed[0].error).toMatch(/more than 256 distinct ids .* and has no classes\.json; at most 256 classes are scored/);
    expect(report.classes.length).toBeLessThanOrEqual(256);
  });

  it.each([[3000], [20000]])('a %i-class table is refused at once with one line (exit 1)', (n) => {
    const root = join(dir, `t${n}`);
    ids16(root, 2, (_, p) => p % 50);
    writeFileSync(join(root, 'classes.json'), table(n));
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--classes', join(root, 'classes.json'), '--workers', '1']);
    expect(r.status).toBe(1);
    expect(r.stderr.trim()).toBe(`hairline score: ${join(root, 'classes.json')}: lists ${n} classes; at most 256 are scored (every frame keeps counts for each pair of classes)`);
  });

  it('a 1.5 GB file with a 30×30 PNG header is refused from its first 33 bytes, never read whole', () => {
    const root = join(dir, 'huge');
    ids16(root, 2, (_, p) => p % 3);
    const png = labelMapToPng({ width: 30, height: 30, ids: new Uint8Array(900) }, { kind: 'gray', bitDepth: 8 });
    const path = join(root, 'pred', 'f01.png');
    const fd = openSync(path, 'w');
    writeSync(fd, png);
    writeSync(fd, new Uint8Array(1), 0, 1, 1_500_000_000); // sparse: 1.5 GB on paper
    closeSync(fd);
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', `run=${join(root, 'pred')}`, '--workers', '1', '--out', join(dir, 'huge.json')]);
    expect(r.status, r.stderr).toBe(3);
    const report = JSON.parse(readFileSync(join(dir, 'huge.json'), 'utf8'));
    expect(report.frames[0].error).toBeNull();
    expect(report.frames[1].error).toBe('run/f01.png: could not be read (it is 1.5 GB, more than a 30×30 8-bit grayscale PNG can hold (at most 16.8 MB even uncompressed))');
  });

  it('runs named constructor and __proto__ are scored like any other', () => {
    const root = join(dir, 'proto');
    ids16(root, 2, (f, p) => (p + f) % 3);
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', `constructor=${join(root, 'pred')}`, '--pred', `__proto__=${join(root, 'pred')}`, '--workers', '1', '--out', join(dir, 'proto.json')]);
    expect(r.status, r.stderr).toBe(0);
    const report = JSON.parse(readFileSync(join(dir, 'proto.json'), 'utf8'));
    expect(Object.keys(report.runs).sort()).toEqual(['__proto__', 'constructor']);
    expect(report.runs.constructor.meanIoU).toBe(1);
  });

  it('class names lose bidi and control characters and are cut to 80 characters', () => {
    const root = join(dir, 'names');
    ids16(root, 1, (_, p) => p % 2);
    writeFileSync(join(root, 'classes.json'), table(2, (i) => (i === 0 ? 'crane\u202egnp.exe\x1b[31m' : 'x'.repeat(100_000))));
    const r = scoreLimited(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--classes', join(root, 'classes.json'), '--workers', '1', '--out', join(dir, 'names.json')]);
    expect(r.status, r.stderr).toBe(0);
    const names = JSON.parse(readFileSync(join(dir, 'names.json'), 'utf8')).classes.map((c: { name: string }) => c.name);
    expect(names).toEqual(['cranegnp.exe[31m', 'x'.repeat(79) + '…']);
  });
});
