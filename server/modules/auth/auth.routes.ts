import type { Request, Response } from 'express';
import { z } from 'zod';
import { codeBody, setPasswordBody, signInBody } from '../../../shared/schemas/auth';
import { recordAudit } from '../../audit/record';
import { endSessionsOf } from '../../auth/end-sessions';
import { toSessionUser } from '../../auth/passport';
import { hashPassword } from '../../auth/passwords';
import { useSecondFactor } from '../../auth/second-factor';
import { claimTry, PERSON_RULE, signInRules } from '../../auth/throttle';
import { HttpError } from '../../http/errors';
import type { AppDeps } from '../../deps';
import { defineRoute, type SessionUser } from '../../http/route';
import { personById, setPasswordFromLink, setPasswordLink } from './auth.service';
import { destroySession, logIn, refuseCommonPassword, regenerate, sessionFlags } from './session-steps';

function authenticate(
  passport: AppDeps['auth']['passport'],
  req: Request,
  res: Response,
): Promise<SessionUser | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) =>
      err ? reject(err) : resolve(user),
    )(req, res, () => undefined);
  });
}

/** How long the code step may follow the password step. */
const CODE_STEP_MS = 5 * 60_000;

const tooMany = (wait: string) => `Too many failed sign-in attempts. Wait ${wait} and try again.`;

export const authRoutes = [
  defineRoute({
    method: 'get',
    path: '/auth/session',
    access: 'public',
    summary: 'Who is signed in, and the CSRF token for writes',
    handler: async ({ req, res, user, deps }) => ({
      user,
      csrfToken: deps.auth.csrf.token(req, res),
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
      const user = await authenticate(deps.auth.passport, req, res);
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
        return { user: null, secondFactor: 'totp', csrfToken: deps.auth.csrf.token(req, res, true) };
      }
      await logIn(req, user); // passport regenerates the session id here
      req.session.startedAt = Date.now();
      await recordAudit(deps.db, { action: 'sign-in', actorId: user.id, subject: user.email, req });
      return { user, csrfToken: deps.auth.csrf.token(req, res, true), ...(await sessionFlags(deps, user)) };
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
      const person = await personById(deps.db, pending.personId);
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
      return { user, csrfToken: deps.auth.csrf.token(req, res, true), ...(await sessionFlags(deps, user)) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-out',
    access: 'signed-in',
    summary: 'Sign out and end the session on the server',
    beforeEnrolment: true,
    handler: async ({ req, res, user, deps }) => {
      await destroySession(req);
      await recordAudit(deps.db, { action: 'sign-out', actorId: user?.id, req });
      res.clearCookie(deps.auth.sessions.cookieName, { path: '/' });
      return { ok: true };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/auth/invitations/:token',
    access: 'public',
    summary: 'Look up a set-password link',
    params: z.object({
      token: z
        .string()
        .min(20, 'This link is not valid')
        .max(200, 'This link is not valid')
        .meta({ title: 'Link' }),
    }),
    handler: async ({ params, deps }) => {
      return setPasswordLink(deps.db, params.token);
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
      const invite = await setPasswordFromLink(deps.db, body.token, hash);
      // A new password ends whatever sessions the person had (a reset is often for a suspected leak).
      const sessionsEnded = await endSessionsOf(deps, invite.personId);
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
