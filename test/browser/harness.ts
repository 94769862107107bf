// Shared set-up for browser tests: the app served by Vite on loopback, and Debian's chromium driven
// by playwright-core. Software WebGL2 comes from SwiftShader: playwright-core passes
// --enable-unsafe-swiftshader by default, which, with --disable-gpu, gives a WebGL2 context headless.
import { chromium, type Browser, type Page } from 'playwright-core';
import { createServer, type ViteDevServer } from 'vite';
import type { Server } from 'node:http';
import { appServerStart } from '../../src/cli/appServer.ts';

export const CHROMIUM_PATH = process.env.HAIRLINE_CHROMIUM ?? '/usr/bin/chromium';

/** Flags for headless Chromium on a machine with no GPU and no outside network. */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Starts the app's Vite dev server on a free loopback port; returns its base URL and a closer. */
export async function appServe(extra: { dataset?: string } = {}): Promise<{ url: string; server: ViteDevServer }> {
  if (extra.dataset) process.env.HAIRLINE_DATASET = extra.dataset;
  const server = await createServer({
    configFile: 'vite.config.ts',
    logLevel: 'error',
    server: { port: 0, host: '127.0.0.1', strictPort: false, hmr: false },
  });
  await server.listen();
  const addr = server.httpServer!.address();
  if (!addr || typeof addr === 'string') throw new Error('vite did not bind a TCP port');
  return { url: `http://127.0.0.1:${addr.port}/`, server };
}

/** Launches headless Chromium with the flags above. */
export async function browserLaunch(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
}

/** Collects page errors and console errors so a test can assert there were none. */
export function pageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  return errors;
}

/** Serves the app built by buildOnce.ts (dist-test/) with the real app server, optionally with a dataset and its results folder. */
export async function appServeBuilt(datasetDir: string | null = null, resultsDir: string | null = null): Promise<{ url: string; close: () => Promise<void> }> {
  const { server, url } = await appServerStart({ appDir: 'dist-test', datasetDir, resultsDir, port: 0 });
  return { url, close: () => new Promise<void>((r) => (server as Server).close(() => r())) };
}
