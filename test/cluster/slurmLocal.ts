// A one-node Slurm cluster for the tests, from Debian's packages (slurm-wlm, munge): its own munge
// key and socket, and a slurm.conf naming this host with proctrack/linuxproc and task/none (no
// cgroups needed), all in a temporary folder, on ports of its own. Installs the packages when they are
// missing and we are root; otherwise says what is missing.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, chmodSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';

const PROGRAMS = ['/usr/sbin/munged', '/usr/sbin/slurmctld', '/usr/sbin/slurmd', '/usr/bin/sbatch', '/usr/bin/sinfo'];

/** Returns null when Slurm and munge are there (installing them as root), else why the Slurm test cannot run. */
export function slurmAvailable(): string | null {
  const missing = () => PROGRAMS.filter((p) => !existsSync(p));
  if (missing().length === 0) return null;
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!root) return `Slurm test skipped: ${missing().join(', ')} missing and not root; install with: sudo apt-get install -y slurm-wlm munge`;
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const install = () => spawnSync('apt-get', ['install', '-y', '-qq', 'slurm-wlm', 'munge'], { stdio: 'inherit', env }).status === 0;
  if (!install()) {
    spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
    install();
  }
  const still = missing();
  if (still.length) throw new Error(`apt-get install slurm-wlm munge did not provide ${still.join(', ')}`);
  return null;
}

export interface LocalSlurm {
  /** Environment for sbatch and friends (SLURM_CONF). */
  env: NodeJS.ProcessEnv;
  dir: string;
  stop(): void;
}

const run = (cmd: string, args: string[], env = process.env) => spawnSync(cmd, args, { encoding: 'utf8', env });

/** Starts munged, slurmctld and slurmd; returns once the node is idle (or throws with the daemons' logs). */
export function localSlurmStart(): LocalSlurm {
  const dir = mkdtempSync(join(tmpdir(), 'hairline-slurm-'));
  const host = hostname();
  for (const d of ['state', 'spool']) mkdirSync(join(dir, d));
  writeFileSync(join(dir, 'munge.key'), randomBytes(1024));
  chmodSync(join(dir, 'munge.key'), 0o400);
  writeFileSync(join(dir, 'plugstack.conf'), '');
  const port = 20000 + Math.floor(Math.random() * 20000);
  const conf = join(dir, 'slurm.conf');
  writeFileSync(conf, [
    'ClusterName=hairlinetest', `SlurmctldHost=${host}`, `SlurmctldPort=${port}`, `SlurmdPort=${port + 1}`,
    'AuthType=auth/munge', `AuthInfo=socket=${dir}/munge.sock`, `StateSaveLocation=${dir}/state`, `SlurmdSpoolDir=${dir}/spool`,
    `SlurmctldPidFile=${dir}/slurmctld.pid`, `SlurmdPidFile=${dir}/slurmd.pid`, `SlurmctldLogFile=${dir}/slurmctld.log`, `SlurmdLogFile=${dir}/slurmd.log`,
    'SlurmUser=root', 'SlurmdUser=root', 'ProctrackType=proctrack/linuxproc', 'TaskPlugin=task/none', 'SchedulerType=sched/builtin',
    'SelectType=select/cons_tres', 'SelectTypeParameters=CR_Core', 'ReturnToService=2', 'MpiDefault=none', 'JobCompType=jobcomp/none',
    'AccountingStorageType=accounting_storage/none', `PlugStackConfig=${dir}/plugstack.conf`,
    `NodeName=${host} CPUs=2 State=UNKNOWN`, `PartitionName=main Nodes=${host} Default=YES MaxTime=INFINITE State=UP OverSubscribe=YES`, '',
  ].join('\n'));
  const env = { ...process.env, SLURM_CONF: conf };
  const pids = () => ['slurmd', 'slurmctld', 'munged'].flatMap((d) => {
    const f = join(dir, `${d}.pid`);
    return existsSync(f) ? [Number(readFileSync(f, 'utf8').trim())] : [];
  });
  const alive = (pid: number) => {
    try {
      process.kill(pid, 0);
      return true;
    } catch {
      return false;
    }
  };
  const stop = () => {
    const started = pids();
    for (const pid of started) if (alive(pid)) process.kill(pid);
    // The controller saves its state as it stops: wait for the daemons to be gone before removing their folder.
    const until = Date.now() + 15_000;
    while (started.some(alive) && Date.now() < until) spawnSync('sleep', ['0.2']);
    rmSync(dir, { recursive: true, force: true, maxRetries: 5, retryDelay: 200 });
  };
  const logs = () => ['munged', 'slurmctld', 'slurmd'].map((d) => {
    const f = join(dir, `${d}.log`);
    return `--- ${d}.log\n${existsSync(f) ? readFileSync(f, 'utf8').split('\n').slice(-15).join('\n') : '(none)'}`;
  }).join('\n');
  const steps: [string, string[]][] = [
    ['/usr/sbin/munged', ['-f', `--key-file=${dir}/munge.key`, `--socket=${dir}/munge.sock`, `--pid-file=${dir}/munged.pid`, `--log-file=${dir}/munged.log`, `--seed-file=${dir}/munge.seed`]],
    ['/usr/sbin/slurmctld', ['-f', conf]],
    ['/usr/sbin/slurmd', ['-f', conf]],
  ];
  for (const [cmd, args] of steps) {
    const r = run(cmd, args, env);
    if (r.status !== 0) {
      stop();
      throw new Error(`${cmd} did not start (${r.status}): ${r.stderr}\n${logs()}`);
    }
  }
  const until = Date.now() + 60_000;
  for (;;) {
    const s = run('sinfo', ['-h', '-o', '%T'], env);
    if (s.status === 0 && /idle/.test(s.stdout)) break;
    if (Date.now() > until) {
      const text = logs();
      stop();
      throw new Error(`the Slurm node did not come up (sinfo: ${s.stdout}${s.stderr})\n${text}`);
    }
    spawnSync('sleep', ['1']);
  }
  return { env, dir, stop };
}
