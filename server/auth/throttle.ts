import type { Response } from 'express';
import { sql, type SQL } from 'drizzle-orm';
import type { Db } from '../db/client';
import { authThrottle } from '../db/schema';
import { HttpError } from '../http/errors';

/**
 * How many wrong passwords a key may collect before every further try has to wait; the wait then
 * doubles with each failure, from baseMs up to maxMs. A key left alone for forgetMs after its wait
 * ends starts over.
 */
export interface ThrottleRule {
  free: number;
  baseMs: number;
  maxMs: number;
  forgetMs: number;
}

export interface Claimed {
  /** The password was right: the account's or person's count starts over; an address gives back this try. */
  succeeded(): Promise<void>;
}

class Refused extends Error {}

const PRUNE_EVERY = 200;
let claimsSincePrune = 0;

/**
 * Claims one password try on each key, atomically and for every app process at once: the try is
 * counted as a failure BEFORE the password is checked, inside one transaction that locks each key's
 * row, so N parallel requests can never check more passwords than the rule allows (a count taken
 * first and written after the check could be raced). A key still waiting refuses the try with 429
 * and Retry-After, and nothing is counted. Call `succeeded()` when the password was right.
 */
export async function claimTry(
  db: Db,
  res: Response | undefined,
  keys: { key: string; rule: ThrottleRule; onSuccess: 'reset' | 'give-back' }[],
  message: (wait: string) => string,
): Promise<Claimed> {
  const sorted = [...keys].sort((x, y) => (x.key < y.key ? -1 : 1)); // one lock order: no deadlocks
  try {
    await db.transaction(async (tx) => {
      for (const { key, rule } of sorted) {
        const { rows } = await tx.execute(claimSql(key, rule));
        if (!rows.length) throw new Refused(); // rolls back the claims made on earlier keys
      }
    });
  } catch (err) {
    if (!(err instanceof Refused)) throw err;
    // How long until every key may be tried again, read after the rollback.
    const { rows } = await db.execute<{ wait_ms: number | null }>(sql`
      select max(extract(epoch from (retry_at - clock_timestamp())) * 1000)::float8 as wait_ms
      from ${authThrottle} where key in (${sql.join(
        sorted.map((k) => sql`${k.key}`),
        sql`, `,
      )})`);
    const seconds = Math.max(1, Math.ceil(Number(rows[0]?.wait_ms ?? 1000) / 1000));
    res?.set('Retry-After', String(seconds));
    throw new HttpError(429, message(waitWords(seconds)), { retryAfterSeconds: seconds });
  }
  if (++claimsSincePrune >= PRUNE_EVERY) {
    claimsSincePrune = 0;
    await db.execute(
      sql`delete from ${authThrottle} where forget_at < clock_timestamp() and retry_at < clock_timestamp()`,
    );
  }
  return {
    async succeeded() {
      for (const { key, rule, onSuccess } of sorted) {
        if (onSuccess === 'reset') await db.execute(sql`delete from ${authThrottle} where key = ${key}`);
        else await db.execute(giveBackSql(key, rule));
      }
    },
  };
}

export const waitWords = (seconds: number) =>
  seconds < 120 ? `${seconds} second${seconds === 1 ? '' : 's'}` : `${Math.ceil(seconds / 60)} minutes`;

const ms = (n: number) => sql`(${Math.round(n)}::float8 * interval '1 millisecond')`;

/** The wait after `failures` failures under the rule (an SQL interval). */
const waitAfter = (failures: SQL, rule: ThrottleRule) =>
  sql`(case when ${failures} < ${rule.free}::int then interval '0'
        else least(${rule.maxMs}::float8, ${rule.baseMs}::float8 * power(2::float8, least(${failures} - ${rule.free}::int, 40)))
             * interval '1 millisecond' end)`;

/**
 * One statement per key: insert the key's first try, or count one more on the existing row, but
 * only when its wait is over (the row lock makes parallel claims on one key take turns, and each
 * sees the count the one before it left). No row back means the try is refused.
 */
function claimSql(key: string, rule: ThrottleRule) {
  const next = sql`(case when t.forget_at < clock_timestamp() then 1 else t.failures + 1 end)`;
  return sql`
    insert into ${authThrottle} as t (key, failures, retry_at, forget_at)
    values (${key}, 1, clock_timestamp() + ${waitAfter(sql`1`, rule)}, clock_timestamp() + ${waitAfter(sql`1`, rule)} + ${ms(rule.forgetMs)})
    on conflict (key) do update set
      failures = ${next},
      retry_at = clock_timestamp() + ${waitAfter(next, rule)},
      forget_at = clock_timestamp() + ${waitAfter(next, rule)} + ${ms(rule.forgetMs)}
    where t.retry_at <= clock_timestamp()
    returning failures as claimed`;
}

/** A right password from an address gives back the try it claimed (the address may still be busy). */
function giveBackSql(key: string, rule: ThrottleRule) {
  const left = sql`greatest(t.failures - 1, 0)`;
  return sql`
    update ${authThrottle} as t set failures = ${left}, retry_at = clock_timestamp() + ${waitAfter(left, rule)}
    where t.key = ${key}`;
}

const SECOND = 1_000;
const MINUTE = 60 * SECOND;

/**
 * The rules, once. Sign-in counts per account (any address) and per address. An account's wait
 * stops growing at a minute, so a stranger guessing at it can slow its owner down but never lock
 * them out; that still allows fewer than 100 guesses an hour (ASVS 4.0.3 2.2.1). An address may
 * wait up to 15 minutes.
 */
export function signInRules(limits: { perAccount: number; perAddress: number; windowMs: number }) {
  return {
    account: { free: limits.perAccount, baseMs: SECOND, maxMs: MINUTE, forgetMs: limits.windowMs },
    address: { free: limits.perAddress, baseMs: SECOND, maxMs: 15 * MINUTE, forgetMs: limits.windowMs },
  } satisfies Record<string, ThrottleRule>;
}

/**
 * Per person, for re-entering one's password (sign-off, password change, authenticator set-up)
 * and for one-time codes: five wrong ones, then 1 s, 2 s, 4 s… up to 15 minutes. Only someone
 * holding the person's session (or their password, for codes) can make these count.
 */
export const PERSON_RULE: ThrottleRule = {
  free: 5,
  baseMs: SECOND,
  maxMs: 15 * MINUTE,
  forgetMs: 15 * MINUTE,
};
