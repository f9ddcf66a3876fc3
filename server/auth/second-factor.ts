import { and, eq, isNull, lt, or } from 'drizzle-orm';
import type { Db } from '../db/client';
import { people, recoveryCodes, shopSettings, type Role } from '../db/schema';
import type { SessionUser } from '../http/route';
import { isRecoveryCode, matchTotp, recoveryCodeHash } from './totp';

/** The roles that must use authenticator codes once the shop requires them. */
export const SECOND_FACTOR_ROLES: readonly Role[] = ['reviewer', 'admin'];

/** How long a setting read from PostgreSQL is used before reading it again (other processes follow within this). */
const SETTINGS_TTL_MS = 2_000;
let cached: { requireSecondFactor: boolean; at: number } | undefined;

export async function readShopSettings(db: Db) {
  if (cached && Date.now() - cached.at < SETTINGS_TTL_MS) return cached;
  const [row] = await db.select({ requireSecondFactor: shopSettings.requireSecondFactor }).from(shopSettings);
  cached = { requireSecondFactor: row?.requireSecondFactor ?? false, at: Date.now() };
  return cached;
}
export const forgetShopSettings = () => {
  cached = undefined;
};

/** Whether this person must use authenticator codes (by their roles and the shop's setting). */
export async function secondFactorRequired(db: Db, user: Pick<SessionUser, 'roles'>) {
  if (!user.roles.some((r) => SECOND_FACTOR_ROLES.includes(r))) return false;
  return (await readShopSettings(db)).requireSecondFactor;
}

/** Required but not set up yet: such a session may reach only its account page until it is. */
export const enrolmentRequired = async (db: Db, user: SessionUser) =>
  !user.totp && (await secondFactorRequired(db, user));

/**
 * Checks a code typed at sign-in: six digits from the authenticator, accepted at most once per time
 * step (the step is recorded atomically, so a replayed or raced code loses), or one of the person's
 * recovery codes, used up atomically.
 */
export async function useSecondFactor(
  db: Db,
  personId: string,
  code: string,
): Promise<'totp' | 'recovery-code' | null> {
  if (isRecoveryCode(code)) {
    const [used] = await db
      .update(recoveryCodes)
      .set({ usedAt: new Date() })
      .where(
        and(
          eq(recoveryCodes.personId, personId),
          eq(recoveryCodes.codeHash, recoveryCodeHash(code)),
          isNull(recoveryCodes.usedAt),
        ),
      )
      .returning({ id: recoveryCodes.id });
    return used ? 'recovery-code' : null;
  }
  const [person] = await db.select({ secret: people.totpSecret }).from(people).where(eq(people.id, personId));
  if (!person?.secret) return null;
  const step = matchTotp(person.secret, code);
  if (step === null) return null;
  const [taken] = await db
    .update(people)
    .set({ totpLastStep: step })
    .where(and(eq(people.id, personId), or(isNull(people.totpLastStep), lt(people.totpLastStep, step))))
    .returning({ id: people.id });
  return taken ? 'totp' : null;
}
