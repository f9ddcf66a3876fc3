import { createHash } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Request, Response } from 'express';
import type { PassportStatic } from 'passport';
import { z } from 'zod';
import { codeBody, setPasswordBody, signInBody } from '../../../shared/schemas/auth';
import { recordAudit } from '../../audit/record';
import { csrfToken } from '../../auth/csrf';
import { endSessionsOf } from '../../auth/end-sessions';
import { toSessionUser } from '../../auth/passport';
import { hashPassword } from '../../auth/passwords';
import { useSecondFactor } from '../../auth/second-factor';
import { claimTry, PERSON_RULE, signInRules } from '../../auth/throttle';
import { invitations, people } from '../../db/schema';
import { HttpError } from '../../http/errors';
import { defineRoute, type SessionUser } from '../../http/route';
import { logIn, refuseCommonPassword, regenerate, sessionFlags } from './session-steps';

const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

function authenticate(passport: PassportStatic, req: Request, res: Response): Promise<SessionUser | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) =>
      err ? reject(err) : resolve(user),
    )(req, res, () => undefined);
  });
}

/** How long the code step may follow the password step. */
const CODE_STEP_MS = 5 * 60_000;
const linkGone = 'This link has expired or has already been used. Ask an admin for a new one.';

const tooMany = (wait: string) => `Too many failed sign-in attempts. Wait ${wait} and try again.`;

