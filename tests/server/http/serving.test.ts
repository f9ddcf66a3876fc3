/**
 * The built client is served wherever the checkout lives — also under a folder whose name starts
 * with a dot (a hidden home folder, a CI workspace), where a path-wide dotfile rule used to refuse
 * index.html and leave every page blank.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  const clientDir = path.join(
    mkdtempSync(path.join(tmpdir(), 'bw-serve-')),
    '.hidden-checkout',
    'dist',
    'client',
  );
  mkdirSync(clientDir, { recursive: true });
  writeFileSync(
    path.join(clientDir, 'index.html'),
    '<!doctype html><title>Benchwright</title><div id="root"></div>',
  );
  t = await createTestApp({ clientDir });
});
afterAll(() => t.close());

describe('serving the client', () => {
  it('answers the app shell for / and client routes from a checkout under a dot-folder', async () => {
    for (const p of ['/', '/procedures', '/runs/new']) {
      const res = await t.client().get(p);
      expect(res.status, p).toBe(200);
      expect(res.text, p).toContain('<div id="root">');
    }
  });
});
