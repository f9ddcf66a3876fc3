import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tinyPng } from '../support/png';
import { createTestApp, type TestApp } from '../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('uploads', () => {
  it('stores a PNG under a random name and serves it only to signed-in people, as an attachment with nosniff', async () => {
    const c = await t.as('hal');
    const res = await c.post('/api/attachments').attach('file', tinyPng(), { filename: '../../scope capture.png', contentType: 'image/png' });
    expect(res.status).toBe(201);
    expect(res.body.attachment).toMatchObject({ mediaType: 'image/png', fileName: 'scope capture.png' });
    const got = await c.get(res.body.attachment.url);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/png');
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    expect(got.headers['content-disposition']).toMatch(/^attachment;/);
    expect(got.headers['content-security-policy']).toMatch(/sandbox/);
    expect(Buffer.compare(got.body as Buffer, tinyPng())).toBe(0);
    expect((await t.client().get(res.body.attachment.url)).status).toBe(401);
  });

  it('refuses an HTML file named .png (content decides the type) with a clear message', async () => {
    const c = await t.as('hal');
    const html = Buffer.from('<!doctype html><html><body><script>alert(1)</script></body></html>');
    const res = await c.post('/api/attachments').attach('file', html, { filename: 'schematic.png', contentType: 'image/png' });
    expect(res.status).toBe(415);
    expect(res.body.error).toMatch(/not a PNG, JPEG, WebP or PDF/);
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"></svg>');
    expect((await c.post('/api/attachments').attach('file', svg, { filename: 'x.svg', contentType: 'image/svg+xml' })).status).toBe(415);
  });

  it('refuses a file over 15 MB with 413', async () => {
    const c = await t.as('hal');
    const big = Buffer.concat([tinyPng(), Buffer.alloc(15 * 1024 * 1024 + 1)]);
    const res = await c.post('/api/attachments').attach('file', big, { filename: 'huge.png', contentType: 'image/png' });
    expect(res.status).toBe(413);
    expect(res.body.error).toMatch(/larger than 15 MB/);
  });

  it('a technician cannot upload', async () => {
    const tech = await t.as('tom');
    expect((await tech.post('/api/attachments').attach('file', tinyPng(), { filename: 'a.png' })).status).toBe(403);
  });
});
