import { and, count, eq, isNull } from 'drizzle-orm';
import { changePasswordBody, codeBody, passwordBody } from '../../../shared/schemas/auth';
import { recordAudit } from '../../audit/record';
import { confirmPassword } from '../../auth/confirm-password';
import { csrfToken } from '../../auth/csrf';
import { endSessionsOf } from '../../auth/end-sessions';
import { hashPassword } from '../../auth/passwords';
import { secondFactorRequired } from '../../auth/second-factor';
import { matchTotp, newRecoveryCodes, newTotpSecret, otpauthUrl, recoveryCodeHash } from '../../auth/totp';
import type { Db, Tx } from '../../db/client';
import { invitations, people, recoveryCodes } from '../../db/schema';
import { conflict, HttpError } from '../../http/errors';
import { defineRoute, type SessionUser } from '../../http/route';
import { destroySession, logIn, refuseCommonPassword } from './session-steps';

const forgetPerson = (req: { app: { locals: Record<string, unknown> } }, id: string) =>
  (req.app.locals.passport as { forgetPerson(id: string): void }).forgetPerson(id);

/** Replaces a person's recovery codes with a new set; returns the codes (shown once, stored hashed). */
async function replaceRecoveryCodes(tx: Tx, personId: string) {
  const codes = newRecoveryCodes();
  await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, personId));
  await tx.insert(recoveryCodes).values(codes.map((c) => ({ personId, codeHash: recoveryCodeHash(c) })));
  return codes;
}

