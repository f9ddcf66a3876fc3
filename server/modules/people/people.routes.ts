import { paths } from '../../../shared/paths';
import { randomBytes } from 'node:crypto';
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { signInSettingsBody } from '../../../shared/schemas/auth';
import { inviteBody, updatePersonBody, type PersonView } from '../../../shared/schemas/people';
import { recordAudit } from '../../audit/record';
import { endSessionsOf } from '../../auth/end-sessions';
import { forgetShopSettings } from '../../auth/second-factor';
import type { Tx } from '../../db/client';
import { invitations, people, recoveryCodes, session, shopSettings } from '../../db/schema';
import { conflict, badRequest, notFound } from '../../http/errors';
import { composeMail, enqueueMail } from '../../mail/outbox';
import { defineRoute } from '../../http/route';
import { tokenHash } from '../auth/auth.routes';

const INVITE_DAYS = 7;
const RESET_HOURS = 24;

/**
 * A one-time set-password link for the person, queued as mail to their own address in the same
 * transaction. Only the person's mailbox ever holds the link: the admin's answer carries none, and
 * the outbox page shows it cut. A new link spends any older one still out.
 */
async function mailSetPasswordLink(
  tx: Tx,
  publicUrl: string,
  person: { id: string; email: string },
  createdBy: string,
  purpose: 'invitation' | 'reset',
  compose: (url: string) => Parameters<typeof enqueueMail>[1],
) {
  const token = randomBytes(32).toString('base64url');
  const lifetimeMs = purpose === 'reset' ? RESET_HOURS * 3_600_000 : INVITE_DAYS * 86_400_000;
  await tx
    .update(invitations)
    .set({ usedAt: new Date() })
    .where(and(eq(invitations.personId, person.id), isNull(invitations.usedAt)));
  await tx.insert(invitations).values({
    tokenHash: tokenHash(token),
    personId: person.id,
    createdBy,
    purpose,
    expiresAt: new Date(Date.now() + lifetimeMs),
  });
  await enqueueMail(tx, compose(`${publicUrl.replace(/\/$/, '')}${paths.setPassword.href(token)}`));
}

/** The person's mail for an admin-started reset. */
const resetMail = (person: { email: string; displayName: string }, by: string, url: string) => ({
  to: [person.email],
  subject: 'Choose a new Benchwright password',
  reason: 'password-reset',
  ...composeMail({
    greeting: `Hello ${person.displayName},`,
    lines: [
      `${by} started a password reset for your Benchwright account.`,
      `Choose a new password with the link below. It works once and expires in ${RESET_HOURS} hours. Until you use it, your current password keeps working.`,
      'If you did not expect this, tell an admin.',
    ],
    link: { url, label: 'Choose a new password' },
  }),
});

const view = (p: typeof people.$inferSelect): PersonView => ({
  id: p.id,
  email: p.email,
  displayName: p.displayName,
  roles: p.roles,
  active: p.active,
  hasPassword: p.passwordHash !== null,
  totp: p.totpSecret !== null,
  createdAt: p.createdAt.toISOString(),
});

/** The invitee's mail: the one-time set-password link, as text and HTML. */
const invitationMail = (
  person: { email: string; displayName: string; roles: string[] },
  invitedBy: string,
  url: string,
) => ({
  to: [person.email],
  subject: 'Your Benchwright account',
  reason: 'invitation',
  ...composeMail({
    greeting: `Hello ${person.displayName},`,
    lines: [
      `${invitedBy} has invited you to Benchwright as ${person.roles.join(', ')}.`,
      `Choose your password with the link below. It works once and expires in ${INVITE_DAYS} days.`,
    ],
    link: { url, label: 'Set your password' },
  }),
});

const idParams = z.object({ id: z.uuid('not a valid person id') });