export const authRoutes = [
  defineRoute({
    method: 'get',
    path: '/auth/session',
    access: 'public',
    summary: 'Who is signed in, and the CSRF token for writes',
    handler: async ({ req, res, user, deps }) => ({
      user,
      csrfToken: csrfToken(req, res),
      ...(await sessionFlags(deps, user)),
    }),
  }),

  defineRoute({
    method: 'get',
    path: '/auth/me',
    access: 'signed-in',
    summary: 'The signed-in person (401 when the session has ended)',
    beforeEnrolment: true,
    handler: ({ user }) => ({ user }),
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-in',
    access: 'public',
    summary: 'Sign in with e-mail and password (then a code, for people with an authenticator)',
    body: signInBody,
    handler: async ({ req, res, body, deps }) => {
      // Each try is claimed per account and per address before the password is checked (shared by
      // every app process); an unknown address counts like a known one.
      const rules = signInRules(deps.config.signInLimits);
      const tries = await claimTry(
        deps.db,
        res,
        [
          {
            key: `sign-in:account:${body.email.trim().toLowerCase()}`,
            rule: rules.account,
            onSuccess: 'reset',
          },
          { key: `sign-in:address:${req.ip ?? 'unknown'}`, rule: rules.address, onSuccess: 'give-back' },
        ],
        tooMany,
      );
      const passport = req.app.locals.passport as PassportStatic;
      const user = await authenticate(passport, req, res);
      if (!user) {
        await recordAudit(deps.db, { action: 'sign-in.failed', subject: body.email, req });
        req.log?.info('sign-in refused');
        throw new HttpError(401, 'That e-mail and password do not match an active account.');
      }
      await tries.succeeded();
      if (user.totp) {
        // Half-way: a new session that remembers who showed their password, and nothing more.
        await regenerate(req);
        req.session.pendingSecondFactor = { personId: user.id, at: Date.now() };
        return { user: null, secondFactor: 'totp', csrfToken: csrfToken(req, res, true) };
      }
      await logIn(req, user); // passport regenerates the session id here
      req.session.startedAt = Date.now();
      await recordAudit(deps.db, { action: 'sign-in', actorId: user.id, subject: user.email, req });
      return { user, csrfToken: csrfToken(req, res, true), ...(await sessionFlags(deps, user)) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-in/code',
    access: 'public',
    summary: 'Second step of signing in: a code from the authenticator app, or a recovery code',
    body: codeBody,
    handler: async ({ req, res, body, deps }) => {
      const pending = req.session?.pendingSecondFactor;
      if (!pending || Date.now() - pending.at > CODE_STEP_MS) {
        throw new HttpError(401, 'Sign in with your e-mail and password first; then type the code.');
      }
      const tries = await claimTry(
        deps.db,
        res,
        [{ key: `code:${pending.personId}`, rule: PERSON_RULE, onSuccess: 'reset' }],
        (wait) => `Too many wrong codes. Wait ${wait} and try again.`,
      );
      const kind = await useSecondFactor(deps.db, pending.personId, body.code);
      const [person] = await deps.db.select().from(people).where(eq(people.id, pending.personId));
      if (!kind || !person?.active) {
        await recordAudit(deps.db, {
          action: 'sign-in.code-failed',
          actorId: pending.personId,
          subject: person?.email,
          req,
        });
        throw new HttpError(
          401,
          'That code is not right, or it was used already. Type the code your authenticator shows now, or a recovery code.',
          {
            fields: [{ field: 'body.code', reason: 'does not match' }],
          },
        );
      }
      await tries.succeeded();
      const user = toSessionUser(person);
      await logIn(req, user);
      req.session.startedAt = Date.now();
      await recordAudit(deps.db, {
        action: 'sign-in',
        actorId: user.id,
        subject: user.email,
        details: { secondFactor: kind },
        req,
      });
      return { user, csrfToken: csrfToken(req, res, true), ...(await sessionFlags(deps, user)) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-out',
    access: 'signed-in',
    summary: 'Sign out and end the session on the server',
    beforeEnrolment: true,
    handler: async ({ req, res, user, deps }) => {
      await new Promise<void>((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
      await new Promise<void>((resolve, reject) =>
        req.session.destroy((err) => (err ? reject(err) : resolve())),
      );
      await recordAudit(deps.db, { action: 'sign-out', actorId: user?.id, req });
      res.clearCookie(req.app.locals.sessionCookieName as string, { path: '/' });
      return { ok: true };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/auth/invitations/:token',
    access: 'public',
    summary: 'Look up a set-password link',
    params: z.object({ token: z.string().min(20).max(200) }),
    handler: async ({ params, deps }) => {
      const [row] = await deps.db
        .select({ email: people.email, displayName: people.displayName, purpose: invitations.purpose })
        .from(invitations)
        .innerJoin(people, eq(people.id, invitations.personId))
        .where(
          and(
            eq(invitations.tokenHash, tokenHash(params.token)),
            isNull(invitations.usedAt),
            gt(invitations.expiresAt, new Date()),
          ),
        );
      if (!row) throw new HttpError(404, linkGone);
      return row;
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/set-password',
    access: 'public',
    summary: 'Set a password from a one-time link',
    body: setPasswordBody,
    handler: async ({ req, body, deps }) => {
      refuseCommonPassword(body.password, 'body.password');
      const hash = await hashPassword(body.password);
      const invite = await deps.db.transaction(async (tx) => {
        const [used] = await tx
          .update(invitations)
          .set({ usedAt: new Date() })
          .where(
            and(
              eq(invitations.tokenHash, tokenHash(body.token)),
              isNull(invitations.usedAt),
              gt(invitations.expiresAt, new Date()),
            ),
          )
          .returning();
        if (!used) throw new HttpError(404, linkGone);
        await tx.update(people).set({ passwordHash: hash }).where(eq(people.id, used.personId));
        // Any other link still out for this person is spent too.
        await tx
          .update(invitations)
          .set({ usedAt: new Date() })
          .where(and(eq(invitations.personId, used.personId), isNull(invitations.usedAt)));
        return used;
      });
      // A new password ends whatever sessions the person had (a reset is often for a suspected leak).
      const sessionsEnded = await endSessionsOf(deps.db, req, invite.personId);
      await recordAudit(deps.db, {
        action: 'person.password-set',
        actorId: invite.personId,
        details: { purpose: invite.purpose, sessionsEnded },
        req,
      });
      return { ok: true };
    },
  }),
];

export { tokenHash };
