import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type pg from 'pg';
import type { Logger } from 'pino';
import type { createCsrf } from './auth/csrf';
import type { createPassport } from './auth/passport';
import type { createSessionMiddleware } from './auth/session';
import type { Db } from './db/client';
import type { MailSender, SmtpSettings } from './mail/sender';
import type { LibraryCache } from './http/library-cache';
import type { SearchService } from './search/search-service';
import type { FileStore } from './storage/files';
import type { S3Settings } from './storage/s3-store';

export interface AppConfig {
  sessionSecret: string;
  /** Express "trust proxy" setting; false when Benchwright is reached directly. */
  trustProxy: boolean | number | string;
  /** Built client to serve (dist/client); omitted in API-only tests and in dev. */
  clientDir?: string;
  /** Base URL people reach the app at, for links in invitations and mail. */
  publicUrl: string;
  /** Host names besides the public URL's and loopback that requests may name (421 for others). */
  allowedHosts?: string[];
  /**
   * Wrong passwords per account (any address) and per address before each further sign-in try waits
   * (a growing wait: server/auth/throttle.ts); a key quiet for windowMs after its wait starts over.
   */
  signInLimits: { perAccount: number; perAddress: number; windowMs: number };
  /** Idle and absolute session lifetimes. */
  sessionIdleMs: number;
  sessionAbsoluteMs: number;
  /** Where uploaded files are kept (git-ignored .data/uploads by default) when `s3` is not set. */
  uploadDir: string;
  /** The bucket that keeps uploaded files and issued run sheets instead of uploadDir (FILE_STORE=s3). */
  s3?: S3Settings;
  /** Outgoing mail server; none in API-only tests (mail then waits in the outbox). */
  smtp?: SmtpSettings;
  /** How often a running server re-checks the audit hash chain (it also checks at start); 0: at start only; default hourly. */
  auditCheckIntervalMs?: number;
  /** Months an approved revision stands before its periodic review falls due (REVIEW_INTERVAL_MONTHS; default 24). */
  reviewIntervalMonths?: number;
  /** How often a running server looks for reviews that fell due (it also looks at start); default hourly. */
  reviewDueCheckIntervalMs?: number;
}

/** The sign-in machinery createApp builds for its app: one passport, session store and CSRF guard. */
export interface AuthRuntime {
  passport: ReturnType<typeof createPassport>;
  sessions: ReturnType<typeof createSessionMiddleware>;
  csrf: ReturnType<typeof createCsrf>;
}

/** Everything a route handler may reach; built once per app. */
export interface AppDeps {
  db: Db;
  pool: pg.Pool;
  logger: Logger;
  config: AppConfig;
  /** Delivers queued mail; call `mailer?.flush()` after committing a change that queued mail. */
  mailer?: MailSender;
  /** The in-process search index, kept current by NOTIFY from PostgreSQL. */
  search?: SearchService;
  /** Uploaded bytes and issued run sheets, kept under their SHA-256 (config.s3's bucket, else config.uploadDir). */
  files: FileStore;
  /** Reader, list, filter and search answers kept until the library changes (follows `search`). */
  library: LibraryCache;
  auth: AuthRuntime;
}

export const defaultConfig = (
  overrides: Partial<AppConfig> & Pick<AppConfig, 'sessionSecret'>,
): AppConfig => ({
  trustProxy: false,
  publicUrl: 'http://127.0.0.1:5480',
  signInLimits: { perAccount: 10, perAddress: 50, windowMs: 15 * 60_000 },
  sessionIdleMs: 8 * 3600_000,
  sessionAbsoluteMs: 24 * 3600_000,
  uploadDir: path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../.data/uploads'),
  ...overrides,
});
