// src/cli/outputFile.ts: writes issued without waiting for each other (as the streaming ZIP sink does)
// reach the file in call order; the commit waits for them. Checked against the bytes read back with
// node:fs readFileSync.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { outputOpen } from '../../src/cli/outputFile.ts';

const dir = mkdtempSync(join(tmpdir(), 'hairline-output-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('outputOpen', () => {
  it('keeps call order for writes that are not awaited one by one, and commits after the last', async () => {
    const path = join(dir, 'ordered.bin');
    const f = await outputOpen(path, '--out');
    // Chunks of very different sizes, so unordered writes would finish out of order.
    const chunks = Array.from({ length: 200 }, (_, i) => new Uint8Array(i % 7 === 0 ? 1 << 18 : 3 + i).fill(i & 255));
    const all = chunks.map((c) => f.write(c));
    const done = f.commit();
    await Promise.all([...all, done]);
    expect(existsSync(`${path}.partial`)).toBe(false);
    const got = readFileSync(path);
    const want = Buffer.concat(chunks);
    expect(got.length).toBe(want.length);
    expect(got.equals(want)).toBe(true);
  });
});
