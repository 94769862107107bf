// npm start's results folder (appServer.ts /results/): listed with sizes, one file at a time with
// byte ranges (RFC 9110 §14), nothing outside the folder.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, symlink, writeFile } from 'node:fs/promises';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { appServerStart } from '../../src/cli/appServer.ts';
import { httpGet } from '../support/httpGet.ts';

let server: Server;
let bare: Server;
let port: number;
let barePort: number;

const get = (p: number, target: string, headers: Record<string, string> = {}) => httpGet(p, target, 'GET', headers);

beforeAll(async () => {
  const root = await mkdtemp(join(tmpdir(), 'hairline-results-serve-'));
  for (const d of ['app', 'data', 'out']) await mkdir(join(root, d));
  await writeFile(join(root, 'app', 'index.html'), '<!doctype html>');
  await writeFile(join(root, 'secret.txt'), 'top secret');
  await writeFile(join(root, 'out', 'summary.json'), '{}');
  await writeFile(join(root, 'out', 'frames.parquet'), '0123456789');
  await symlink(join(root, 'secret.txt'), join(root, 'out', 'queue.parquet'));
  ({ server } = await appServerStart({ appDir: join(root, 'app'), datasetDir: join(root, 'data'), resultsDir: join(root, 'out'), port: 0 }));
  port = (server.address() as { port: number }).port;
  ({ server: bare } = await appServerStart({ appDir: join(root, 'app'), datasetDir: join(root, 'data'), port: 0 }));
  barePort = (bare.address() as { port: number }).port;
});
afterAll(async () => {
  await new Promise<void>((r) => server.close(() => r()));
  await new Promise<void>((r) => bare.close(() => r()));
});

describe('results folder server', () => {
  it('lists the folder with each file\'s size, and says when none is served', async () => {
    const idx = JSON.parse((await get(port, '/results/index.json')).body);
    expect(idx.title).toBe('out');
    expect(idx.files['summary.json']).toBe(2);
    expect(idx.files['frames.parquet']).toBe(10);
    expect(JSON.parse((await get(barePort, '/results/index.json')).body)).toEqual({ title: null, files: null });
    expect((await get(barePort, '/results/file/summary.json')).status).toBe(404);
  });

  it('answers byte ranges with 206 and Content-Range, and a range past the end with 416', async () => {
    const whole = await get(port, '/results/file/frames.parquet');
    expect(whole.status).toBe(200);
    expect(whole.headers['accept-ranges']).toBe('bytes');
    const part = await get(port, '/results/file/frames.parquet', { range: 'bytes=2-5' });
    expect(part.status).toBe(206);
    expect(part.body).toBe('2345');
    expect(part.headers['content-range']).toBe('bytes 2-5/10');
    expect((await get(port, '/results/file/frames.parquet', { range: 'bytes=-3' })).body).toBe('789');
    expect((await get(port, '/results/file/frames.parquet', { range: 'bytes=7-' })).body).toBe('789');
    expect((await get(port, '/results/file/frames.parquet', { range: 'bytes=20-30' })).status).toBe(416);
    expect((await get(port, '/results/file/frames.parquet', { range: 'bytes=1-2,4-5' })).status).toBe(416);
  });

  it('serves nothing outside the folder: no sub-paths, no traversal, no links leading out', async () => {
    expect((await get(port, '/results/file/..%2Fsecret.txt')).status).toBe(404);
    expect((await get(port, '/results/file/../secret.txt')).body).not.toContain('top secret');
    expect((await get(port, '/results/file/queue.parquet')).body).not.toContain('top secret');
  });
});
