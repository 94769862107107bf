// Builds the app once per test run into dist-test/, which browser tests serve with the real app server.
import { build } from 'vite';

export default async function setup(): Promise<void> {
  await build({ configFile: 'vite.config.ts', logLevel: 'warn', build: { outDir: '../dist-test', emptyOutDir: true } });
}
