// Signed content covers the attached files' bytes, not just a recorded hash: an attachment row can
// neither be re-pointed nor removed by the app's own role, and a file altered or removed on disk
// shows as not verified wherever the signature is shown.
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { pdfBody, pdfText } from '../../../support/pdf-text';
import { pngOf } from '../../../support/png';
import { approve, doc, fuseBlock, inReview, paragraph, reading } from '../review/review-support';
import { benchProcedure, entry, newUnit, startRun } from '../runs/runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;
let shade = 0;
const uniquePng = () => pngOf(5, 4, ++shade);
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** The file in the upload folder that holds these bytes, whatever the folder's layout. */
function storedFileOf(bytes: Buffer): string {
  const want = sha256(bytes);
  const walk = (dir: string): string | undefined => {
    for (const name of readdirSync(dir)) {
      const p = path.join(dir, name);
      const found = statSync(p).isDirectory() ? walk(p) : sha256(readFileSync(p)) === want ? p : undefined;
      if (found) return found;
    }
  };
  const found = walk(t.uploadDir);
  if (!found) throw new Error('no stored file holds these bytes');
  return found;
}

/** The database's message when a statement is refused, or null when it went through. */
const refusal = (run: Promise<unknown>) =>
  run.then(
    () => null,
    (e: Error & { cause?: Error }) => e.cause?.message ?? e.message,
  );

async function uploadImage(c: Client, bytes: Buffer) {
  const res = await c.post('/api/attachments').attach('file', bytes, { filename: 'reservoir.png' });
  expect(res.status).toBe(201);
  return res.body.attachment.id as string;
}

const imageDoc = (attachmentId: string) =>
  doc(paragraph('Photograph the reservoir before power-up.'), fuseBlock('0.1 A'), reading('±5 %'), {
    type: 'image',
    attrs: { id: 'img-reservoir', attachmentId, alt: 'Reservoir', caption: 'Reservoir' },
  });

/** An approved revision showing one image; returns its id, the image's id and bytes, and the signature id. */
async function approvedWithImage() {
  const hal = await t.as('hal');
  const bytes = uniquePng();
  const attachmentId = await uploadImage(hal, bytes);
  const { revision } = await inReview(t, 'hal', imageDoc(attachmentId));
  const marek = await t.as('marek');
  const ok = await approve(marek, revision.id, 'marek');
  expect(ok.status).toBe(200);
  return { revisionId: revision.id, attachmentId, bytes, signatureId: ok.body.signature.id as string, marek };
}

/** What the reader (a technician), the review page and the verify check say about the approval. */
async function verifiedEverywhere(revisionId: string, signatureId: string, marek: Client) {
  const tom = await t.as('tom');
  const reader = await tom.get(`/api/revisions/${revisionId}/signatures`);
  const review = await marek.get(`/api/revisions/${revisionId}/review`);
  const check = await marek.get(`/api/signatures/${signatureId}/verify`);
  return [
    reader.body.signatures[0].verified,
    review.body.review.signatures[0].verified,
    check.body.verified,
  ] as boolean[];
}

describe('attachment rows are append-only', () => {
  it('the app role cannot point an approved revision’s image at another stored file, nor delete it', async () => {
    const { revisionId, attachmentId, bytes, signatureId, marek } = await approvedWithImage();
    const other = await uploadImage(await t.as('hal'), uniquePng());
    // No column of the row may change, not even to itself: a row whose file name or hash could be
    // rewritten would let the approved image name other bytes.
    const cols = (
      await t.db.execute<{ column_name: string }>(
        sql`select column_name from information_schema.columns where table_name = 'attachments' order by 1`,
      )
    ).rows.map((r) => r.column_name);
    expect(cols.length).toBeGreaterThan(3);
    for (const col of cols) {
      const name = sql.identifier(col);
      expect(
        await refusal(t.db.execute(sql`update attachments set ${name} = ${name} where id = ${attachmentId}`)),
        col,
      ).toMatch(/permission denied/);
    }
    expect(
      await refusal(
        t.db.execute(
          sql`update attachments set sha256 = (select sha256 from attachments where id = ${other}) where id = ${attachmentId}`,
        ),
      ),
    ).toMatch(/permission denied/);
    expect(await refusal(t.db.execute(sql`delete from attachments where id = ${other}`))).toMatch(
      /permission denied/,
    );
    // The owner is refused by the trigger.
    expect(
      await refusal(
        t.ownerDb.execute(
          sql`update attachments set original_name = 'swapped.png' where id = ${attachmentId}`,
        ),
      ),
    ).toMatch(/append-only/);
    expect(await refusal(t.ownerDb.execute(sql`delete from attachments where id = ${other}`))).toMatch(
      /append-only/,
    );
    // Still the approved bytes, still verified.
    const served = await marek.get(`/api/attachments/${attachmentId}`);
    expect(Buffer.compare(served.body as Buffer, bytes)).toBe(0);
    expect(await verifiedEverywhere(revisionId, signatureId, marek)).toEqual([true, true, true]);
  });
});

