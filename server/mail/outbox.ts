import type { Db, Tx } from '../db/client';
import { mailOutbox } from '../db/schema';
import { QUEUES, sendJob } from '../jobs/queue';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html: string;
  reason: string;
}

/**
 * Queues a message: its outbox row and the job that delivers it. Call it inside the transaction of
 * the change it reports: the mail exists exactly when the change does, and survives a crash of
 * this process (any app process works the job). The row is the job's key: delivering it twice
 * finds it sent (server/mail/sender.ts).
 */
export async function enqueueMail(db: Db | Tx, mail: OutgoingMail) {
  const to = [...new Set(mail.to.map((a) => a.toLowerCase()))];
  if (!to.length) return;
  await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(mailOutbox)
      .values({ ...mail, to })
      .returning({ id: mailOutbox.id });
    await sendJob(tx, QUEUES.mail, { mailId: row!.id }, { singletonKey: row!.id });
  });
}

const esc = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** Plain text and HTML from the same lines, with one link to the page the mail is about. */
export function composeMail(opts: {
  greeting: string;
  lines: string[];
  link: { url: string; label: string };
}) {
  const text = [
    opts.greeting,
    '',
    ...opts.lines,
    '',
    `${opts.link.label}: ${opts.link.url}`,
    '',
    '— Benchwright',
  ].join('\n');
  const html = [
    `<p>${esc(opts.greeting)}</p>`,
    ...opts.lines.map((l) => `<p>${esc(l)}</p>`),
    `<p><a href="${esc(opts.link.url)}">${esc(opts.link.label)}</a></p>`,
    '<p>— Benchwright</p>',
  ].join('\n');
  return { text, html };
}
