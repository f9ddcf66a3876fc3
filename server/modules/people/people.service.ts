import { randomBytes } from 'node:crypto';
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { Request } from 'express';
import { paths } from '../../../shared/paths';
import type { InviteBody, PersonView, UpdatePersonBody } from '../../../shared/schemas/people';
import { recordAudit } from '../../audit/record';
import { endSessionsOf } from '../../auth/end-sessions';
import { forgetShopSettings } from '../../auth/second-factor';
import type { Db, Tx } from '../../db/client';
import { invitations, people, recoveryCodes, session, shopSettings, type Role } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { composeMail, enqueueMail } from '../../mail/outbox';
import { tokenHash } from '../auth/auth.service';

export const INVITE_DAYS = 7;
export const RESET_HOURS = 24;

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

export const view = (p: typeof people.$inferSelect): PersonView => ({
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

/** Adds a person unless the address already has an account (then answers undefined). */
export async function addPerson(
  db: Db | Tx,
  person: { email: string; displayName: string; roles: Role[]; passwordHash?: string },
) {
  const [row] = await db
    .insert(people)
    .values(person)
    .onConflictDoNothing({ target: people.email })
    .returning();
  return row;
}

export const listPeople = async (db: Db) =>
  (await db.select().from(people).orderBy(asc(people.displayName))).map(view);

/** Creates the person and mails them a set-password link (audited); 409 when the address has an account. */
export async function invitePerson(deps: AppDeps, admin: SessionUser, body: InviteBody, req: Request) {
  const created = await deps.db.transaction(async (tx) => {
    const person = await addPerson(tx, {
      email: body.email,
      displayName: body.displayName,
      roles: body.roles,
    });
    if (!person)
      throw conflict(`${body.email} already has an account.`, {
        fields: [{ field: 'body.email', reason: 'already has an account' }],
      });
    await mailSetPasswordLink(tx, deps.config.publicUrl, person, admin.id, 'invitation', (url) =>
      invitationMail(person, admin.displayName, url),
    );
    return person;
  });
  void deps.mailer?.flush();
  await recordAudit(deps.db, {
    action: 'person.invited',
    actorId: admin.id,
    subject: created.email,
    details: { roles: created.roles },
    req,
  });
  return created;
}

/** Mails a reset link (an invitation again to someone who never chose a password); audited. */
export async function sendPasswordReset(deps: AppDeps, admin: SessionUser, personId: string, req: Request) {
  const person = await deps.db.transaction(async (tx) => {
    const [p] = await tx.select().from(people).where(eq(people.id, personId)).for('update');
    if (!p) throw notFound('No such person.');
    if (!p.active) throw conflict(`${p.displayName} is deactivated; reactivate them first.`);
    // Someone who never chose a password gets a fresh invitation instead.
    const purpose = p.passwordHash ? 'reset' : 'invitation';
    await mailSetPasswordLink(tx, deps.config.publicUrl, p, admin.id, purpose, (url) =>
      purpose === 'reset' ? resetMail(p, admin.displayName, url) : invitationMail(p, admin.displayName, url),
    );
    return { ...p, purpose };
  });
  void deps.mailer?.flush();
  await recordAudit(deps.db, {
    action: 'person.password-reset-sent',
    actorId: admin.id,
    subject: person.email,
    details: { purpose: person.purpose },
    req,
  });
  return person;
}

/** Clears the person's authenticator and recovery codes and ends their sessions (audited). */
export async function resetSecondFactor(deps: AppDeps, admin: SessionUser, personId: string, req: Request) {
  const person = await deps.db.transaction(async (tx) => {
    const [p] = await tx
      .update(people)
      .set({ totpSecret: null, totpPendingSecret: null, totpLastStep: null })
      .where(eq(people.id, personId))
      .returning();
    if (!p) throw notFound('No such person.');
    await tx.delete(recoveryCodes).where(eq(recoveryCodes.personId, p.id));
    return p;
  });
  // Their sessions end: whoever holds one now must sign in again.
  const sessionsEnded = await endSessionsOf(deps, person.id);
  await recordAudit(deps.db, {
    action: 'person.second-factor-reset',
    actorId: admin.id,
    subject: person.email,
    details: { sessionsEnded },
    req,
  });
  return person;
}

export async function signInSettings(db: Db) {
  const [row] = await db.select().from(shopSettings);
  return row;
}

/** Sets whether the shop requires authenticator codes; a change is audited. Answers the value before. */
export async function setRequireSecondFactor(db: Db, admin: SessionUser, required: boolean, req: Request) {
  const was = await db.transaction(async (tx) => {
    const [before] = await tx.select().from(shopSettings).for('update');
    await tx
      .insert(shopSettings)
      .values({ id: true, requireSecondFactor: required, updatedBy: admin.id })
      .onConflictDoUpdate({
        target: shopSettings.id,
        set: { requireSecondFactor: required, updatedBy: admin.id, updatedAt: sql`now()` },
      });
    const was = before?.requireSecondFactor ?? false;
    if (was !== required) {
      await recordAudit(tx, {
        action: 'settings.changed',
        actorId: admin.id,
        subject: 'sign-in',
        details: { requireSecondFactor: { from: was, to: required } },
        req,
      });
    }
    return was;
  });
  forgetShopSettings();
  return was;
}

/** Changes name, roles or active state; a deactivated person's sessions end at once. Audited. */
export async function updatePerson(
  deps: AppDeps,
  admin: SessionUser,
  personId: string,
  body: UpdatePersonBody,
  req: Request,
) {
  const { before, after } = await deps.db.transaction(async (tx) => {
    const [before] = await tx.select().from(people).where(eq(people.id, personId)).for('update');
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
      .where(eq(people.id, personId))
      .returning();
    if (body.active === false) {
      // End their sessions now, not at the next request's re-check.
      await tx.delete(session).where(sql`${session.sess}->'passport'->>'user' = ${personId}`);
    }
    return { before, after: after! };
  });
  deps.auth.passport.forgetPerson(after.id);
  if (body.active === false) deps.auth.sessions.forgetSessionsOf(after.id);
  if (body.roles && before.roles.join() !== after.roles.join()) {
    await recordAudit(deps.db, {
      action: 'person.roles-changed',
      actorId: admin.id,
      subject: after.email,
      details: { from: before.roles, to: after.roles },
      req,
    });
  }
  if (body.active !== undefined && before.active !== after.active) {
    await recordAudit(deps.db, {
      action: after.active ? 'person.reactivated' : 'person.deactivated',
      actorId: admin.id,
      subject: after.email,
      req,
    });
  }
  return after;
}
