import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { readdir, realpath, stat } from 'node:fs/promises';
import { basename, join } from 'node:path';
import { datasetIndexCache, type DatasetIndex } from './datasetIndex.ts';
import { DATASET_HEADERS, datasetFileHeaders, pathResolveInside, sendError, sendFile } from './serveFiles.ts';

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
  /** Results folder (npm run score --results) to serve read-only under /results/, or null. */
  resultsDir?: string | null;
  port: number;
}

/** What one request needs to know about the server. */
interface Served {
  appReal: string;
  dataReal: string | null;
  resultsReal: string | null;
  /** Host header values this server answers (lower case); any other is refused (DNS rebinding). */
  hosts: Set<string>;
  index: (() => Promise<DatasetIndex>) | null;
}

/**
 * Returns a running HTTP server on 127.0.0.1 serving the built app and, read-only, one dataset folder,
 * and the files of that folder it will not serve (reported, not silently left out).
 */
export async function appServerStart(
  options: AppServerOptions,
): Promise<{ server: Server; url: string; skipped: () => Promise<DatasetIndex['skipped']> }> {
  const appReal = await realpath(options.appDir);
  const dataReal = options.datasetDir ? await realpath(options.datasetDir) : null;
  const resultsReal = options.resultsDir ? await realpath(options.resultsDir) : null;
  const served: Served = { appReal, dataReal, resultsReal, hosts: new Set(), index: dataReal ? datasetIndexCache(dataReal) : null };
  const server = createServer((req, res) => {
    handle(req, res, served).catch((e) => {
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
  for (const name of ['127.0.0.1', 'localhost', '[::1]']) served.hosts.add(`${name}:${port}`);
  const skipped = async () => (served.index ? (await served.index()).skipped : []);
  return { server, url: `http://127.0.0.1:${port}/`, skipped };
}

async function handle(req: IncomingMessage, res: ServerResponse, served: Served): Promise<void> {
  const { appReal, dataReal } = served;
  // A page on another site can point its own name at 127.0.0.1 (DNS rebinding); its requests then
  // carry that name as Host. Answering only our loopback names keeps the dataset to our own page.
  if (!served.hosts.has((req.headers.host ?? '').toLowerCase())) {
    return sendError(res, 421, 'this server answers only http://127.0.0.1, localhost or [::1] on its own port');
  }
  res.setHeader('content-security-policy', CONTENT_SECURITY_POLICY);
  res.setHeader('x-content-type-options', 'nosniff');
  res.setHeader('referrer-policy', 'no-referrer');
  res.setHeader('cross-origin-resource-policy', 'same-origin');
  if (req.method !== 'GET' && req.method !== 'HEAD') return sendError(res, 405, 'read-only server: only GET and HEAD');
  const head = req.method === 'HEAD';
  const raw = req.url ?? '/';
  if (!raw.startsWith('/')) return sendError(res, 400, 'bad request target');
  const path = raw.split('?')[0].split('#')[0];
  if (path.startsWith('/dataset')) for (const [k, v] of Object.entries(DATASET_HEADERS)) res.setHeader(k, v);

  if (path === '/dataset/index.json') {
    const json = { 'content-type': 'application/json; charset=utf-8' };
    // Without a dataset the page opens the demo; a 200 "none" keeps the probe out of the error console.
    if (!served.index) {
      res.writeHead(200, { ...json, 'cache-control': 'no-store' });
      return void res.end(head ? undefined : JSON.stringify({ title: null, files: null }));
    }
    const index = await served.index();
    const headers = { ...json, 'cache-control': 'no-cache', etag: index.etag };
    if (req.headers['if-none-match'] === index.etag) return void res.writeHead(304, headers).end();
    res.writeHead(200, headers);
    return void res.end(head ? undefined : index.body);
  }
  if (path.startsWith('/dataset/file/')) {
    if (!dataReal) return sendError(res, 404, 'no dataset folder was given to npm start');
    const r = await pathResolveInside(dataReal, path.slice('/dataset/file/'.length));
    if (!r.ok) return sendError(res, r.status, r.reason);
    return sendFile(res, r.path, head, 'no-cache', datasetFileHeaders(r.path));
  }
  if (path.startsWith('/dataset')) return sendError(res, 404, 'not found');
  if (path.startsWith('/results/')) return resultsHandle(req, res, served.resultsReal, path.slice('/results/'.length), head);

  const r = await pathResolveInside(appReal, path);
  if (!r.ok && r.status !== 404) return sendError(res, r.status, r.reason);
  if (r.ok && r.path !== appReal) return sendFile(res, r.path, head, path.startsWith('/assets/') ? 'public, max-age=31536000, immutable' : 'no-cache');
  if (/\.[a-z0-9]+$/i.test(path)) return sendError(res, 404, 'not found');
  return sendFile(res, join(appReal, 'index.html'), head, 'no-cache');
}

/**
 * The results folder: `index.json` names it and gives each file's size (title and files null when
 * none is served); `file/NAME` sends one file of the folder itself, with byte ranges.
 */
async function resultsHandle(req: IncomingMessage, res: ServerResponse, dir: string | null, rest: string, head: boolean): Promise<void> {
  for (const [k, v] of Object.entries(DATASET_HEADERS)) res.setHeader(k, v);
  if (rest === 'index.json') {
    const files: Record<string, number> = {};
    if (dir) {
      for (const name of await readdir(dir)) {
        const info = await stat(join(dir, name)).catch(() => null);
        if (info?.isFile()) files[name] = info.size;
      }
    }
    res.writeHead(200, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
    return void res.end(head ? undefined : JSON.stringify(dir ? { title: basename(dir), files } : { title: null, files: null }));
  }
  if (!dir) return sendError(res, 404, 'no results folder was given to npm start (--results DIR)');
  if (!rest.startsWith('file/')) return sendError(res, 404, 'not found');
  const name = rest.slice('file/'.length);
  // One file of the folder itself: no sub-folders, and nothing a link leads to outside it.
  if (!name || name.includes('/') || name.includes('%2F') || name.includes('%2f')) return sendError(res, 404, 'not found');
  const r = await pathResolveInside(dir, name);
  if (!r.ok) return sendError(res, r.status, r.reason);
  return sendFile(res, r.path, head, 'no-cache', {}, req.headers.range);
}
