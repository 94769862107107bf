import { createReadStream } from 'node:fs';
import { realpath, stat } from 'node:fs/promises';
import type { ServerResponse } from 'node:http';
import { extname, join, sep } from 'node:path';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.webp': 'image/webp',
  '.svg': 'image/svg+xml',
  '.ico': 'image/x-icon',
  '.wasm': 'application/wasm',
  '.txt': 'text/plain; charset=utf-8',
};

/**
 * Types a dataset file keeps: the label maps, photos and JSON the app reads. Everything else in a
 * dataset folder (HTML, scripts, SVG) is sent as an opaque download, so it never runs as the app's origin.
 */
const DATASET_TYPES: Record<string, string> = {
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.webp': 'image/webp',
  '.json': 'application/json; charset=utf-8',
};

/** Headers of every response under /dataset/: sandboxed (no script, no same-origin access even if opened as a page) and never sniffed. */
export const DATASET_HEADERS = {
  'content-security-policy': "sandbox; default-src 'none'",
  'x-content-type-options': 'nosniff',
} as const;

/** Returns the content type and disposition a dataset file is sent with: data the app reads, or an attachment. */
export function datasetFileHeaders(path: string): Record<string, string> {
  const type = DATASET_TYPES[extname(path).toLowerCase()];
  if (type) return { 'content-type': type };
  return { 'content-type': 'application/octet-stream', 'content-disposition': 'attachment' };
}

/** Outcome of resolving a URL path inside a served folder. */
export type Resolved = { ok: true; path: string } | { ok: false; status: 400 | 403 | 404; reason: string };

/**
 * Resolves the URL-encoded `urlPath` (no query) to a file inside `rootReal` (an already-resolved real
 * path). Refuses, with 403, any path whose decoded segments climb out (`..`) or start with `.`
 * (dotfiles such as `.env` or `.git/config`, and `.` itself), absolute or drive paths, backslashes,
 * NUL bytes, and symlinks whose target lies outside the root.
 */
export async function pathResolveInside(rootReal: string, urlPath: string): Promise<Resolved> {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return { ok: false, status: 400, reason: 'malformed URL encoding' };
  }
  if (decoded.includes('\0') || decoded.includes('\\')) return { ok: false, status: 403, reason: 'forbidden characters' };
  const segments = decoded.split('/').filter((s) => s !== '');
  if (segments.some((s) => s === '..')) return { ok: false, status: 403, reason: 'path leaves the served folder' };
  if (segments.some((s) => s.startsWith('.'))) return { ok: false, status: 403, reason: 'names starting with a dot are not served' };
  if (segments.length && /^[a-zA-Z]:$/.test(segments[0])) return { ok: false, status: 403, reason: 'absolute path' };
  const joined = join(rootReal, ...segments);
  let real: string;
  try {
    real = await realpath(joined);
  } catch {
    return { ok: false, status: 404, reason: 'not found' };
  }
  if (real !== rootReal && !real.startsWith(rootReal.endsWith(sep) ? rootReal : rootReal + sep)) {
    return { ok: false, status: 403, reason: 'path leads outside the served folder' };
  }
  return { ok: true, path: real };
}

/** Sends a plain-text error response. */
export function sendError(res: ServerResponse, status: number, message: string): void {
  res.writeHead(status, { 'content-type': 'text/plain; charset=utf-8', 'cache-control': 'no-store' });
  res.end(message + '\n');
}

/**
 * Streams the regular file `path` with its content type (or the `headers` given, which win); 404 when
 * it is a folder or missing.
 */
export async function sendFile(
  res: ServerResponse,
  path: string,
  head: boolean,
  cache: string,
  headers: Record<string, string> = {},
  range: string | undefined = undefined,
): Promise<void> {
  let info;
  try {
    info = await stat(path);
  } catch {
    return sendError(res, 404, 'not found');
  }
  if (!info.isFile()) return sendError(res, 404, 'not found');
  const base = { 'content-type': TYPES[extname(path).toLowerCase()] ?? 'application/octet-stream', 'cache-control': cache, 'accept-ranges': 'bytes', ...headers };
  // One byte range (`bytes=a-b`, `bytes=a-`, `bytes=-n`) when asked: a reader of large tables fetches only the parts it needs.
  const m = range ? /^bytes=(\d*)-(\d*)$/.exec(range.trim()) : null;
  if (range && (!m || (m[1] === '' && m[2] === ''))) return sendError(res, 416, 'only one byte range of the form bytes=a-b is served');
  if (m) {
    const size = info.size;
    const start = m[1] === '' ? Math.max(0, size - Number(m[2])) : Number(m[1]);
    const end = m[1] === '' || m[2] === '' ? size - 1 : Math.min(size - 1, Number(m[2]));
    if (start > end || start >= size) {
      res.writeHead(416, { 'content-range': `bytes */${size}` });
      return void res.end();
    }
    res.writeHead(206, { ...base, 'content-length': String(end - start + 1), 'content-range': `bytes ${start}-${end}/${size}` });
    if (head) return void res.end();
    return void createReadStream(path, { start, end }).on('error', () => res.destroy()).pipe(res);
  }
  res.writeHead(200, { ...base, 'content-length': String(info.size) });
  if (head) return void res.end();
  createReadStream(path).on('error', () => res.destroy()).pipe(res);
}