describe('a stored file altered or removed on disk', () => {
  it('shows the approval as not verified on the reader, the review page and the verify check, and is not served', async () => {
    const { revisionId, attachmentId, bytes, signatureId, marek } = await approvedWithImage();
    expect(await verifiedEverywhere(revisionId, signatureId, marek)).toEqual([true, true, true]);
    const file = storedFileOf(bytes);
    writeFileSync(file, uniquePng());
    expect(await verifiedEverywhere(revisionId, signatureId, marek)).toEqual([false, false, false]);
    const served = await marek.get(`/api/attachments/${attachmentId}`);
    expect(served.status).toBe(404);
    expect(served.body.error).toMatch(/does not match/);
    // The check is made against the bytes on each read: the original bytes back, verified again.
    writeFileSync(file, bytes);
    expect(await verifiedEverywhere(revisionId, signatureId, marek)).toEqual([true, true, true]);
    rmSync(file);
    expect(await verifiedEverywhere(revisionId, signatureId, marek)).toEqual([false, false, false]);
  });

  it('a revision whose image is missing or altered cannot be approved (409)', async () => {
    const hal = await t.as('hal');
    const bytes = uniquePng();
    const attachmentId = await uploadImage(hal, bytes);
    const { revision } = await inReview(t, 'hal', imageDoc(attachmentId));
    writeFileSync(storedFileOf(bytes), Buffer.concat([bytes, Buffer.from('tail')]));
    const res = await approve(await t.as('marek'), revision.id, 'marek');
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/missing or altered/);
  });
});

describe('run photos', () => {
  async function signedRunWithPhoto() {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const unit = await newUnit(tom);
    const run = (await startRun(tom, revision.id, unit.id)).body.run;
    const bytes = uniquePng();
    expect(
      (
        await tom
          .post(`/api/runs/${run.id}/photos`)
          .field('stepId', 'rd-ht-ac')
          .attach('file', bytes, { filename: 'tp1.png' })
      ).status,
    ).toBe(201);
    for (const [step, body] of [
      ['hz-ht-live', { done: true }],
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-heater', { value: '6.4' }],
      ['ck-discharge', { done: true }],
    ] as const) {
      expect((await entry(tom, run.id, step, body)).status).toBe(200);
    }
    return { tom, runId: run.id as string, bytes };
  }

  const pdfOf = async (c: Client, runId: string) =>
    pdfText((await c.get(`/api/runs/${runId}/sheet.pdf`).buffer(true).parse(pdfBody)).body as Buffer).join(
      ' ',
    );

  it('a photo altered after signing shows the run sheet and its PDF as not verified', async () => {
    const { tom, runId, bytes } = await signedRunWithPhoto();
    const signed = await tom.post(`/api/runs/${runId}/sign`).send({ password: demo.tom.password });
    expect(signed.status).toBe(200);
    expect(signed.body.run.signature.verified).toBe(true);
    expect(await pdfOf(tom, runId)).toContain('Yes: the stored run content matches the signed hash.');
    writeFileSync(storedFileOf(bytes), uniquePng());
    expect((await tom.get(`/api/runs/${runId}`)).body.run.signature.verified).toBe(false);
    expect(await pdfOf(tom, runId)).toContain('NO: the stored run content does not match the signed hash.');
  });

  it('a run whose photo is missing cannot be signed (409)', async () => {
    const { tom, runId, bytes } = await signedRunWithPhoto();
    rmSync(storedFileOf(bytes));
    const res = await tom.post(`/api/runs/${runId}/sign`).send({ password: demo.tom.password });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/missing or altered/);
  });
});
