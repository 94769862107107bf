import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { tableRowGroups } from '../../src/cli/parquetTable.ts';
import { localSlurmStart, slurmAvailable, type LocalSlurm } from './slurmLocal.ts';

// The shipped Slurm scripts (src/cluster/slurm) on a real one-node Slurm cluster started from
// Debian's packages: submit.sh submits a job array of 3 shards (sbatch --array=0-2) and the merge as a
// job depending on it, and waits; the merged results folder must equal one run on one machine, every
// number of summary.json and every row of the tables.

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const unavailable = slurmAvailable();
if (unavailable) console.log(unavailable);
let dir = '';
let cluster: LocalSlurm | null = null;
afterAll(() => {
  cluster?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function rows(path: string): Promise<unknown[]> {
  const out: unknown[] = [];
  for await (const g of tableRowGroups<unknown>(path)) out.push(...g);
  return out;
}
const summary = (d: string) => JSON.parse(readFileSync(join(d, 'summary.json'), 'utf8'));

describe('Slurm job array (src/cluster/slurm)', () => {
  it.skipIf(unavailable !== null)('3 shards as an array job and a dependent merge equal a single-machine run', async () => {
    dir = mkdtempSync(join(tmpdir(), 'hairline-slurm-data-'));
    const kq = join(dir, 'kq');
    const demo = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/demo.ts', '--out', kq, '--size', '256x128', '--frames', '15', '--threads', '2'], { cwd: ROOT, encoding: 'utf8' });
    expect(demo.status, demo.stderr).toBe(0);
    const args = ['--truth', join(kq, 'truth'), '--pred', `a=${join(kq, 'predictions', 'run-a')}`, '--pred', `b=${join(kq, 'predictions', 'run-b')}`, '--images', join(kq, 'images'), '--classes', join(kq, 'classes.json')];
    const one = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/score.ts', ...args, '--results', join(dir, 'one'), '--workers', '2'], { cwd: ROOT, encoding: 'utf8' });
    expect(one.status, one.stderr).toBe(0);

    cluster = localSlurmStart();
    const out = join(dir, 'slurm');
    const r = spawnSync('bash', [join(ROOT, 'src/cluster/slurm/submit.sh'), '--wait', '3', out, ...args], { cwd: ROOT, encoding: 'utf8', env: cluster.env, timeout: 900_000 });
    const logs = spawnSync('bash', ['-c', `tail -n 20 ${out}/*.out`], { encoding: 'utf8' }).stdout;
    expect(r.status, `${r.stdout}${r.stderr}\n${logs}`).toBe(0);
    expect(r.stdout).toMatch(/job array \d+ \(3 shards\)/);
    for (const k of [0, 1, 2]) expect(summary(join(out, `part-${k}`)).shard).toEqual({ index: k, count: 3 });
    expect(summary(join(out, 'merged'))).toEqual(summary(join(dir, 'one')));
    for (const t of ['frames', 'regions', 'queue']) expect(await rows(join(out, 'merged', `${t}.parquet`)), t).toEqual(await rows(join(dir, 'one', `${t}.parquet`)));
  }, 1_200_000);
});