async function secondFactorView(db: Db, user: SessionUser) {
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

const reauth = (what: string) => ({ subject: what, what, failedAction: 'reauth.failed' as const });

export const accountRoutes = [
  defineRoute({
    method: 'get',
    path: '/auth/account',
    access: 'signed-in',
    beforeEnrolment: true,
    summary: 'The signed-in person’s account: authenticator state and recovery codes left',
    handler: async ({ user, deps }) => ({ user, secondFactor: await secondFactorView(deps.db, user!) }),
  }),

  defineRoute({
    method: 'post',
    path: '/auth/password',
    access: 'signed-in',
    beforeEnrolment: true,
    summary: 'Change one’s password (the current one is required); ends every other session of the person',
    body: changePasswordBody,
    handler: async ({ req, res, body, user, deps }) => {
      await confirmPassword(deps.db, user!, body.currentPassword, req, {
        ...reauth('password change'),
        field: 'body.currentPassword',
      });
      if (body.newPassword === body.currentPassword) {
        throw new HttpError(400, 'The new password is the same as the current one.', {
          fields: [{ field: 'body.newPassword', reason: 'is the current password' }],
        });
      }
      refuseCommonPassword(body.newPassword, 'body.newPassword');
      const hash = await hashPassword(body.newPassword);
      await deps.db.transaction(async (tx) => {
        await tx.update(people).set({ passwordHash: hash }).where(eq(people.id, user!.id));
        // A reset link still out would undo the change: spend it.
        await tx
          .update(invitations)
          .set({ usedAt: new Date() })
          .where(and(eq(invitations.personId, user!.id), isNull(invitations.usedAt)));
      });
      const otherSessionsEnded = await endSessionsOf(deps.db, req, user!.id, req.sessionID);
      // This session goes on under a new id (ASVS 7.2.4), keeping its absolute limit.
      const startedAt = req.session.startedAt;
      await logIn(req, user!);
      req.session.startedAt = startedAt ?? Date.now();
      await recordAudit(deps.db, {
        action: 'person.password-changed',
        actorId: user!.id,
        subject: user!.email,
        details: { otherSessionsEnded },
        req,
      });
      return { user, csrfToken: csrfToken(req, res, true) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-out-everywhere',
    access: 'signed-in',
    beforeEnrolment: true,
    summary: 'End every session of the signed-in person, this one included',
    handler: async ({ req, res, user, deps }) => {
      const sessionsEnded = await endSessionsOf(deps.db, req, user!.id);
      await destroySession(req);
      res.clearCookie(req.app.locals.sessionCookieName as string, { path: '/' });
      await recordAudit(deps.db, {
        action: 'sign-out.everywhere',
        actorId: user!.id,
        subject: user!.email,
        details: { sessionsEnded },
        req,
      });
      return { ok: true, sessionsEnded };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/totp/setup',
    access: 'signed-in',
    beforeEnrolment: true,
    summary:
      'Start setting up an authenticator (password again): a new secret and its otpauth:// address for the QR code',
    body: passwordBody,
    handler: async ({ req, body, user, deps }) => {
      await confirmPassword(deps.db, user!, body.password, req, reauth('authenticator set-up'));
      const [person] = await deps.db
        .select({ secret: people.totpSecret })
        .from(people)
        .where(eq(people.id, user!.id));
      if (person?.secret)
        throw conflict('An authenticator is already set up. Turn it off first to set up another.');
      const secret = newTotpSecret();
      await deps.db.update(people).set({ totpPendingSecret: secret }).where(eq(people.id, user!.id));
      return { secret, otpauthUrl: otpauthUrl(secret, user!.email) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/totp/confirm',
    access: 'signed-in',
    beforeEnrolment: true,
    summary: 'Finish setting up the authenticator with a code from it; answers the recovery codes, once',
    body: codeBody,
    handler: async ({ req, body, user, deps }) => {
      const [person] = await deps.db
        .select({ pending: people.totpPendingSecret })
        .from(people)
        .where(eq(people.id, user!.id));
      if (!person?.pending)
        throw conflict('Start the set-up first: there is no new authenticator waiting for a code.');
      const step = matchTotp(person.pending, body.code);
      if (step === null) {
        throw new HttpError(
          400,
          'That code does not match. Check that the phone’s clock is right and type the code it shows now.',
          {
            fields: [{ field: 'body.code', reason: 'does not match the new authenticator' }],
          },
        );
      }
      const codes = await deps.db.transaction(async (tx) => {
        const [done] = await tx
          .update(people)
          .set({ totpSecret: person.pending, totpPendingSecret: null, totpLastStep: step })
          .where(
            and(
              eq(people.id, user!.id),
              eq(people.totpPendingSecret, person.pending!),
              isNull(people.totpSecret),
            ),
          )
          .returning({ id: people.id });
        if (!done) throw conflict('The set-up changed meanwhile (another tab?). Start it again.');
        await recordAudit(tx, {
          action: 'person.second-factor-enabled',
          actorId: user!.id,
          subject: user!.email,
          req,
        });
        return replaceRecoveryCodes(tx, user!.id);
      });
      forgetPerson(req, user!.id);
      return { recoveryCodes: codes };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/totp/recovery-codes',
    access: 'signed-in',
    summary: 'A new set of recovery codes (password again); the old ones stop working',
    body: passwordBody,
    handler: async ({ req, body, user, deps }) => {
      await confirmPassword(deps.db, user!, body.password, req, reauth('new recovery codes'));
      const codes = await deps.db.transaction(async (tx) => {
        const [person] = await tx
          .select({ secret: people.totpSecret })
          .from(people)
          .where(eq(people.id, user!.id))
          .for('update');
        if (!person?.secret) throw conflict('Set up an authenticator first.');
        await recordAudit(tx, {
          action: 'person.recovery-codes-renewed',
          actorId: user!.id,
          subject: user!.email,
          req,
        });
        return replaceRecoveryCodes(tx, user!.id);
      });
      return { recoveryCodes: codes };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/totp/disable',
    access: 'signed-in',
    summary:
      'Turn authenticator codes off (password again); refused while the shop requires them for one’s role',
    body: passwordBody,
    handler: async ({ req, body, user, deps }) => {
      if (await secondFactorRequired(deps.db, user!)) {
        throw conflict(
          'The shop requires authenticator codes for your role, so they cannot be turned off. Ask an admin if you lost your authenticator.',
        );
      }
      await confirmPassword(deps.db, user!, body.password, req, reauth('turning codes off'));
      await deps.db.transaction(async (tx) => {
        await tx
          .update(people)
          .set({ totpSecret: null, totpPendingSecret: null, totpLastStep: null })
          .where(eq(people.id, user!.id));
        await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, user!.id));
        await recordAudit(tx, {
          action: 'person.second-factor-disabled',
          actorId: user!.id,
          subject: user!.email,
          req,
        });
      });
      forgetPerson(req, user!.id);
      return { ok: true };
    },
  }),
];
