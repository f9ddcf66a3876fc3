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
 * Delivers queued mail over SMTP. Runs every few seconds and right after new mail is queued;
 * a failed attempt is retried with exponential back-off, never dropped.
 */
export class MailSender {
  private timer?: NodeJS.Timeout;
  private running?: Promise<void>;
  private readonly transport;

  constructor(
    private readonly db: Db,
    private readonly smtp: SmtpSettings,
    private readonly logger: Logger,
    private readonly intervalMs = 3_000,
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

  start() {
    this.timer = setInterval(() => void this.flush(), this.intervalMs);
    this.timer.unref();
  }

  async stop() {
    if (this.timer) clearInterval(this.timer);
    await this.running;
    this.transport.close();
  }

  /** Sends everything due now. Concurrent calls share one pass. */
  flush(): Promise<void> {
    this.running ??= this.sendDue().finally(() => {
      this.running = undefined;
    });
    return this.running;
  }

  private async sendDue() {
    let due: (typeof mailOutbox.$inferSelect)[];
    try {
      due = await this.db
        .select()
        .from(mailOutbox)
        .where(and(isNull(mailOutbox.sentAt), lte(mailOutbox.nextAttemptAt, new Date())))
        .orderBy(asc(mailOutbox.createdAt))
        .limit(50);
    } catch (err) {
      this.logger.warn({ msg: (err as Error).message }, 'mail outbox not readable');
      return;
    }
    for (const mail of due) {
      try {
        await this.transport.sendMail({
          from: this.smtp.from,
          to: mail.to,
          subject: mail.subject,
          text: mail.text,
          html: mail.html,
          messageId: `<${mail.id}@benchwright.local>`,
        });
        await this.db
          .update(mailOutbox)
          .set({ sentAt: new Date(), lastError: null, attempts: sql`${mailOutbox.attempts} + 1` })
          .where(eq(mailOutbox.id, mail.id));
      } catch (err) {
        const backoff = Math.min(MAX_BACKOFF_MS, 2_000 * 2 ** mail.attempts);
        this.logger.warn({ mailId: mail.id, msg: (err as Error).message }, 'mail not delivered; will retry');
        await this.db
          .update(mailOutbox)
          .set({
            attempts: sql`${mailOutbox.attempts} + 1`,
            lastError: (err as Error).message.slice(0, 300),
            nextAttemptAt: new Date(Date.now() + backoff),
          })
          .where(eq(mailOutbox.id, mail.id))
          .catch(() => undefined);
      }
    }
  }
}
