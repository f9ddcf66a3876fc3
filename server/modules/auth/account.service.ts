import { and, count, eq, isNull } from 'drizzle-orm';
import type { Request } from 'express';
import { recordAudit } from '../../audit/record';
import { secondFactorRequired } from '../../auth/second-factor';
import { matchTotp, newRecoveryCodes, newTotpSecret, recoveryCodeHash } from '../../auth/totp';
import type { Db, Tx } from '../../db/client';
import { invitations, people, recoveryCodes } from '../../db/schema';
import { conflict, HttpError } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/** Replaces a person's recovery codes with a new set; returns the codes (shown once, stored hashed). */
async function replaceRecoveryCodes(tx: Tx, personId: string) {
  const codes = newRecoveryCodes();
  await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, personId));
  await tx.insert(recoveryCodes).values(codes.map((c) => ({ personId, codeHash: recoveryCodeHash(c) })));
  return codes;
}

export async function secondFactorView(db: Db, user: SessionUser) {
  const [person] = await db
    .select({ secret: people.totpSecret, pending: people.totpPendingSecret })
    .from(people)
    .where(eq(people.id, user.id));
  const [left] = await db
    .select({ n: count() })
    .from(recoveryCodes)
    .where(and(eq(recoveryCodes.personId, user.id), isNull(recoveryCodes.usedAt)));
  return {
    enabled: !!person?.secret,
    required: await secondFactorRequired(db, user),
    setupStarted: !!person?.pending,
    recoveryCodesLeft: person?.secret ? (left?.n ?? 0) : 0,
  };
}

/** Stores a new password hash and spends any reset link still out (it would undo the change). */
export async function storeNewPassword(db: Db, personId: string, passwordHash: string) {
  await db.transaction(async (tx) => {
    await tx.update(people).set({ passwordHash }).where(eq(people.id, personId));
    await tx
      .update(invitations)
      .set({ usedAt: new Date() })
      .where(and(eq(invitations.personId, personId), isNull(invitations.usedAt)));
  });
}

/** A new authenticator secret waiting for its first code; refused while one is set up. */
export async function startTotpSetup(db: Db, user: SessionUser) {
  const [person] = await db.select({ secret: people.totpSecret }).from(people).where(eq(people.id, user.id));
  if (person?.secret)
    throw conflict('An authenticator is already set up. Turn it off first to set up another.');
  const secret = newTotpSecret();
  await db.update(people).set({ totpPendingSecret: secret }).where(eq(people.id, user.id));
  return secret;
}

/** Finishes the set-up with a code from the new authenticator; answers the recovery codes (audited). */
export async function confirmTotp(db: Db, user: SessionUser, code: string, req: Request) {
  const [person] = await db
    .select({ pending: people.totpPendingSecret })
    .from(people)
    .where(eq(people.id, user.id));
  if (!person?.pending)
    throw conflict('Start the set-up first: there is no new authenticator waiting for a code.');
  const pending = person.pending;
  const step = matchTotp(pending, code);
  if (step === null) {
    throw new HttpError(
      400,
      'That code does not match. Check that the phone’s clock is right and type the code it shows now.',
      {
        fields: [{ field: 'body.code', reason: 'does not match the new authenticator' }],
      },
    );
  }
  return db.transaction(async (tx) => {
    const [done] = await tx
      .update(people)
      .set({ totpSecret: pending, totpPendingSecret: null, totpLastStep: step })
      .where(and(eq(people.id, user.id), eq(people.totpPendingSecret, pending), isNull(people.totpSecret)))
      .returning({ id: people.id });
    if (!done) throw conflict('The set-up changed meanwhile (another tab?). Start it again.');
    await recordAudit(tx, {
      action: 'person.second-factor-enabled',
      actorId: user.id,
      subject: user.email,
      req,
    });
    return replaceRecoveryCodes(tx, user.id);
  });
}

/** A new set of recovery codes; the old ones stop working (audited). */
export async function renewRecoveryCodes(db: Db, user: SessionUser, req: Request) {
  return db.transaction(async (tx) => {
    const [person] = await tx
      .select({ secret: people.totpSecret })
      .from(people)
      .where(eq(people.id, user.id))
      .for('update');
    if (!person?.secret) throw conflict('Set up an authenticator first.');
    await recordAudit(tx, {
      action: 'person.recovery-codes-renewed',
      actorId: user.id,
      subject: user.email,
      req,
    });
    return replaceRecoveryCodes(tx, user.id);
  });
}

/** Turns the person's authenticator and recovery codes off (audited). */
export async function disableTotp(db: Db, user: SessionUser, req: Request) {
  await db.transaction(async (tx) => {
    await tx
      .update(people)
      .set({ totpSecret: null, totpPendingSecret: null, totpLastStep: null })
      .where(eq(people.id, user.id));
    await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, user.id));
    await recordAudit(tx, {
      action: 'person.second-factor-disabled',
      actorId: user.id,
      subject: user.email,
      req,
    });
  });
}
