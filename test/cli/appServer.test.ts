import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, symlink, writeFile } from 'node:fs/promises';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Server } from 'node:http';
import { appServerStart } from '../../src/cli/appServer.ts';

let server: Server;
let port: number;
let root: string;

/** Sends a raw request target (not normalised by a URL parser, so `..` reaches the server as typed). */
function get(target: string, method = 'GET'): Promise<{ status: number; body: string; headers: Record<string, unknown> }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method, path: target }, (res) => {
      let body = '';
      res.on('data', (c) => (body += c));
      res.on('end', () => resolve({ status: res.statusCode!, body, headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'hairline-serve-'));
  const app = join(root, 'app');
  const data = join(root, 'data');
  await mkdir(join(data, 'truth'), { recursive: true });
  await mkdir(app, { recursive: true });
  await writeFile(join(app, 'index.html'), '<!doctype html><title>app</title>');
  await writeFile(join(root, 'secret.txt'), 'top secret');
  await writeFile(join(data, 'truth', 'f1.png'), 'PNGDATA');
  await writeFile(join(data, 'classes.json'), '{}');
  await symlink(join(root, 'secret.txt'), join(data, 'truth', 'leak.png'));
  await symlink(join(data, 'truth', 'f1.png'), join(data, 'truth', 'alias.png'));
  ({ server } = await appServerStart({ appDir: app, datasetDir: data, port: 0 }));
  port = (server.address() as { port: number }).port;
});
afterAll(() => new Promise<void>((r) => server.close(() => r())));

describe('dataset server (read-only, loopback, traversal refused)', () => {
  it('binds the loopback interface only', () => {
    expect((server.address() as { address: string }).address).toBe('127.0.0.1');
  });

  it('serves files inside the dataset and lists them, without symlinks that lead out', async () => {
    const f = await get('/dataset/file/truth/f1.png');
    expect(f.status).toBe(200);
    expect(f.body).toBe('PNGDATA');
    const idx = JSON.parse((await get('/dataset/index.json')).body);
    expect(idx.files.sort()).toEqual(['classes.json', 'truth/alias.png', 'truth/f1.png']);
    expect((await get('/dataset/file/truth/alias.png')).status).toBe(200);
  });

  it.each([
    ['/dataset/file/../secret.txt'],
    ['/dataset/file/truth/../../secret.txt'],
    ['/dataset/file/%2e%2e/secret.txt'],
    ['/dataset/file/%2E%2E%2Fsecret.txt'],
    ['/dataset/file/truth/%2e%2e%2f%2e%2e%2fsecret.txt'],
    ['/dataset/file/..%5csecret.txt'],
    ['/dataset/file/truth/leak.png'],
    ['/dataset/file/C:/secret.txt'],
    ['/dataset/file/truth%00/f1.png'],
    ['/../secret.txt'],
    ['/%2e%2e/secret.txt'],
  ])('refuses %s with 403 and never sends the file', async (target) => {
    const r = await get(target);
    expect(r.status).toBe(403);
    expect(r.body).not.toContain('top secret');
  });

  it('treats an absolute path as relative to the folder, never the disk root', async () => {
    const r = await get(`/dataset/file/${encodeURIComponent(join(root, 'secret.txt'))}`);
    expect([403, 404]).toContain(r.status);
    expect(r.body).not.toContain('top secret');
    expect((await get('/dataset/file//etc/passwd')).status).toBe(404);
  });

  it('is read-only and sends a self-only Content-Security-Policy', async () => {
    expect((await get('/dataset/file/truth/f1.png', 'PUT')).status).toBe(405);
    expect((await get('/dataset/file/truth/f1.png', 'DELETE')).status).toBe(405);
    const page = await get('/');
    expect(page.status).toBe(200);
    expect(String(page.headers['content-security-policy'])).toMatch(/default-src 'self'/);
    expect(String(page.headers['content-security-policy'])).toMatch(/connect-src 'self'/);
    expect(String(page.headers['content-security-policy'])).not.toMatch(/https?:/);
  });
});
