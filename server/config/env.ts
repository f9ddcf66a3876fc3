import { z } from 'zod';

const PORT_RULE = 'is not a port number (1–65535)';

/** An unset or blank variable reads as absent, so its default applies. */
const blankIsUnset = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

const wholeNumber = (rule: string, min: number, max: number) =>
  z
    .string()
    .trim()
    .regex(/^\d+$/, rule)
    .transform(Number)
    .refine((n) => n >= min && n <= max, rule);

const port = (fallback: number) =>
  z.preprocess(blankIsUnset, wholeNumber(PORT_RULE, 1, 65535).default(fallback));

/** Every environment variable the server and its start-up scripts read, with its default. */
export const envSchema = z.object({
  /** The app's HTTP port (`npm start`; the dev server proxies to it). */
  PORT: port(5480),
  /** npm start's private PostgreSQL. */
  BW_DB_PORT: port(54329),
  /** A parallel test run's own clusters (54339 + 20n …) and client build. */
  BW_TEST_SLOT: z.preprocess(blankIsUnset, wholeNumber('is not a test slot number (0–99)', 0, 99).default(0)),
  /** Host names a reverse proxy in front may pass on, comma-separated; others are answered 421. */
  BW_ALLOWED_HOSTS: z.preprocess(
    blankIsUnset,
    z
      .string()
      .default('')
      .transform((s) =>
        s
          .split(',')
          .map((h) => h.trim())
          .filter(Boolean),
      ),
  ),
  /**
   * A PostgreSQL shared by several machines, as the app role (benchwright_app); unset: npm start's
   * private cluster. With it, npm start applies migrations only when DATABASE_OWNER_URL is set too.
   */
  DATABASE_URL: z.preprocess(blankIsUnset, z.url('is not a postgres:// URL').optional()),
  DATABASE_OWNER_URL: z.preprocess(blankIsUnset, z.url('is not a postgres:// URL').optional()),
  /** Address the app listens on (127.0.0.1: this machine only; 0.0.0.0 for a proxy on another machine). */
  BW_HOST: z.preprocess(blankIsUnset, z.string().trim().default('127.0.0.1')),
  /** The address people reach the app at (links in mail; the allowed origin); default http://BW_HOST:PORT. */
  BW_PUBLIC_URL: z.preprocess(blankIsUnset, z.url('is not an http(s) URL').optional()),
  /** Signs session cookies; the same on every machine (unset: one made in .data/session.secret). */
  BW_SESSION_SECRET: z.preprocess(
    blankIsUnset,
    z.string().min(32, 'must be at least 32 characters').optional(),
  ),
  /** How many app processes `npm start` runs (node:cluster; each shares the port and the database). */
  WORKERS: z.preprocess(
    blankIsUnset,
    wholeNumber('must be a whole number of processes (1–64)', 1, 64).default(1),
  ),
  /**
   * Express "trust proxy" for a reverse proxy in front (nginx): `loopback`, an address or subnet
   * list, or a hop count; unset: requests are taken as they come (the client address is the peer).
   */
  BW_TRUST_PROXY: z.preprocess(
    blankIsUnset,
    z
      .string()
      .trim()
      .optional()
      .transform((v) => (v === undefined ? false : /^\d+$/.test(v) ? Number(v) : v === 'true' ? true : v)),
  ),
  /** The shop's mail relay; unset: a local mail catcher keeps every message. */
  SMTP_HOST: z.preprocess(blankIsUnset, z.string().trim().optional()),
  SMTP_PORT: port(25),
  SMTP_FROM: z.preprocess(blankIsUnset, z.string().default('Benchwright <benchwright@tallowcreek.example>')),
  /** How often the audit chain is re-checked (0: at start only). */
  AUDIT_CHECK_MINUTES: z.preprocess(
    blankIsUnset,
    z.coerce
      .number({ error: 'must be a number of minutes (0 or more)' })
      .refine((n) => Number.isFinite(n) && n >= 0, 'must be a number of minutes (0 or more)')
      .default(60),
  ),
  /** How long an approved revision stands before it is due for its periodic review (months; shop default two years). */
  REVIEW_INTERVAL_MONTHS: z.preprocess(
    blankIsUnset,
    wholeNumber('must be a whole number of months (1–120)', 1, 120).default(24),
  ),
  LOG_LEVEL: z.preprocess(
    blankIsUnset,
    z
      .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], {
        error: 'must be one of fatal, error, warn, info, debug, trace, silent',
      })
      .default('info'),
  ),
});

export type Env = z.infer<typeof envSchema>;

/** Reads the variables from `source`; a bad one throws naming each variable, its value and the rule. */
export function readEnv(source: Record<string, string | undefined>): Env {
  const result = envSchema.safeParse(source);
  if (result.success) return result.data;
  const problems = result.error.issues.map((issue) => {
    const name = String(issue.path[0]);
    return `${name}=${JSON.stringify(source[name])} ${issue.message}`;
  });
  throw new Error(`Bad environment: ${problems.join('; ')}.`);
}

/** Read and checked once, at start; a bad value stops the process with the reason. */
export const env: Env = (() => {
  try {
    return readEnv(process.env);
  } catch (err) {
    console.error(`[benchwright] ${(err as Error).message}`);
    process.exit(2);
  }
})();
