import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';
import { env } from './server/config/env.ts';

const apiPort = env.PORT;

const projectRoot = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  // The client's index.html lives in src/; tests run from the project root.
  root: fileURLToPath(new URL('./src', import.meta.url)),
  envDir: projectRoot,
  publicDir: false,
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  // No inlined data: URLs, so the strict CSP (font-src 'self') holds.
  build: { outDir: '../dist/client', emptyOutDir: true, chunkSizeWarningLimit: 900, assetsInlineLimit: 0 },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': `http://127.0.0.1:${apiPort}`, '/files': `http://127.0.0.1:${apiPort}` },
  },
  test: {
    root: projectRoot,
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          // src/ tests run headless: no browser, no DOM (the editor's TipTap runs without one); a
          // *.unit.test.ts file anywhere needs no database.
          include: ['tests/shared/**/*.test.ts', 'tests/src/**/*.test.ts', 'tests/**/*.unit.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/server/**/*.test.ts'],
          exclude: ['tests/**/*.unit.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
