// Serves the viewer test page through the app's Vite dev server. The page lives in test/, outside
// Vite's root (app/), so it is loaded by its /@fs/ path; pixi.js is pre-bundled up front so Vite does
// not discover it mid-test and reload the page.
import { fileURLToPath } from 'node:url';
import { createServer, type ViteDevServer } from 'vite';

const PAGE = fileURLToPath(new URL('./pages/viewer.html', import.meta.url));
const REPO = fileURLToPath(new URL('../..', import.meta.url));

/** Starts the dev server on a free loopback port; returns the test page's URL and the server. */
export async function viewerPageServe(): Promise<{ pageUrl: string; server: ViteDevServer }> {
  const server = await createServer({
    configFile: 'vite.config.ts',
    logLevel: 'error',
    // Own dependency cache: other dev servers running at the same time pre-bundle differently.
    cacheDir: 'node_modules/.vite-viewer-test',
    optimizeDeps: { include: ['pixi.js'] },
    server: { port: 0, host: '127.0.0.1', strictPort: false, hmr: false, fs: { allow: [REPO] } },
  });
  await server.listen();
  const addr = server.httpServer!.address();
  if (!addr || typeof addr === 'string') throw new Error('vite did not bind a TCP port');
  return { pageUrl: `http://127.0.0.1:${addr.port}/@fs${PAGE}`, server };
}
