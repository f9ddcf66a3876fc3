import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jpegHeaderOf, pngOf, tinyPng, webpHeaderOf } from '../../../support/png';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { approve, doc, fuseBlock, inReview, paragraph, reading } from '../review/review-support';
import { benchProcedure, newUnit, startRun } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('uploads', () => {
  it('stores a PNG under its SHA-256 and serves it only to signed-in people, as an attachment with nosniff', async () => {
    const c = await t.as('hal');
    const res = await c
      .post('/api/attachments')
      .attach('file', tinyPng(), { filename: '../../scope capture.png', contentType: 'image/png' });
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
    const res = await c
      .post('/api/attachments')
      .attach('file', html, { filename: 'schematic.png', contentType: 'image/png' });
    expect(res.status).toBe(415);
    expect(res.body.error).toMatch(/not a PNG, JPEG, WebP or PDF/);
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"></svg>');
    expect(
      (
        await c
          .post('/api/attachments')
          .attach('file', svg, { filename: 'x.svg', contentType: 'image/svg+xml' })
      ).status,
    ).toBe(415);
  });

  it('refuses a file over 15 MB with 413', async () => {
    const c = await t.as('hal');
    const big = Buffer.concat([tinyPng(), Buffer.alloc(15 * 1024 * 1024 + 1)]);
    const res = await c
      .post('/api/attachments')
      .attach('file', big, { filename: 'huge.png', contentType: 'image/png' });
    expect(res.status).toBe(413);
    expect(res.body.error).toMatch(/larger than 15 MB/);
  });

  it('a technician cannot upload', async () => {
    const tech = await t.as('tom');
    expect(
      (await tech.post('/api/attachments').attach('file', tinyPng(), { filename: 'a.png' })).status,
    ).toBe(403);
  });
});

type Client = Awaited<ReturnType<TestApp['as']>>;
let shade = 0;
/** A PNG no other test stores (content-addressed files would otherwise be shared). */
const uniquePng = () => pngOf(3, 2, ++shade);
const upload = (c: Client, bytes: Buffer, filename: string) =>
  c.post('/api/attachments').attach('file', bytes, { filename });

