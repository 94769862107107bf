import { request } from 'node:http';

/** Sends a raw request target to 127.0.0.1:`port` (not normalised by a URL parser, so `..` reaches the server as typed). */
export function httpGet(
  port: number,
  target: string,
  method = 'GET',
  headers: Record<string, string> = {},
): Promise<{ status: number; body: string; headers: Record<string, unknown> }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method, path: target, headers }, (res) => {
      let body = '';
      res.on('data', (c) => (body += c));
      res.on('end', () => resolve({ status: res.statusCode!, body, headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}
