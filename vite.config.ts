/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

export default defineConfig({
  root: 'app',
  publicDir: '../public',
  plugins: [react()],
  worker: { format: 'es' },
  build: { outDir: '../dist', emptyOutDir: true, target: 'es2022', chunkSizeWarningLimit: 2000 },
  server: { host: '127.0.0.1', strictPort: false },
  test: {
    root: '.',
    testTimeout: 60_000,
    hookTimeout: 180_000,
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['test/**/*.test.ts'], exclude: ['test/browser/**'], environment: 'node' },
      },
      {
        extends: true,
        // Browser tests share one built app and run one file at a time: each drives a real Chromium.
        test: {
          name: 'browser',
          include: ['test/browser/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          globalSetup: ['test/browser/buildOnce.ts'],
        },
      },
    ],
  },
});