describe('upload names and types', () => {
  it('decodes the name as UTF-8 and normalises it to NFC (Röhre stays Röhre, not RÃ¶hre)', async () => {
    const hal = await t.as('hal');
    const composed = await upload(hal, uniquePng(), 'Röhre.png');
    expect(composed.status).toBe(201);
    expect(composed.body.attachment.fileName).toBe('R\u00f6hre.png');
    // The same name written decomposed (o + combining diaeresis, as some systems send it): Unicode NFC.
    const decomposed = await upload(hal, uniquePng(), 'Ro\u0308hre.png');
    expect(decomposed.body.attachment.fileName).toBe('R\u00f6hre.png');
  });

  it('drops control and bidi override characters, so a name cannot hide its real ending', async () => {
    const hal = await t.as('hal');
    // U+202E RIGHT-TO-LEFT OVERRIDE would show "reportlmth.png" as "reportgnp.html" (Unicode UAX #9).
    const res = await upload(hal, uniquePng(), 'report\u202Elmth.png\u2066');
    expect(res.status).toBe(201);
    expect(res.body.attachment.fileName).toBe('reportlmth.png');
    // Control characters arrive percent-encoded in the extended form (RFC 5987 filename*).
    const boundary = 'bw-boundary-7';
    const body = Buffer.concat([
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename*=UTF-8''scope%07%1B%C2%85.png\r\nContent-Type: image/png\r\n\r\n`,
      ),
      uniquePng(),
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    const raw = await hal
      .post('/api/attachments')
      .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
      .send(body);
    expect(raw.status).toBe(201);
    expect(raw.body.attachment.fileName).toBe('scope.png');
    // A raw control byte in the part header is a malformed request: 400 naming the field, not 500.
    const bad = Buffer.from(
      body.toString('latin1').replace("filename*=UTF-8''scope%07%1B%C2%85.png", 'filename="scope\u0007.png"'),
      'latin1',
    );
    const refused = await hal
      .post('/api/attachments')
      .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
      .send(bad);
    expect(refused.status).toBe(400);
    expect(refused.body.fields).toEqual([{ field: 'body.file', reason: expect.any(String) }]);
  });

  it('gives the file the extension of its detected type: a PNG named evil.html is stored and served as evil.png, image/png', async () => {
    const hal = await t.as('hal');
    const res = await upload(hal, uniquePng(), 'evil.html');
    expect(res.status).toBe(201);
    expect(res.body.attachment).toMatchObject({ fileName: 'evil.png', mediaType: 'image/png' });
    const got = await hal.get(res.body.attachment.url);
    expect(got.headers['content-type']).toBe('image/png');
    expect(got.headers['content-disposition']).toBe(
      `attachment; filename="evil.png"; filename*=UTF-8''evil.png`,
    );
    // A name without an extension gets the type's own.
    expect((await upload(hal, uniquePng(), 'scope')).body.attachment.fileName).toBe('scope.png');
    // A JPEG may keep either of its usual endings.
    expect((await upload(hal, jpegHeaderOf(40, 30), 'bench.jpeg')).body.attachment.fileName).toBe(
      'bench.jpeg',
    );
  });

  it('serves a non-ASCII name with an ASCII fallback and an RFC 5987 UTF-8 form', async () => {
    const hal = await t.as('hal');
    const res = await upload(hal, uniquePng(), 'Röhre (2).png');
    const got = await hal.get(res.body.attachment.url);
    // RFC 6266 §4.3 / RFC 5987 §3.2: ö is UTF-8 C3 B6; space, "(" and ")" are not attr-chars and are percent-encoded.
    expect(got.headers['content-disposition']).toBe(
      `attachment; filename="R_hre (2).png"; filename*=UTF-8''R%C3%B6hre%20%282%29.png`,
    );
  });
});

describe('image dimensions', () => {
  it('refuses a 30000 × 30000 PNG with 400 naming the field; 8000 px is the largest side accepted', async () => {
    const hal = await t.as('hal');
    const huge = await upload(hal, pngOf(30000, 30000), 'bomb.png');
    expect(huge.status).toBe(400);
    expect(huge.body.fields).toEqual([
      { field: 'body.file', reason: expect.stringMatching(/30000 × 30000 px.*8000 × 8000/) },
    ]);
    expect((await upload(hal, pngOf(8001, 1), 'wide.png')).status).toBe(400);
    expect((await upload(hal, pngOf(1, 8001), 'tall.png')).status).toBe(400);
    expect((await upload(hal, pngOf(8000, 1, 7), 'edge.png')).status).toBe(201);
  });

  it('reads the size of JPEG and WebP files from their headers too', async () => {
    const hal = await t.as('hal');
    const jpeg = await upload(hal, jpegHeaderOf(9000, 20), 'wide.jpg');
    expect(jpeg.status).toBe(400);
    expect(jpeg.body.fields[0]).toMatchObject({
      field: 'body.file',
      reason: expect.stringMatching(/9000 × 20 px/),
    });
    expect(
      (await upload(hal, jpegHeaderOf(20, 8001, 'progressive'), 'tall.jpg')).body.fields[0].reason,
    ).toMatch(/20 × 8001 px/);
    expect((await upload(hal, jpegHeaderOf(640, 480), 'ok.jpg')).status).toBe(201);
    for (const chunk of ['VP8X', 'VP8L', 'VP8 '] as const) {
      const wide = await upload(hal, webpHeaderOf(12000, 3, chunk), 'wide.webp');
      expect(wide.status, chunk).toBe(400);
      expect(wide.body.fields[0].reason, chunk).toMatch(/12000 × 3 px/);
      expect((await upload(hal, webpHeaderOf(800, 600, chunk), 'ok.webp')).status, chunk).toBe(201);
    }
  });

  it('applies the same limit and name rules to run photos', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const run = (await startRun(tom, revision.id, unit.id)).body.run;
    const huge = await tom
      .post(`/api/runs/${run.id}/photos`)
      .attach('file', pngOf(30000, 30000), { filename: 'tp1.png' });
    expect(huge.status).toBe(400);
    expect(huge.body.fields[0]).toMatchObject({ field: 'body.file' });
    const named = await tom
      .post(`/api/runs/${run.id}/photos`)
      .attach('file', uniquePng(), { filename: 'Prüfpunkt\u202E.html' });
    expect(named.status).toBe(201);
    const got = await tom.get(named.body.photo.url);
    expect(got.headers['content-type']).toBe('image/png');
    expect(got.headers['content-disposition']).toBe(
      `attachment; filename="Pr_fpunkt.png"; filename*=UTF-8''Pr%C3%BCfpunkt.png`,
    );
  });
});

describe('who may read an attachment', () => {
  const imageDoc = (attachmentId: string) =>
    doc(paragraph('Photograph the reservoir before power-up.'), fuseBlock('0.1 A'), reading('±5 %'), {
      type: 'image',
      attrs: { id: 'img-reservoir', attachmentId, alt: 'Reservoir', caption: 'Reservoir' },
    });

  it('a draft’s attachment is 404 for a technician and readable by staff; once approved, technicians read it too', async () => {
    const hal = await t.as('hal');
    const bytes = uniquePng();
    const id = (await upload(hal, bytes, 'reservoir.png')).body.attachment.id as string;
    const url = `/api/attachments/${id}`;
    const tom = await t.as('tom');
    // Not yet in any document: only staff.
    expect((await tom.get(url)).status).toBe(404);
    const { revision } = await inReview(t, 'hal', imageDoc(id));
    expect((await tom.get(url)).status).toBe(404);
    const marek = await t.as('marek');
    expect((await marek.get(url)).status).toBe(200);
    expect((await hal.get(url)).status).toBe(200);
    expect((await approve(marek, revision.id, 'marek')).status).toBe(200);
    const now = await tom.get(url);
    expect(now.status).toBe(200);
    expect(Buffer.compare(now.body as Buffer, bytes)).toBe(0);
  });

  it('a run photo is readable by every technician', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const run = (await startRun(tom, revision.id, unit.id)).body.run;
    const photo = await tom
      .post(`/api/runs/${run.id}/photos`)
      .attach('file', uniquePng(), { filename: 'tp.png' });
    expect((await (await t.as('priya')).get(photo.body.photo.url)).status).toBe(200);
  });
});
