/**
 * Benchmark of the Kestrel Quay demo generator: the stages of one frame (best of a few runs) at a
 * size, then the whole dataset written by the CLI writer, wall time and CPU time of all threads.
 * CPU time is reported because this machine's 2 cores are shared: wall time moves with others' load.
 * Run: npx tsx test/bench/demo.bench.ts [WxH=1024x512] [frames=48] [threads=2]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoDatasetWrite } from '../../src/cli/demoWrite.ts';
import { demoCamera } from '../../src/demo/camera.ts';
import { demoFrame } from '../../src/demo/frame.ts';
import { photoFinish } from '../../src/demo/finish.ts';
import { demoMistakePlan } from '../../src/demo/mistakePlan.ts';
import { predictionLabels } from '../../src/demo/predict.ts';
import { sceneRender } from '../../src/demo/render.ts';
import { demoScene } from '../../src/demo/scene.ts';

const [W, H] = (process.argv[2] ?? '1024x512').split('x').map(Number);
const FRAMES = Number(process.argv[3] ?? 48);
const THREADS = Number(process.argv[4] ?? 2);
const o = { width: W, height: H, frames: FRAMES, seed: 1 };
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

function best(name: string, reps: number, fn: () => void): void {
  let wall = Infinity;
  let cpu = Infinity;
  for (let r = 0; r < reps; r++) {
    const c0 = cpuMs();
    const t0 = performance.now();
    fn();
    wall = Math.min(wall, performance.now() - t0);
    cpu = Math.min(cpu, cpuMs() - c0);
  }
  console.log(`${name.padEnd(28)} ${wall.toFixed(1).padStart(7)} ms wall ${cpu.toFixed(1).padStart(7)} ms cpu`);
}

console.log(`demo generator, ${W}×${H}, load average ${loadavg().map((l) => l.toFixed(1)).join(' ')}`);
const scene = demoScene(1);
best('mistake plan (once per seed)', 1, () => demoMistakePlan(o));
const cam = demoCamera(20, FRAMES, W, H);
let rgb = new Float32Array(0);
best('photo render', 5, () => void (rgb = sceneRender(scene, cam, { instClass: scene.baseClass, hoodClass: 255, photo: true }).rgb!.slice()));
best('photo finish', 5, () => photoFinish(rgb, W, H, 1, 20));
best('label render', 5, () => sceneRender(scene, cam, { instClass: scene.baseClass, hoodClass: 255, photo: false }));
const visible = new Uint32Array(scene.baseClass.length);
const ctx = { scene, cam, frames: FRAMES, visible, exempt: new Set<number>() };
best('prediction run-a', 5, () => predictionLabels('run-a', ctx));
best('prediction run-b', 5, () => predictionLabels('run-b', ctx));
best('whole frame, portable zlib', 3, () => demoFrame(20, o));

const dir = mkdtempSync(join(tmpdir(), 'hairline-demo-bench-'));
const c0 = cpuMs();
const written = await demoDatasetWrite(join(dir, 'demo'), o, THREADS);
const cpu = cpuMs() - c0;
rmSync(dir, { recursive: true, force: true });
if (!written.ok) throw new Error(written.error);
console.log(`dataset: ${FRAMES} frames on ${written.value.threads} threads in ${(written.value.ms / 1000).toFixed(2)} s wall, ${(cpu / 1000).toFixed(2)} s cpu (all threads), load average now ${loadavg()[0].toFixed(1)}`);
