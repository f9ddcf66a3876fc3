/**
 * The built client is served wherever the checkout lives — also under a folder whose name starts
 * with a dot (a hidden home folder, a CI workspace), where a path-wide dotfile rule used to refuse
 * index.html and leave every page blank.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import request from 'supertest';
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

/**
 * What the build makes (server/http/client-files.ts, vite.config.ts): each text file beside its
 * brotli and gzip copies. The browser gets the copy it accepts, brotli first; hashed files are kept
 * a year without asking again, the app shell is checked on every visit.
 */
describe('compressed, cached client files', () => {
  let c: TestApp;
  const script = `export const marks = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => `mark ${i}`))};\n`;
  const asset = '/assets/app-B3nch4Wr.js';
  beforeAll(async () => {
    const clientDir = mkdtempSync(path.join(tmpdir(), 'bw-compressed-'));
    mkdirSync(path.join(clientDir, 'assets'));
    writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Benchwright</title>');
    const file = path.join(clientDir, asset);
    writeFileSync(file, script);
    writeFileSync(`${file}.br`, brotliCompressSync(script));
    writeFileSync(`${file}.gz`, gzipSync(script));
    c = await createTestApp({ clientDir });
  });
  afterAll(() => c.close());

  it('sends a hashed file in brotli when accepted, gzip otherwise, as is to a browser that takes neither; cached a year', async () => {
    const cases: [accept: string, encoding: string | undefined, sent: Buffer][] = [
      ['gzip, deflate, br', 'br', brotliCompressSync(script)],
      ['gzip, deflate', 'gzip', gzipSync(script)],
      ['identity', undefined, Buffer.from(script)],
    ];
    for (const [accept, encoding, sent] of cases) {
      // supertest undoes the compression; Content-Length says what went over the wire.
      const res = await request(c.app).get(asset).set('Accept-Encoding', accept).buffer(true);
      expect(res.status, accept).toBe(200);
      expect(res.headers['content-encoding'], accept).toBe(encoding);
      expect(Number(res.headers['content-length']), accept).toBe(sent.length);
      expect(res.headers['content-type'], accept).toMatch(/javascript/);
      expect(res.headers['vary'], accept).toMatch(/Accept-Encoding/i);
      expect(res.headers['cache-control'], accept).toBe('public, max-age=31536000, immutable');
      expect(res.text, accept).toBe(script);
    }
  });

  it('has the app shell checked again on every visit, never kept as immutable', async () => {
    for (const p of ['/', '/revisions/anything', '/index.html']) {
      const res = await c.client().get(p);
      expect(res.status, p).toBe(200);
      expect(res.headers['cache-control'], p).toBe('no-cache');
    }
  });
});

describe('compressed API answers', () => {
  let c: TestApp;
  beforeAll(async () => (c = await createTestApp()));
  afterAll(() => c.close());

  it('compresses an answer above 1 kB for a client that accepts gzip, and leaves a small one as is', async () => {
    const tom = await c.as('tom');
    const list = await tom.get('/api/procedures').set('Accept-Encoding', 'gzip');
    expect(list.status).toBe(200);
    expect(list.headers['content-encoding']).toBe('gzip');
    expect(list.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(list.headers['cache-control']).toBe('no-store');
    expect(list.body.procedures.length).toBeGreaterThan(0);
    expect(JSON.stringify(list.body).length).toBeGreaterThan(1024);

    const session = await tom.get('/api/auth/session').set('Accept-Encoding', 'gzip');
    expect(session.status).toBe(200);
    expect(JSON.stringify(session.body).length).toBeLessThan(1024);
    expect(session.headers['content-encoding']).toBeUndefined();
  });
});
