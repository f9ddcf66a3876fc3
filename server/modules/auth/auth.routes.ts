import { createHash } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Request, Response } from 'express';
import type { PassportStatic } from 'passport';
import { z } from 'zod';
import { setPasswordBody, signInBody } from '../../../shared/schemas/auth';
import { recordAudit } from '../../audit/record';
import { csrfToken } from '../../auth/csrf';
import { isCommonPassword } from '../../auth/common-passwords';
import { hashPassword } from '../../auth/passwords';
import { claimTry, signInRules } from '../../auth/throttle';
import { invitations, people } from '../../db/schema';
import { HttpError } from '../../http/errors';
import { defineRoute, type SessionUser } from '../../http/route';

const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

function authenticate(passport: PassportStatic, req: Request, res: Response): Promise<SessionUser | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) =>
      err ? reject(err) : resolve(user),
    )(req, res, () => undefined);
  });
}

const logIn = (req: Request, user: SessionUser) =>
  new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));

const tooMany = (wait: string) => `Too many failed sign-in attempts. Wait ${wait} and try again.`;

export const authRoutes = [
  defineRoute({
    method: 'get',
    path: '/auth/session',
    access: 'public',
    summary: 'Who is signed in, and the CSRF token for writes',
    handler: ({ req, res, user }) => ({ user, csrfToken: csrfToken(req, res) }),
  }),

  defineRoute({
    method: 'get',
    path: '/auth/me',
    access: 'signed-in',
    summary: 'The signed-in person (401 when the session has ended)',
    handler: ({ user }) => ({ user }),
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-in',
    access: 'public',
    summary: 'Sign in with e-mail and password',
    body: signInBody,
    handler: async ({ req, res, body, deps }) => {
      // Each try is claimed per account and per address before the password is checked (shared by
      // every app process); an unknown address counts like a known one.
      const rules = signInRules(deps.config.signInLimits);
      const tries = await claimTry(
        deps.db,
        res,
        [
          { key: `sign-in:account:${body.email.trim().toLowerCase()}`, rule: rules.account, onSuccess: 'reset' },
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
      await logIn(req, user); // passport regenerates the session id here
      req.session.startedAt = Date.now();
      await recordAudit(deps.db, { action: 'sign-in', actorId: user.id, subject: user.email, req });
      return { user, csrfToken: csrfToken(req, res, true) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-out',
    access: 'signed-in',
    summary: 'Sign out and end the session on the server',
    handler: async ({ req, res, user, deps }) => {
      await new Promise<void>((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
      await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
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
        .select({ email: people.email, displayName: people.displayName })
        .from(invitations)
        .innerJoin(people, eq(people.id, invitations.personId))
        .where(and(eq(invitations.tokenHash, tokenHash(params.token)), isNull(invitations.usedAt), gt(invitations.expiresAt, new Date())));
      if (!row) throw new HttpError(404, 'This link has expired or has already been used. Ask an admin for a new one.');
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
      if (isCommonPassword(body.password)) {
        throw new HttpError(400, 'That password is on the list of most common passwords; choose another.', {
          fields: [{ field: 'body.password', reason: 'is one of the most common passwords' }],
        });
      }
      const hash = await hashPassword(body.password);
      const personId = await deps.db.transaction(async (tx) => {
        const [invite] = await tx
          .update(invitations)
          .set({ usedAt: new Date() })
          .where(and(eq(invitations.tokenHash, tokenHash(body.token)), isNull(invitations.usedAt), gt(invitations.expiresAt, new Date())))
          .returning();
        if (!invite) throw new HttpError(404, 'This link has expired or has already been used. Ask an admin for a new one.');
        await tx.update(people).set({ passwordHash: hash }).where(eq(people.id, invite.personId));
        return invite.personId;
      });
      await recordAudit(deps.db, { action: 'person.password-set', actorId: personId, req });
      return { ok: true };
    },
  }),
];

export { tokenHash };
