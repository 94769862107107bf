// What the scorer writes never lies: an output it cannot write is a non-zero exit with a one-line
// reason and no file under the final name (a missing folder, a read-only or full file system, made
// real with a small tmpfs in a private mount namespace); Ctrl+C leaves nothing under a final name;
// CSV text cannot run as a spreadsheet formula; names never reach the terminal as control sequences.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { scoreCli } from './scoreRun.ts';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'hairline-outputs-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Frame names an attacker could give files: a formula, a terminal title change with a fake new line, bidi reordering. */
const HOSTILE = ['=HYPERLINK("x.example","y")', '-2+3', '@SUM(A1)', 'a\x1b]0;pwned\x07\nb', 'c\u202eexe.png'];

function datasetWrite(root: string, frames: string[]): void {
  mkdirSync(join(root, 'truth'), { recursive: true });
  mkdirSync(join(root, 'pred'), { recursive: true });
  frames.forEach((name, i) => {
    const ids = new Uint8Array(40 * 30).map((_, p) => ((p + i) % 40 < 20 ? 0 : 1));
    const pred = ids.map((v, p) => (p % 7 === 0 ? 1 - v : v));
    writeFileSync(join(root, 'truth', `${name}.png`), labelMapToPng({ width: 40, height: 30, ids }, { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(root, 'pred', `${name}.png`), labelMapToPng({ width: 40, height: 30, ids: pred }, { kind: 'gray', bitDepth: 8 }));
  });
  writeFileSync(join(root, 'classes.json'), JSON.stringify({ ignore: 255, classes: [{ id: 0, name: 'water', color: '#204060' }, { id: 1, name: 'quay', color: '#808070' }] }));
}

const data = join(dir, 'data');
const args = (extra: string[]) => ['--truth', join(data, 'truth'), '--pred', `run=${join(data, 'pred')}`, '--classes', join(data, 'classes.json'), '--workers', '1', ...extra];

beforeAll(() => {
  datasetWrite(data, ['plain-1', 'plain-2', ...HOSTILE]);
  // A frame that fails, named with an escape sequence: its error reaches the summary.
  writeFileSync(join(data, 'truth', 'bad\x1b[2J.png'), 'not a png');
  writeFileSync(join(data, 'pred', 'bad\x1b[2J.png'), 'not a png');
});

/** Runs the scorer in a private mount namespace with a 64 KiB tmpfs at `mnt`, `prep` run there first (as root inside). */
function scoreOnTmpfs(mnt: string, prep: string, extra: string[]): { status: number; stdout: string; stderr: string } {
  mkdirSync(mnt, { recursive: true });
  const cmd = `mount -t tmpfs -o size=64k tmpfs "${mnt}" && ${prep} && { "${process.execPath}" --import tsx src/cli/score.ts "$@"; s=$?; echo "LEFT:$(ls -A "${mnt}" | tr '\\n' ' ')"; exit $s; }`;
  const r = spawnSync('unshare', ['-rm', 'sh', '-c', cmd, 'sh', ...args(extra)], { cwd: ROOT, encoding: 'utf8', timeout: 120_000 });
  if (r.error) throw new Error(`this test needs unshare (Debian package util-linux) and user namespaces: ${r.error.message}`);
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

describe('scorer outputs', () => {
  it('refuses an --out or --csv in a missing folder before scoring, exit 1, one line, nothing written', () => {
    for (const opt of ['--out', '--csv']) {
      const target = join(dir, 'no-such-folder', 'r.json');
      const r = scoreCli(args([opt, target]));
      expect(r.status).toBe(1);
      expect(r.stderr.trim()).toBe(`hairline score: ${opt} ${target}: cannot write (the folder ${join(dir, 'no-such-folder')} does not exist (ENOENT)); nothing was written`);
      expect(r.stderr).not.toMatch(/scored \d/);
    }
  });

  it('a full disk: exit 4 saying so, and no report or partial file left under any name', () => {
    const mnt = join(dir, 'full');
    // The disk is filled up (the filler stops at ENOSPC): opening the file works, writing it does not.
    const fill = `(head -c 70000 /dev/zero > "${mnt}/filler" 2>/dev/null; true)`;
    const r = scoreOnTmpfs(mnt, fill, ['--out', join(mnt, 'r.json')]);
    expect(r.status, r.stderr).toBe(4);
    expect(r.stderr).toMatch(new RegExp(`hairline score: --out ${mnt}/r\\.json: cannot write \\(the disk is full \\(ENOSPC\\)\\); nothing was written\\n$`));
    const csv = scoreOnTmpfs(mnt, fill, ['--out', join(dir, 'ok.json'), '--csv', join(mnt, 'f.csv')]);
    expect(csv.status, csv.stderr).toBe(4);
    expect(csv.stderr).toMatch(/--csv .*f\.csv: cannot write \(the disk is full \(ENOSPC\)\)/);
    // What the scorer left on that file system (listed inside the namespace): the filler only.
    for (const x of [r, csv]) expect(x.stdout).toMatch(/^LEFT:filler $/m);
  });

  it('a read-only file system: exit 1 before scoring', () => {
    const mnt = join(dir, 'ro');
    const r = scoreOnTmpfs(mnt, `mount -o remount,ro "${mnt}"`, ['--out', join(mnt, 'r.json')]);
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toMatch(/--out .*r\.json: cannot write \(the file system is read-only \(EROFS\)\); nothing was written/);
  });

  it('writes --out and --csv whole, with no partial file left', () => {
    const out = join(dir, 'w', 'r.json');
    mkdirSync(join(dir, 'w'));
    const r = scoreCli(args(['--out', out, '--csv', join(dir, 'w', 'f.csv')]));
    expect(r.status, r.stderr).toBe(3);
    expect(readdirSync(join(dir, 'w')).sort()).toEqual(['f.csv', 'r.json']);
    expect(JSON.parse(readFileSync(out, 'utf8')).frames).toHaveLength(HOSTILE.length + 3);
  });

  it('CSV text starting with = + - @ is quoted with a leading apostrophe (OWASP CSV injection advice)', () => {
    const csv = join(dir, 'inj.csv');
    const r = scoreCli(args(['--out', join(dir, 'inj.json'), '--csv', csv]));
    expect(r.status, r.stderr).toBe(3);
    const lines = readFileSync(csv, 'utf8').split('\r\n');
    expect(lines).toContain(lines.find((l) => l.startsWith(`"'=HYPERLINK(""x.example"",""y"")",run,`)));
    expect(lines.some((l) => l.startsWith(`"'-2+3",run,`))).toBe(true);
    expect(lines.some((l) => l.startsWith(`"'@SUM(A1)",run,`))).toBe(true);
    // No field of any line starts with a formula character outside quotes.
    for (const l of lines) for (const f of l.split(',')) expect(f, l).not.toMatch(/^[=+\-@]/);
  });

  it('prints names with escape sequences, new lines and bidi controls as visible escapes', () => {
    const r = scoreCli(args(['--out', join(dir, 'term.json')]));
    expect(r.status, r.stderr).toBe(3);
    const printed = r.stdout + r.stderr;
    expect(printed).not.toMatch(/[\x1b\x07\u202e]/);
    expect(printed).not.toMatch(/\nb\s/);
    expect(printed).toContain('bad\\x1b[2J');
  });

  it('Ctrl+C while scoring or writing: exit 130, nothing under a final name, no partial file', async () => {
    const out = join(dir, 'sig', 'r.json');
    mkdirSync(join(dir, 'sig'));
    // The real helper, held open between two writes so the signal lands while the partial exists.
    const script = `import { outputOpen } from './src/cli/outputFile.ts';
      const f = await outputOpen(${JSON.stringify(out)}, '--out');
      await f.write('{"half": ');
      process.stdout.write('open\\n');
      setTimeout(() => {}, 60_000);`;
    const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: ROOT });
    let stderr = '';
    child.stderr.on('data', (c) => (stderr += c));
    await new Promise<void>((resolve) => child.stdout.on('data', () => resolve()));
    expect(existsSync(`${out}.partial`)).toBe(true);
    child.kill('SIGINT');
    const code = await new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
    expect(code, stderr).toBe(130);
    expect(stderr).toMatch(/cancelled \(SIGINT\); no unfinished file was left behind/);
    expect(readdirSync(join(dir, 'sig'))).toEqual([]);
  });
});
