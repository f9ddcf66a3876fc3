import { defineConfig } from 'vitest/config';
import type { Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { compression } from 'vite-plugin-compression2';
import { fileURLToPath } from 'node:url';
import { env } from './server/config/env.ts';

const apiPort = env.PORT;

const projectRoot = fileURLToPath(new URL('.', import.meta.url));

/** The font files every page shows above the fold (body text and headings; see src/fonts.css). */
const PRELOADED_FONTS = ['literata-latin-400-normal.woff2', 'literata-latin-600-normal.woff2'];

/**
 * Preload links for PRELOADED_FONTS in the built index.html, so the browser fetches them with the
 * entry script instead of after the CSS has been applied. The hashed names come from the bundle.
 */
const preloadFonts = (): Plugin => ({
  name: 'benchwright-preload-fonts',
  apply: 'build',
  transformIndexHtml: (_html, { bundle }) =>
    PRELOADED_FONTS.map((font) => {
      const asset = Object.values(bundle ?? {}).find((a) => a.type === 'asset' && a.names.includes(font));
      if (!asset) throw new Error(`preloaded font ${font} is not in the build (src/fonts.css)`);
      return {
        tag: 'link',
        attrs: {
          rel: 'preload',
          href: `/${asset.fileName}`,
          as: 'font',
          type: 'font/woff2',
          crossorigin: '',
        },
        injectTo: 'head',
      };
    }),
});

export default defineConfig({
  // The client's index.html lives in src/; tests run from the project root.
  root: fileURLToPath(new URL('./src', import.meta.url)),
  envDir: projectRoot,
  publicDir: false,
  plugins: [
    react(),
    tailwindcss(),
    preloadFonts(),
    // A brotli and a gzip copy of every text file, made once here (server/http/client-files.ts serves them).
    compression({ algorithms: ['brotliCompress', 'gzip'], logLevel: 'silent' }),
  ],
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
