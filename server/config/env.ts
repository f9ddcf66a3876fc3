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

const yesNo = (fallback: boolean) =>
  z.preprocess(
    blankIsUnset,
    z
      .enum(['true', 'false', '1', '0', 'yes', 'no'], { error: 'must be true or false' })
      .default(fallback ? 'true' : 'false')
      .transform((v) => ['true', '1', 'yes'].includes(v)),
  );

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
  /**
   * Where uploaded files and issued run sheets are kept: `s3` (default) an S3-compatible bucket —
   * S3_ENDPOINT's, or a local object-store fake that the start and test commands run on loopback
   * when S3_ENDPOINT is unset; `disk` plain files in .data/uploads, for a shop on one machine.
   */
  FILE_STORE: z.preprocess(
    blankIsUnset,
    z.enum(['s3', 'disk'], { error: 'must be s3 or disk' }).default('s3'),
  ),
  /** The object store's URL (http or https); unset: the local fake. */
  S3_ENDPOINT: z.preprocess(
    blankIsUnset,
    z
      .url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' })
      .trim()
      .optional(),
  ),
  /** Bucket names: 3–63 lower-case letters, digits, dots and hyphens (the S3 naming rules). */
  S3_BUCKET: z.preprocess(
    blankIsUnset,
    z
      .string()
      .trim()
      .regex(
        /^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/,
        'is not a bucket name (3–63 lower-case letters, digits, dots and hyphens)',
      )
      .default('benchwright'),
  ),
  S3_REGION: z.preprocess(blankIsUnset, z.string().trim().default('us-east-1')),
  /** Both or neither; neither: the SDK's own chain (instance role, ~/.aws). */
  S3_ACCESS_KEY_ID: z.preprocess(blankIsUnset, z.string().trim().optional()),
  S3_SECRET_ACCESS_KEY: z.preprocess(blankIsUnset, z.string().optional()),
  /** Bucket in the path (http://host/bucket/key), as most stores a company runs itself expect. */
  S3_FORCE_PATH_STYLE: yesNo(true),
  /** npm start's local object-store fake (when FILE_STORE=s3 and S3_ENDPOINT is unset). */
  BW_S3_PORT: port(54330),
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

/** Rules that tie variables together. */
const checkedEnv = envSchema.superRefine((env, ctx) => {
  if (!env.S3_ACCESS_KEY_ID !== !env.S3_SECRET_ACCESS_KEY) {
    const [missing, given] = env.S3_ACCESS_KEY_ID
      ? ['S3_SECRET_ACCESS_KEY', 'S3_ACCESS_KEY_ID']
      : ['S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY'];
    ctx.addIssue({
      code: 'custom',
      path: [missing],
      message: `is needed with ${given} (set both, or neither)`,
    });
  }
});

/** Reads the variables from `source`; a bad one throws naming each variable, its value and the rule. */
export function readEnv(source: Record<string, string | undefined>): Env {
  const result = checkedEnv.safeParse(source);
  if (result.success) return result.data;
  const problems = result.error.issues.map((issue) => {
    const name = String(issue.path[0]);
    const value = source[name] === undefined ? ' (unset)' : `=${JSON.stringify(source[name])}`;
    return `${name}${value} ${issue.message}`;
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