export const peopleRoutes = [
  defineRoute({
    method: 'get',
    path: '/people',
    access: ['admin'],
    summary: 'List everyone with their roles',
    handler: async ({ deps }) => {
      const rows = await deps.db.select().from(people).orderBy(asc(people.displayName));
      return { people: rows.map(view) };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/people/invitations',
    access: ['admin'],
    summary: 'Invite a person: creates them with a one-time set-password link',
    body: inviteBody,
    handler: async ({ req, res, body, user, deps }) => {
      const created = await deps.db.transaction(async (tx) => {
        const [person] = await tx
          .insert(people)
          .values({ email: body.email, displayName: body.displayName, roles: body.roles })
          .onConflictDoNothing({ target: people.email })
          .returning();
        if (!person)
          throw conflict(`${body.email} already has an account.`, {
            fields: [{ field: 'body.email', reason: 'already has an account' }],
          });
        await mailSetPasswordLink(tx, deps.config.publicUrl, person, user!.id, 'invitation', (url) =>
          invitationMail(person, user!.displayName, url),
        );
        return person;
      });
      void deps.mailer?.flush();
      await recordAudit(deps.db, {
        action: 'person.invited',
        actorId: user!.id,
        subject: created.email,
        details: { roles: created.roles },
        req,
      });
      res.status(201);
      return { person: view(created), mailedTo: created.email, expiresInDays: INVITE_DAYS };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/people/:id/password-reset',
    access: ['admin'],
    summary: 'Mail a person a one-time link to choose a new password (the link is never shown to the admin)',
    params: idParams,
    handler: async ({ req, res, params, user, deps }) => {
      const person = await deps.db.transaction(async (tx) => {
        const [p] = await tx.select().from(people).where(eq(people.id, params.id)).for('update');
        if (!p) throw notFound('No such person.');
        if (!p.active) throw conflict(`${p.displayName} is deactivated; reactivate them first.`);
        // Someone who never chose a password gets a fresh invitation instead.
        const purpose = p.passwordHash ? 'reset' : 'invitation';
        await mailSetPasswordLink(tx, deps.config.publicUrl, p, user!.id, purpose, (url) =>
          purpose === 'reset'
            ? resetMail(p, user!.displayName, url)
            : invitationMail(p, user!.displayName, url),
        );
        return { ...p, purpose };
      });
      void deps.mailer?.flush();
      await recordAudit(deps.db, {
        action: 'person.password-reset-sent',
        actorId: user!.id,
        subject: person.email,
        details: { purpose: person.purpose },
        req,
      });
      res.status(202);
      return {
        mailedTo: person.email,
        expiresInHours: person.purpose === 'reset' ? RESET_HOURS : INVITE_DAYS * 24,
      };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/people/:id/second-factor-reset',
    access: ['admin'],
    summary: 'Turn off another person’s authenticator and recovery codes (lost phone); they set up a new one',
    params: idParams,
    handler: async ({ req, params, user, deps }) => {
      if (params.id === user!.id) {
        throw badRequest(
          'You cannot clear your own authenticator here; use your account page, or ask another admin.',
          [{ field: 'params.id', reason: 'is you' }],
        );
      }
      const person = await deps.db.transaction(async (tx) => {
        const [p] = await tx
          .update(people)
          .set({ totpSecret: null, totpPendingSecret: null, totpLastStep: null })
          .where(eq(people.id, params.id))
          .returning();
        if (!p) throw notFound('No such person.');
        await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, p.id));
        return p;
      });
      // Their sessions end: whoever holds one now must sign in again.
      const sessionsEnded = await endSessionsOf(deps.db, req, person.id);
      await recordAudit(deps.db, {
        action: 'person.second-factor-reset',
        actorId: user!.id,
        subject: person.email,
        details: { sessionsEnded },
        req,
      });
      return { person: view(person) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/settings/sign-in',
    access: ['admin'],
    summary: 'The shop’s sign-in settings',
    handler: async ({ deps }) => {
      const [row] = await deps.db.select().from(shopSettings);
      return {
        requireSecondFactor: row?.requireSecondFactor ?? false,
        updatedAt: row?.updatedAt.toISOString() ?? null,
      };
    },
  }),

  defineRoute({
    method: 'put',
    path: '/settings/sign-in',
    access: ['admin'],
    summary: 'Require authenticator codes for reviewers and admins, or not (audited)',
    body: signInSettingsBody,
    handler: async ({ req, body, user, deps }) => {
      if (body.requireSecondFactor && !user!.totp) {
        throw conflict(
          'Set up your own authenticator on your account page first, so turning this on cannot lock you out.',
        );
      }
      const from = await deps.db.transaction(async (tx) => {
        const [before] = await tx.select().from(shopSettings).for('update');
        await tx
          .insert(shopSettings)
          .values({ id: true, requireSecondFactor: body.requireSecondFactor, updatedBy: user!.id })
          .onConflictDoUpdate({
            target: shopSettings.id,
            set: {
              requireSecondFactor: body.requireSecondFactor,
              updatedBy: user!.id,
              updatedAt: sql`now()`,
            },
          });
        const was = before?.requireSecondFactor ?? false;
        if (was !== body.requireSecondFactor) {
          await recordAudit(tx, {
            action: 'settings.changed',
            actorId: user!.id,
            subject: 'sign-in',
            details: { requireSecondFactor: { from: was, to: body.requireSecondFactor } },
            req,
          });
        }
        return was;
      });
      forgetShopSettings();
      return { requireSecondFactor: body.requireSecondFactor, changed: from !== body.requireSecondFactor };
    },
  }),

  defineRoute({
    method: 'patch',
    path: '/people/:id',
    access: ['admin'],
    summary: 'Change a person’s name or roles, or deactivate / reactivate them',
    params: idParams,
    body: updatePersonBody,
    handler: async ({ req, params, body, user, deps }) => {
      if (
        params.id === user!.id &&
        (body.active === false || (body.roles && !body.roles.includes('admin')))
      ) {
        throw badRequest('You cannot remove your own admin role or deactivate yourself; ask another admin.', [
          { field: body.active === false ? 'body.active' : 'body.roles', reason: 'would lock you out' },
        ]);
      }
      const updated = await deps.db.transaction(async (tx) => {
        const [before] = await tx.select().from(people).where(eq(people.id, params.id)).for('update');
        if (!before) throw notFound('No such person.');
        const [after] = await tx
          .update(people)
          .set({
            ...(body.displayName !== undefined && { displayName: body.displayName }),
            ...(body.roles !== undefined && { roles: body.roles }),
            ...(body.active !== undefined && {
              active: body.active,
              deactivatedAt: body.active ? null : new Date(),
            }),
          })
          .where(eq(people.id, params.id))
          .returning();
        if (body.active === false) {
          // End their sessions now, not at the next request's re-check.
          await tx.delete(session).where(sql`${session.sess}->'passport'->>'user' = ${params.id}`);
        }
        return { before, after: after! };
      });
      const { before, after } = updated;
      (req.app.locals.passport as { forgetPerson(id: string): void }).forgetPerson(after.id);
      if (body.active === false) (req.app.locals.forgetSessionsOf as (id: string) => void)(after.id);
      if (body.roles && before.roles.join() !== after.roles.join()) {
        await recordAudit(deps.db, {
          action: 'person.roles-changed',
          actorId: user!.id,
          subject: after.email,
          details: { from: before.roles, to: after.roles },
          req,
        });
      }
      if (body.active !== undefined && before.active !== after.active) {
        await recordAudit(deps.db, {
          action: after.active ? 'person.reactivated' : 'person.deactivated',
          actorId: user!.id,
          subject: after.email,
          req,
        });
      }
      return { person: view(after) };
    },
  }),
];
