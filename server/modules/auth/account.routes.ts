import { changePasswordBody, codeBody, passwordBody } from '../../../shared/schemas/auth';
import { recordAudit } from '../../audit/record';
import { confirmPassword } from '../../auth/confirm-password';
import { endSessionsOf } from '../../auth/end-sessions';
import { hashPassword } from '../../auth/passwords';
import { secondFactorRequired } from '../../auth/second-factor';
import { otpauthUrl } from '../../auth/totp';
import { conflict, HttpError } from '../../http/errors';
import { defineRoute } from '../../http/route';
import {
  confirmTotp,
  disableTotp,
  renewRecoveryCodes,
  secondFactorView,
  startTotpSetup,
  storeNewPassword,
} from './account.service';
import { destroySession, logIn, refuseCommonPassword } from './session-steps';

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
      await storeNewPassword(deps.db, user!.id, hash);
      const otherSessionsEnded = await endSessionsOf(deps, user!.id, req.sessionID);
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
      return { user, csrfToken: deps.auth.csrf.token(req, res, true) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/auth/sign-out-everywhere',
    access: 'signed-in',
    beforeEnrolment: true,
    summary: 'End every session of the signed-in person, this one included',
    handler: async ({ req, res, user, deps }) => {
      const sessionsEnded = await endSessionsOf(deps, user!.id);
      await destroySession(req);
      res.clearCookie(deps.auth.sessions.cookieName, { path: '/' });
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
      const secret = await startTotpSetup(deps.db, user!);
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
      const codes = await confirmTotp(deps.db, user!, body.code, req);
      deps.auth.passport.forgetPerson(user!.id);
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
      const codes = await renewRecoveryCodes(deps.db, user!, req);
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
      await disableTotp(deps.db, user!, req);
      deps.auth.passport.forgetPerson(user!.id);
      return { ok: true };
    },
  }),
];
