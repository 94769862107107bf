import { spawnSync } from 'node:child_process';
import { mkdtemp, readdir, readFile, rm, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { UsageError } from '../../src/cli/args.ts';
import { demoArgsParse } from '../../src/cli/demo.ts';
import { demoDatasetWrite } from '../../src/cli/demoWrite.ts';
import { classTableFromText } from '../../src/core/classTable.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { demoAnswerKey, demoFrameRaster } from '../../src/demo/frame.ts';

const O = { width: 256, height: 128, frames: 5, seed: 3 };
let root: string;

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'hairline-demo-'));
});
afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

async function tree(dir: string): Promise<Record<string, string[]>> {
  const out: Record<string, string[]> = {};
  for (const sub of ['.', 'images', 'truth', 'instances', 'predictions/run-a', 'predictions/run-b']) out[sub] = (await readdir(join(dir, sub))).sort();
  return out;
}

describe('demoArgsParse', () => {
  it('reads --out, --size, --frames and --seed', () => {
    expect(demoArgsParse(['--out', 'x', '--size', '2048x1024', '--frames', '12', '--seed', '7'])).toEqual({
      out: 'x',
      options: { width: 2048, height: 1024, frames: 12, seed: 7 },
      threads: undefined,
    });
    expect(demoArgsParse(['--out=y']).options).toEqual({ width: 1024, height: 512, frames: 48, seed: 1 });
  });

  it('says what is wrong with the command line', () => {
    expect(() => demoArgsParse([])).toThrow(/--out DIR is required/);
    expect(() => demoArgsParse(['--out', 'x', '--size', '1024'])).toThrow(/--size must look like 1024x512/);
    expect(() => demoArgsParse(['--out', 'x', '--frames', '0'])).toThrow(/frames must be an integer/);
    expect(() => demoArgsParse(['--out', 'x', '--colour', 'red'])).toThrow(UsageError);
  });

  it('exits with code 1 and one line on stderr when run with a bad option', () => {
    const r = spawnSync('npx', ['tsx', 'src/cli/demo.ts', '--out', join(root, 'never'), '--size', 'big'], { encoding: 'utf8' });
    expect(r.status).toBe(1);
    expect(r.stderr.trim()).toBe('demo: --size must look like 1024x512, got "big"');
  });
});

describe('demoDatasetWrite', () => {
  it('writes the dataset layout, the same on one thread and on two', async () => {
    const one = join(root, 'one');
    const two = join(root, 'two');
    const a = await demoDatasetWrite(one, O, 1);
    const b = await demoDatasetWrite(two, O, 2);
    expect(a.ok && b.ok).toBe(true);
    if (!a.ok || !b.ok) return;
    expect(b.value.threads).toBe(2);
    const names = ['kq-0001.png', 'kq-0002.png', 'kq-0003.png', 'kq-0004.png', 'kq-0005.png'];
    expect(await tree(one)).toEqual({
      '.': ['answer-key.json', 'classes.json', 'images', 'instances', 'predictions', 'truth'],
      images: names,
      truth: names,
      instances: names,
      'predictions/run-a': names,
      'predictions/run-b': names,
    });
    for (const sub of ['images', 'truth', 'instances', 'predictions/run-a', 'predictions/run-b']) {
      for (const n of names) expect(Buffer.compare(await readFile(join(one, sub, n)), await readFile(join(two, sub, n))), `${sub}/${n}`).toBe(0);
    }
    expect(await readFile(join(one, 'answer-key.json'), 'utf8')).toBe(await readFile(join(two, 'answer-key.json'), 'utf8'));
  });

  it('writes files users can open: classes.json parses, truth decodes to the generated frame, the key matches', async () => {
    const dir = join(root, 'one');
    const table = classTableFromText(await readFile(join(dir, 'classes.json'), 'utf8'));
    expect(table.ok).toBe(true);
    if (!table.ok) return;
    const decoded = labelMapFromPng(new Uint8Array(await readFile(join(dir, 'truth', 'kq-0003.png'))), { file: 'kq-0003.png', table: table.value });
    expect(decoded.ok).toBe(true);
    if (decoded.ok) expect(Array.from(decoded.value.ids)).toEqual(Array.from(demoFrameRaster(2, O).truth.ids));
    expect(JSON.parse(await readFile(join(dir, 'answer-key.json'), 'utf8'))).toEqual(demoAnswerKey(O));
  });

  it('refuses a folder that holds something else, and tidies frames left by a longer earlier demo', async () => {
    const other = join(root, 'other');
    await mkdir(other);
    await writeFile(join(other, 'notes.txt'), 'mine');
    const refused = await demoDatasetWrite(other, O, 1);
    expect(refused).toEqual({ ok: false, error: `${other}: holds files that are not a demo (notes.txt); choose a new or empty folder` });
    expect(await readFile(join(other, 'notes.txt'), 'utf8')).toBe('mine');
    const shorter = await demoDatasetWrite(join(root, 'one'), { ...O, frames: 3 }, 1);
    expect(shorter.ok).toBe(true);
    expect((await tree(join(root, 'one'))).truth).toEqual(['kq-0001.png', 'kq-0002.png', 'kq-0003.png']);
  });

  it('says which path could not be written, rather than throwing', async () => {
    const file = join(root, 'a-file');
    await writeFile(file, 'x');
    expect(await demoDatasetWrite(file, O, 1)).toEqual({ ok: false, error: `${file}: exists and is not a folder` });
    const r = await demoDatasetWrite(join(file, 'below'), O, 1);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/a-file.*: could not be written \((ENOTDIR|EEXIST)\)$/);
  });
});
