import { and, asc, eq, isNull, lte, sql } from 'drizzle-orm';
import nodemailer from 'nodemailer';
import type { Logger } from 'pino';
import type { Db } from '../db/client';
import { mailOutbox } from '../db/schema';

export interface SmtpSettings {
  host: string;
  port: number;
  from: string;
}

const MAX_BACKOFF_MS = 5 * 60_000;

/**
 * Delivers outbox rows over SMTP. Each row is delivered under its row lock and marked sent in
 * the same transaction, so two processes (or a job and a flush) never both send it: the second
 * skips it while locked and then finds it sent. A failed attempt is kept with its error and a
 * back-off; the job queue's sweep (server/jobs/worker.ts) tries it again, never dropping it.
 * Only a crash between the mail server's acceptance and the commit sends a message twice, and
 * then with the same Message-ID.
 */
export class MailSender {
  private running?: Promise<void>;
  private readonly transport;

  constructor(
    private readonly db: Db,
    private readonly smtp: SmtpSettings,
    private readonly logger: Logger,
  ) {
    this.transport = nodemailer.createTransport({
      host: smtp.host,
      port: smtp.port,
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 3_000,
      greetingTimeout: 3_000,
      socketTimeout: 5_000,
    });
  }

  async stop() {
    await this.running;
    this.transport.close();
  }

  /** Delivers everything due now, here (right after a commit that queued mail). Concurrent calls share one pass. */
  flush(): Promise<void> {
    this.running ??= this.sendDue().finally(() => {
      this.running = undefined;
    });
    return this.running;
  }

  private async sendDue() {
    let due: { id: string }[];
    try {
      due = await this.db
        .select({ id: mailOutbox.id })
        .from(mailOutbox)
        .where(and(isNull(mailOutbox.sentAt), lte(mailOutbox.nextAttemptAt, new Date())))
        .orderBy(asc(mailOutbox.createdAt))
        .limit(50);
    } catch (err) {
      this.logger.warn({ msg: (err as Error).message }, 'mail outbox not readable');
      return;
    }
    for (const { id } of due) await this.deliver(id).catch(() => undefined);
  }

  /** Sends one row when it is unsent and due; true when this call sent it. */
  async deliver(mailId: string): Promise<boolean> {
    return this.db.transaction(async (tx) => {
      const [mail] = await tx
        .select()
        .from(mailOutbox)
        .where(
          and(
            eq(mailOutbox.id, mailId),
            isNull(mailOutbox.sentAt),
            lte(mailOutbox.nextAttemptAt, new Date()),
          ),
        )
        .for('update', { skipLocked: true });
      if (!mail) return false; // sent, not due, or being sent by another process
      try {
        await this.transport.sendMail({
          from: this.smtp.from,
          to: mail.to,
          subject: mail.subject,
          text: mail.text,
          html: mail.html,
          messageId: `<${mail.id}@benchwright.local>`,
        });
      } catch (err) {
        const backoff = Math.min(MAX_BACKOFF_MS, 2_000 * 2 ** mail.attempts);
        this.logger.warn({ mailId: mail.id, msg: (err as Error).message }, 'mail not delivered; will retry');
        await tx
          .update(mailOutbox)
          .set({
            attempts: sql`${mailOutbox.attempts} + 1`,
            lastError: (err as Error).message.slice(0, 300),
            nextAttemptAt: new Date(Date.now() + backoff),
          })
          .where(eq(mailOutbox.id, mail.id));
        return false;
      }
      await tx
        .update(mailOutbox)
        .set({ sentAt: new Date(), lastError: null, attempts: sql`${mailOutbox.attempts} + 1` })
        .where(eq(mailOutbox.id, mail.id));
      return true;
    });
  }
}
