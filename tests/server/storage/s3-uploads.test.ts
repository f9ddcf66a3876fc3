// Uploads through the API with files in an S3 bucket: stored under their SHA-256, served back
// byte for byte, and an object replaced in the bucket is refused and un-verifies its sign-off.
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../support/test-app';
import { pngOf } from '../../support/png';
import { approve, doc, fuseBlock, inReview, paragraph, reading } from '../modules/review/review-support';

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
