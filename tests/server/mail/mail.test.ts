import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../../server/db/schema';
import { createLogger } from '../../../server/logger';
import { startFakeSmtp } from '../../../server/mail/fake-smtp';
import { composeMail, enqueueMail } from '../../../server/mail/outbox';
import { MailSender } from '../../../server/mail/sender';
import { parseMails } from '../../support/parsed-mail';
import { createTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({}, { mail: true });
});
afterAll(() => t.close());

const message = (subject: string) => ({
  to: ['Marek@TallowCreek.example'],
  subject,
  reason: 'test',
  ...composeMail({
    greeting: 'Hello Marek,',
    lines: ['Revision 2 of the TC-18 first power-up awaits your review.'],
    link: { url: 'http://127.0.0.1:5480/revisions/x', label: 'Open the revision' },
  }),
});

describe('mail through the outbox', () => {
  it('delivers a queued message over SMTP to the local catcher, as plain text and HTML with a link', async () => {
    await enqueueMail(t.db, message('Review requested: TC-18'));
    await t.mailer!.flush();
    const got = (await parseMails(t.catcher!.received)).find((m) => m.subject === 'Review requested: TC-18')!;
    expect(got).toBeDefined();
    // The address goes out in lower case, in the header and the envelope alike.
    expect(got.to).toEqual(['marek@tallowcreek.example']);
    expect(got.envelopeTo).toEqual(['marek@tallowcreek.example']);
    expect(got.from).toBe('bench@tallowcreek.example');
    // Plain text and HTML from the same lines, each with the link.
    expect(got.text).toContain('Revision 2 of the TC-18 first power-up awaits your review.');
    expect(got.links).toEqual(['http://127.0.0.1:5480/revisions/x']);
    expect(got.html).toContain('<p>Revision 2 of the TC-18 first power-up awaits your review.</p>');
    expect(got.html).toContain('<a href="http://127.0.0.1:5480/revisions/x">Open the revision</a>');
    const [row] = await t.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, 'Review requested: TC-18'));
    expect(row!.sentAt).not.toBeNull();
  });

  it('keeps a message while the mail server is down and delivers it once it is back', async () => {
    // Find a free port, then leave it closed: the "mail server is down".
    const probe = await startFakeSmtp(0);
    const port = probe.port;
    await probe.close();
    const sender = new MailSender(
      t.db,
      { host: '127.0.0.1', port, from: 'bench@tallowcreek.example' },
      createLogger('silent'),
    );
    await enqueueMail(t.db, message('Returned: TC-30H rails'));
    await sender.flush();
    const [pending] = await t.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, 'Returned: TC-30H rails'));
    expect(pending!.sentAt).toBeNull();
    expect(pending!.attempts).toBe(1);
    expect(pending!.lastError).toBeTruthy();

    const back = await startFakeSmtp(port);
    await t.db.update(mailOutbox).set({ nextAttemptAt: new Date() }).where(eq(mailOutbox.id, pending!.id));
    await sender.flush();
    await sender.stop();
    expect((await parseMails(back.received)).map((m) => m.subject)).toContain('Returned: TC-30H rails');
    await back.close();
  });
});
