import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Writes the Kestrel Quay demo with `npm run demo`'s own code into a new temporary folder (the demo in `<folder>/kq`); returns the folder. */
export function demoOnDisk(prefix: string, frames: number, width: number, height: number): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  const gen = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/demo.ts', '--out', join(dir, 'kq'), '--frames', String(frames), '--size', `${width}x${height}`], { encoding: 'utf8' });
  if (gen.status !== 0) throw new Error(`demo generation failed: ${gen.stderr}`);
  return dir;
}
