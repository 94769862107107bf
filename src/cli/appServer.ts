import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { realpath } from 'node:fs/promises';
import { basename, join } from 'node:path';
import { filesUnder } from './listFiles.ts';
import { pathResolveInside, sendError, sendFile } from './serveFiles.ts';

/** The Content-Security-Policy of every page: scripts, styles, workers and requests from this origin only. */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' blob: data:",
  "worker-src 'self' blob:",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ');

export interface AppServerOptions {
  /** Folder of the built app (vite build output). */
  appDir: string;
  /** Dataset folder to serve read-only under /dataset/, or null. */
  datasetDir: string | null;
  port: number;
}

/** Returns a running HTTP server on 127.0.0.1 serving the built app and, read-only, one dataset folder. */
export async function appServerStart(options: AppServerOptions): Promise<{ server: Server; url: string }> {
  const appReal = await realpath(options.appDir);
  const dataReal = options.datasetDir ? await realpath(options.datasetDir) : null;
  const server = createServer((req, res) => {
    handle(req, res, appReal, dataReal).catch((e) => {
      if (!res.headersSent) sendError(res, 500, `server error: ${(e as Error).message}`);
      else res.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, '127.0.0.1', () => resolve());
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : options.port;
  return { server, url: `http://127.0.0.1:${port}/` };
}

async function handle(req: IncomingMessage, res: ServerResponse, appReal: string, dataReal: string | null): Promise<void> {
  res.setHeader('content-security-policy', CONTENT_SECURITY_POLICY);
  res.setHeader('x-content-type-options', 'nosniff');
  res.setHeader('referrer-policy', 'no-referrer');
  res.setHeader('cross-origin-resource-policy', 'same-origin');
  if (req.method !== 'GET' && req.method !== 'HEAD') return sendError(res, 405, 'read-only server: only GET and HEAD');
  const head = req.method === 'HEAD';
  const raw = req.url ?? '/';
  if (!raw.startsWith('/')) return sendError(res, 400, 'bad request target');
  const path = raw.split('?')[0].split('#')[0];

  if (path === '/dataset/index.json') {
    // Without a dataset the page opens the demo; a 200 "none" keeps the probe out of the error console.
    if (!dataReal) {
      res.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
      return void res.end(head ? undefined : JSON.stringify({ title: null, files: null }));
    }
    const files = await datasetFiles(dataReal);
    const body = JSON.stringify({ title: basename(dataReal), files });
    res.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
    return void res.end(head ? undefined : body);
  }
  if (path.startsWith('/dataset/file/')) {
    if (!dataReal) return sendError(res, 404, 'no dataset folder was given to npm start');
    const r = await pathResolveInside(dataReal, path.slice('/dataset/file/'.length));
    if (!r.ok) return sendError(res, r.status, r.reason);
    return sendFile(res, r.path, head, 'no-cache');
  }
  if (path.startsWith('/dataset')) return sendError(res, 404, 'not found');

  const r = await pathResolveInside(appReal, path);
  if (!r.ok && r.status !== 404) return sendError(res, r.status, r.reason);
  if (r.ok && r.path !== appReal) return sendFile(res, r.path, head, path.startsWith('/assets/') ? 'public, max-age=31536000, immutable' : 'no-cache');
  if (/\.[a-z0-9]+$/i.test(path)) return sendError(res, 404, 'not found');
  return sendFile(res, join(appReal, 'index.html'), head, 'no-cache');
}

/** Returns the dataset's files (relative paths) whose real location is inside the folder. */
async function datasetFiles(dataReal: string): Promise<string[]> {
  const all = await filesUnder(dataReal, 'dataset');
  const inside: string[] = [];
  for (const f of all) {
    const r = await pathResolveInside(dataReal, f.split('/').map(encodeURIComponent).join('/'));
    if (r.ok) inside.push(f);
  }
  return inside;
}
