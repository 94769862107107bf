import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

describe('npm start', () => {
  it.skipIf(existsSync('dist/index.html'))('says in one sentence that --no-build needs a built app, without a stack trace', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'hairline-start-'));
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/start.ts', dir, '--no-build', '--port', '0'], { encoding: 'utf8', timeout: 60_000 });
    expect(r.status).toBe(1);
    expect(r.stderr.trim()).toBe('hairline start: --no-build: there is no built app in dist/ yet; run npm start once without --no-build');
  });
});
