import { randomBytes } from 'node:crypto';
import { asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { inviteBody, updatePersonBody, type PersonView } from '../../../shared/schemas/people';
import { recordAudit } from '../../audit/record';
import { invitations, people, session } from '../../db/schema';
import { conflict, badRequest, notFound } from '../../http/errors';
import { composeMail, enqueueMail } from '../../mail/outbox';
import { defineRoute } from '../../http/route';
import { tokenHash } from '../auth/auth.routes';

const INVITE_DAYS = 7;

const view = (p: typeof people.$inferSelect): PersonView => ({
  id: p.id,
  email: p.email,
  displayName: p.displayName,
  roles: p.roles,
  active: p.active,
  hasPassword: p.passwordHash !== null,
  createdAt: p.createdAt.toISOString(),
});

/** The invitee's mail: the one-time set-password link, as text and HTML. */
const invitationMail = (person: { email: string; displayName: string; roles: string[] }, invitedBy: string, url: string) => ({
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
      const token = randomBytes(32).toString('base64url');
      const inviteUrl = `${deps.config.publicUrl}/set-password/${token}`;
      const created = await deps.db.transaction(async (tx) => {
        const [person] = await tx
          .insert(people)
          .values({ email: body.email, displayName: body.displayName, roles: body.roles })
          .onConflictDoNothing({ target: people.email })
          .returning();
        if (!person) throw conflict(`${body.email} already has an account.`, { fields: [{ field: 'body.email', reason: 'already has an account' }] });
        await tx.insert(invitations).values({
          tokenHash: tokenHash(token),
          personId: person.id,
          createdBy: user!.id,
          expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
        });
        await enqueueMail(tx, invitationMail(person, user!.displayName, inviteUrl));
        return person;
      });
      void deps.mailer?.flush();
      await recordAudit(deps.db, { action: 'person.invited', actorId: user!.id, subject: created.email, details: { roles: created.roles }, req });
      res.status(201);
      return { person: view(created), inviteUrl, expiresInDays: INVITE_DAYS };
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
      if (params.id === user!.id && (body.active === false || (body.roles && !body.roles.includes('admin')))) {
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
            ...(body.active !== undefined && { active: body.active, deactivatedAt: body.active ? null : new Date() }),
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
        await recordAudit(deps.db, { action: 'person.roles-changed', actorId: user!.id, subject: after.email, details: { from: before.roles, to: after.roles }, req });
      }
      if (body.active !== undefined && before.active !== after.active) {
        await recordAudit(deps.db, { action: after.active ? 'person.reactivated' : 'person.deactivated', actorId: user!.id, subject: after.email, req });
      }
      return { person: view(after) };
    },
  }),
];
