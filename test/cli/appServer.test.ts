import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Server } from 'node:http';
import { appServerStart } from '../../src/cli/appServer.ts';
import { httpGet } from '../support/httpGet.ts';

let server: Server;
let port: number;
let root: string;

/** Sends a raw request target to the server under test. */
const get = (target: string, method = 'GET', headers: Record<string, string> = {}) => httpGet(port, target, method, headers);

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
  await writeFile(join(data, '.env'), 'API_KEY=hunter2');
  await mkdir(join(data, '.git'), { recursive: true });
  await writeFile(join(data, '.git', 'config'), '[remote] url=secret');
  await mkdir(join(data, 'web'), { recursive: true });
  await writeFile(join(data, 'web', 'page.html'), '<script src="x.js"></script>');
  await writeFile(join(data, 'web', 'x.js'), 'fetch("/dataset/index.json")');
  await writeFile(join(data, 'web', 'pic.svg'), '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
  await writeFile(join(data, 'truth', 'back\\slash.png'), 'PNGDATA');
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
    expect(idx.files.sort()).toEqual(['classes.json', 'truth/alias.png', 'truth/f1.png', 'web/page.html', 'web/pic.svg', 'web/x.js']);
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

  it.each([['evil.example'], ['evil.example:PORT'], ['127.0.0.1.evil.example:PORT'], ['127.0.0.1:1'], ['localhost']])(
    'answers a request naming host %s with 421 and no data (DNS rebinding)',
    async (host) => {
      for (const target of ['/dataset/index.json', '/dataset/file/truth/f1.png', '/']) {
        const r = await get(target, 'GET', { host: host.replace('PORT', String(port)) });
        expect(r.status).toBe(421);
        expect(r.body).not.toContain('f1.png');
        expect(r.body).not.toContain('PNGDATA');
      }
    },
  );

  it.each([['127.0.0.1:PORT'], ['localhost:PORT'], ['[::1]:PORT'], ['LOCALHOST:PORT']])('accepts the loopback host %s', async (host) => {
    const r = await get('/dataset/file/truth/f1.png', 'GET', { host: host.replace('PORT', String(port)) });
    expect(r.status).toBe(200);
  });

  it.each([['/dataset/file/.env'], ['/dataset/file/.git/config'], ['/dataset/file/%2egit/config'], ['/dataset/file/truth/./f1.png'], ['/.env']])(
    'refuses the dot segment in %s with 403',
    async (target) => {
      const r = await get(target);
      expect(r.status).toBe(403);
      expect(r.body).not.toContain('hunter2');
      expect(r.body).not.toContain('secret');
    },
  );

  it('serves dataset files as data, never as active content of the app origin', async () => {
    const html = await get('/dataset/file/web/page.html');
    expect(html.status).toBe(200);
    expect(String(html.headers['content-type'])).not.toMatch(/html/);
    expect(String(html.headers['content-disposition'])).toMatch(/^attachment/);
    expect(String(html.headers['content-security-policy'])).toMatch(/^sandbox/);
    expect(html.headers['x-content-type-options']).toBe('nosniff');
    const js = await get('/dataset/file/web/x.js');
    expect(String(js.headers['content-type'])).not.toMatch(/javascript/);
    expect(String(js.headers['content-disposition'])).toMatch(/^attachment/);
    const svg = await get('/dataset/file/web/pic.svg');
    expect(String(svg.headers['content-type'])).not.toMatch(/svg/);
    expect(String(svg.headers['content-disposition'])).toMatch(/^attachment/);
    // What the app reads keeps its type, still sandboxed and not sniffed.
    const png = await get('/dataset/file/truth/f1.png');
    expect(png.headers['content-type']).toBe('image/png');
    expect(png.headers['content-disposition']).toBeUndefined();
    expect(String(png.headers['content-security-policy'])).toMatch(/^sandbox/);
    expect(png.headers['x-content-type-options']).toBe('nosniff');
    const json = await get('/dataset/file/classes.json');
    expect(String(json.headers['content-type'])).toMatch(/^application\/json/);
    expect(String(json.headers['content-security-policy'])).toMatch(/^sandbox/);
    const idx = await get('/dataset/index.json');
    expect(String(idx.headers['content-security-policy'])).toMatch(/^sandbox/);
  });

  it('reports files it cannot serve (a backslash in the name, a link leading out) instead of dropping them silently', async () => {
    const idx = JSON.parse((await get('/dataset/index.json')).body);
    expect(idx.files).not.toContain('truth/back\\slash.png');
    expect(idx.skipped).toEqual([
      { path: 'truth/back\\slash.png', reason: expect.stringMatching(/backslash/) },
      { path: 'truth/leak.png', reason: expect.stringMatching(/outside/) },
    ]);
  });

  it('keeps the listing between requests (ETag, 304) and refreshes it when the folder changes', async () => {
    const a = await get('/dataset/index.json');
    const etag = String(a.headers.etag);
    expect(etag).toMatch(/^"/);
    const b = await get('/dataset/index.json', 'GET', { 'if-none-match': etag });
    expect(b.status).toBe(304);
    expect(b.body).toBe('');
    await writeFile(join(root, 'data', 'truth', 'f2.png'), 'PNGDATA');
    const c = await get('/dataset/index.json', 'GET', { 'if-none-match': etag });
    expect(c.status).toBe(200);
    expect(c.headers.etag).not.toBe(etag);
    expect(JSON.parse(c.body).files).toContain('truth/f2.png');
    await mkdir(join(root, 'data', 'truth', 'deeper'));
    await writeFile(join(root, 'data', 'truth', 'deeper', 'f3.png'), 'PNGDATA');
    expect(JSON.parse((await get('/dataset/index.json')).body).files).toContain('truth/deeper/f3.png');
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
