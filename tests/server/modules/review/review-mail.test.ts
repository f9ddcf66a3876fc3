import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../../../server/db/schema';
import { startFakeSmtp } from '../../../../server/mail/fake-smtp';
import type { ReceivedMail } from '../../../../server/mail/fake-smtp';
import { parseMails } from '../../../support/parsed-mail';
import { createTestApp, demo, type TestApp } from '../../../support/test-app';
import { approve, goodDoc, inReview, newDraft, params } from './review-support';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

/**
 * A transition starts a background flush right after its commit; a flush() called while a pass is
 * running joins that pass, which may have read the outbox before the latest commit. A second
 * flush starts a fresh pass that sees everything committed so far.
 */
async function deliverAll() {
  await t.mailer!.flush();
  await t.mailer!.flush();
}

const link = (revisionId: string) => `http://127.0.0.1/review/revisions/${revisionId}`;
/** Messages the catcher got that link to the revision, with the subject starting `subject`. */
const about = async (received: ReceivedMail[], revisionId: string, subject = '') =>
  (await parseMails(received)).filter(
    (m) => m.links.includes(link(revisionId)) && m.subject.startsWith(subject),
  );
/** Who was sent mail about the revision (the To headers, as the envelope delivered them). */
const recipientsOf = async (received: ReceivedMail[], revisionId: string) => {
  const mails = await about(received, revisionId);
  for (const m of mails) expect(m.envelopeTo).toEqual(m.to);
  return mails.flatMap((m) => m.to).sort();
};

describe('review mail through the outbox and a real SMTP conversation', () => {
  it('review requested reaches every active reviewer except the author and editors', async () => {
    const d = await newDraft(t, 'hal');
    // Dee (reviewer + author) edits the draft, so she must not be asked to review it.
    const dee = await t.as('dee');
    const meta = { ...d.meta, tags: [] };
    expect(
      (
        await dee
          .put(`/api/revisions/${d.revision.id}`)
          .send({ ...meta, params, lockVersion: d.revision.lockVersion, document: goodDoc('0.15 A') })
      ).status,
    ).toBe(200);
    expect(
      (await d.c.post(`/api/revisions/${d.revision.id}/submit`).send({ changeReason: 'Test change.' }))
        .status,
    ).toBe(200);
    await deliverAll();
    const got = await recipientsOf(t.catcher!.received, d.revision.id);
    expect(got).toEqual([demo.marek.email]);

    // Hal's own draft, untouched by Dee: both reviewers, never Hal, never a technician or admin.
    const solo = await inReview(t, 'hal');
    await deliverAll();
    const soloTo = await recipientsOf(t.catcher!.received, solo.revision.id);
    expect(soloTo).toEqual([demo.dee.email, demo.marek.email].sort());
    const msg = (await about(t.catcher!.received, solo.revision.id))[0]!;
    expect(msg.subject).toMatch(/^Review requested: /);
    expect(msg.from).toBe('bench@tallowcreek.example');
    // Plain text and HTML, each with the one link to the review.
    expect(msg.links).toEqual([link(solo.revision.id)]);
    expect(msg.html).toContain(`<a href="${link(solo.revision.id)}">`);
  });

  it('approved and returned reach the author, with the reviewer’s comment', async () => {
    const a = await inReview(t, 'ruth');
    const marek = await t.as('marek');
    expect(
      (await approve(marek, a.revision.id, 'marek', 'Bleeder value confirmed on the bench.')).status,
    ).toBe(200);
    const r = await inReview(t, 'ruth');
    expect(
      (
        await marek
          .post(`/api/revisions/${r.revision.id}/return`)
          .send({ password: demo.marek.password, comment: 'Add the discharge check before the HT reading.' })
      ).status,
    ).toBe(200);
    await deliverAll();
    const approved = await about(t.catcher!.received, a.revision.id, 'Approved');
    expect(approved.map((m) => m.to)).toEqual([[demo.ruth.email]]);
    expect(approved[0]!.text).toContain('Comment: Bleeder value confirmed on the bench.');
    const returned = await about(t.catcher!.received, r.revision.id, 'Returned');
    expect(returned.map((m) => m.to)).toEqual([[demo.ruth.email]]);
    expect(returned[0]!.text).toContain('Comment: Add the discharge check before the HT reading.');
  });

  it('with the mail server down the approval still succeeds, and the mail goes out once it is back', async () => {
    const a = await inReview(t, 'hal');
    await deliverAll();
    const port = t.catcher!.port;
    await t.catcher!.close(); // the shop's mail server is down

    const res = await approve(await t.as('marek'), a.revision.id, 'marek', 'Approved while mail was down.');
    expect(res.status).toBe(200);
    expect(res.body.revision.state).toBe('approved');
    await deliverAll();
    const [pending] = await t.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.reason, 'revision-approved'))
      .then((rows) => rows.filter((m) => m.text.includes('Approved while mail was down.')));
    expect(pending!.sentAt).toBeNull();
    expect(pending!.attempts).toBeGreaterThanOrEqual(1);
    expect(pending!.lastError).toBeTruthy();

    const back = await startFakeSmtp(port);
    try {
      await t.db.update(mailOutbox).set({ nextAttemptAt: new Date() }).where(eq(mailOutbox.id, pending!.id));
      await deliverAll();
      const delivered = (await parseMails(back.received)).filter((m) =>
        m.text.includes('Approved while mail was down.'),
      );
      expect(delivered.map((m) => m.to)).toEqual([[demo.hal.email]]);
      expect(delivered[0]!.links).toEqual([link(a.revision.id)]);
      const [sent] = await t.db.select().from(mailOutbox).where(eq(mailOutbox.id, pending!.id));
      expect(sent!.sentAt).not.toBeNull();
    } finally {
      await back.close();
    }
  });
});
