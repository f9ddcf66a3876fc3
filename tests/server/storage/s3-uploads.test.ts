// Uploads through the API with files in an S3 bucket: stored under their SHA-256, served back
// byte for byte, and an object replaced in the bucket is refused and un-verifies its sign-off.
// A signed run's sheet is drawn once and then served from the bucket.
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runSheetFiles } from '../../../server/db/schema';
import { createTestApp, demo, type TestApp } from '../../support/test-app';
import { pdfBody, pdfText } from '../../support/pdf-text';
import { pngOf } from '../../support/png';
import { approve, doc, fuseBlock, inReview, paragraph, reading } from '../modules/review/review-support';
import { benchProcedure, entry, newUnit, startRun } from '../modules/runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { files: 's3' });
});
afterAll(() => t.close());

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

async function objectBytes(key: string) {
  const out = await t.bucket!.client.send(
    new GetObjectCommand({ Bucket: t.bucket!.settings.bucket, Key: key }),
  );
  return Buffer.from(await out.Body!.transformToByteArray());
}
const replaceObject = (key: string, bytes: Buffer) =>
  t.bucket!.client.send(new PutObjectCommand({ Bucket: t.bucket!.settings.bucket, Key: key, Body: bytes }));

const imageDoc = (attachmentId: string) =>
  doc(paragraph('Photograph the reservoir before power-up.'), fuseBlock('0.1 A'), reading('±5 %'), {
    type: 'image',
    attrs: { id: 'img-reservoir', attachmentId, alt: 'Reservoir', caption: 'Reservoir' },
  });

describe('uploads kept in an S3 bucket', () => {
  it('stores the bytes under their SHA-256 in the bucket, not on disk, and serves them back', async () => {
    const hal = await t.as('hal');
    const image = pngOf(6, 5, 31);
    const up = await hal.post('/api/attachments').attach('file', image, { filename: 'choke.png' });
    expect(up.status).toBe(201);
    expect(Buffer.compare(await objectBytes(sha256(image)), image)).toBe(0);
    expect(readdirSync(t.uploadDir)).toEqual([]);
    const served = await hal.get(`/api/attachments/${up.body.attachment.id}`).buffer(true);
    expect(served.status).toBe(200);
    expect(Buffer.compare(served.body as Buffer, image)).toBe(0);
  });

  it('refuses an object replaced in the bucket and shows the approval over it as not verified', async () => {
    const hal = await t.as('hal');
    const image = pngOf(6, 5, 32);
    const id = (await hal.post('/api/attachments').attach('file', image, { filename: 'tp1.png' })).body
      .attachment.id as string;
    const { revision } = await inReview(t, 'hal', imageDoc(id));
    const marek = await t.as('marek');
    const ok = await approve(marek, revision.id, 'marek');
    expect(ok.status).toBe(200);
    const verify = async () =>
      (await marek.get(`/api/signatures/${ok.body.signature.id}/verify`)).body.verified as boolean;
    expect(await verify()).toBe(true);

    await replaceObject(sha256(image), pngOf(6, 5, 33));
    const served = await marek.get(`/api/attachments/${id}`);
    expect(served.status).toBe(404);
    expect(served.body.error).toMatch(/does not match/);
    expect(await verify()).toBe(false);
    // Checked on every read: the original bytes back, verified again.
    await replaceObject(sha256(image), image);
    expect(await verify()).toBe(true);
  });
});

describe('run sheets kept in the bucket', () => {
  type Client = Awaited<ReturnType<TestApp['as']>>;
  const sheet = async (c: Client, runId: string) => {
    const res = await c.get(`/api/runs/${runId}/sheet.pdf`).buffer(true).parse(pdfBody);
    expect(res.status).toBe(200);
    return res.body as Buffer;
  };
  const issued = (runId: string) =>
    t.db.select().from(runSheetFiles).where(eq(runSheetFiles.runId, runId)).orderBy(runSheetFiles.createdAt);

  it('draws a signed run’s sheet once and serves those bytes again; an altered photo gives a new sheet saying so', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const run = (await startRun(tom, revision.id, (await newUnit(tom)).id)).body.run;
    const photo = pngOf(4, 4, 77);
    const added = await tom
      .post(`/api/runs/${run.id}/photos`)
      .field('stepId', 'rd-ht-ac')
      .attach('file', photo, { filename: 'tp1.png' });
    expect(added.status).toBe(201);
    for (const [step, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.4' }],
      ['ck-discharge', { done: true }],
    ] as const)
      expect((await entry(tom, run.id, step, body)).status).toBe(200);
    // An open run's sheet is drawn on each request and not kept.
    await sheet(tom, run.id);
    expect(await issued(run.id)).toEqual([]);

    expect((await tom.post(`/api/runs/${run.id}/sign`).send({ password: demo.tom.password })).status).toBe(
      200,
    );
    const first = await sheet(tom, run.id);
    const [row, ...more] = await issued(run.id);
    expect(more).toEqual([]);
    expect(row!.sha256).toBe(sha256(first));
    expect(Buffer.compare(await objectBytes(row!.sha256), first)).toBe(0);
    // pdfkit stamps each drawing with the time to the second: a sheet drawn again would differ.
    await new Promise((r) => setTimeout(r, 1100));
    const again = await sheet(await t.as('marek'), run.id);
    expect(Buffer.compare(again, first)).toBe(0);
    expect(await issued(run.id)).toHaveLength(1);

    // The issued sheet's object removed or altered: drawn again, the same key pointing at new bytes.
    await replaceObject(row!.sha256, Buffer.from('not a pdf'));
    const redrawn = await sheet(tom, run.id);
    expect(pdfText(redrawn).join(' ')).toContain('Yes: the stored run content matches the signed hash.');
    expect((await issued(run.id)).map((r) => r.sha256)).toEqual([sha256(redrawn)]);

    // The photo altered after signing: the run now reads as not verified, and so does a new sheet.
    await replaceObject(sha256(photo), pngOf(4, 4, 78));
    const after = await sheet(tom, run.id);
    expect(pdfText(after).join(' ')).toContain('NO: the stored run content does not match the signed hash.');
    expect(await issued(run.id)).toHaveLength(2);
  });
});
