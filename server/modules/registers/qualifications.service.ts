import type { Request } from 'express';
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { Eligibility, GrantBody, QualificationView } from '../../../shared/schemas/registers';
import type { RunStep } from '../../../shared/schemas/runs';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, qualifications, revisions } from '../../db/schema';
import { conflict, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/** A run is live work when its revision carries a hazard note (the database's rule is the same). */
export const isLiveWork = (steps: Pick<RunStep, 'kind'>[]) => steps.some((s) => s.kind === 'hazard');

type Held = { scope: string; family: string | null };

/** The active qualifications of one person. */
export const heldBy = (db: Db | Tx, personId: string): Promise<Held[]> =>
  db
    .select({ scope: qualifications.scope, family: qualifications.family })
    .from(qualifications)
    .where(and(eq(qualifications.personId, personId), isNull(qualifications.withdrawnAt)));

/** What a person lacks to run a family's procedure (with live work or not), in words; [] when qualified. */
export function missing(held: Held[], family: string, live: boolean): string[] {
  const lacks: string[] = [];
  if (!held.some((q) => q.scope === 'family' && q.family?.toLowerCase() === family.toLowerCase()))
    lacks.push(`${family} procedures`);
  if (live && !held.some((q) => q.scope === 'live')) lacks.push('live work');
  return lacks;
}

/** People (active technicians) qualified to run, or witness, a family's procedure. */
async function qualifiedPeople(db: Db | Tx, family: string, live: boolean, except: string) {
  const rows = await db
    .select({ id: people.id, displayName: people.displayName })
    .from(people)
    .where(
      and(
        eq(people.active, true),
        sql`'technician' = any(${people.roles})`,
        sql`${people.id} <> ${except}`,
        sql`public.benchwright_qualified(${people.id}, ${family}, ${live})`,
      ),
    )
    .orderBy(asc(people.displayName));
  return rows;
}

/**
 * May this person run this revision alone? If not, the reason in words and who could witness.
 * The start of a run, the database trigger and the start-run form all follow this rule.
 */
export async function eligibility(
  db: Db | Tx,
  personId: string,
  revision: { equipmentFamily: string; steps: Pick<RunStep, 'kind'>[] },
): Promise<Eligibility> {
  const live = isLiveWork(revision.steps);
  const lacks = missing(await heldBy(db, personId), revision.equipmentFamily, live);
  return {
    family: revision.equipmentFamily,
    liveWork: live,
    refusal: lacks.length
      ? `You are not qualified for ${lacks.join(' or ')}; a run of this procedure needs a qualified witness who co-signs it.`
      : null,
    witnesses: lacks.length ? await qualifiedPeople(db, revision.equipmentFamily, live, personId) : [],
  };
}

/** The witness named for a run: someone else, active and qualified for it; a 400 naming why not. */
export async function checkWitness(
  db: Db | Tx,
  performerId: string,
  witnessId: string,
  family: string,
  live: boolean,
) {
  const refuseWitness = (reason: string) =>
    refuse({ field: 'body.witnessId', label: 'Witness', reason: reason[0]!.toUpperCase() + reason.slice(1) });
  if (witnessId === performerId) throw refuseWitness('the witness must be someone other than you');
  const [w] = await db.select().from(people).where(eq(people.id, witnessId));
  if (!w?.active) throw refuseWitness('no such active person');
  const lacks = missing(await heldBy(db, witnessId), family, live);
  if (lacks.length) throw refuseWitness(`${w.displayName} is not qualified for ${lacks.join(' or ')}`);
  return w;
}

export async function listQualifications(db: Db, all: boolean): Promise<QualificationView[]> {
  const rows = await db
    .select()
    .from(qualifications)
    .innerJoin(people, eq(people.id, qualifications.personId))
    .where(all ? undefined : isNull(qualifications.withdrawnAt))
    .orderBy(asc(people.displayName), asc(qualifications.scope), asc(qualifications.family));
  const staff = new Map(
    (await db.select({ id: people.id, displayName: people.displayName }).from(people)).map((p) => [p.id, p]),
  );
  const who = (id: string) => staff.get(id) ?? { id, displayName: 'unknown' };
  return rows.map(({ qualifications: q, people: p }) => ({
    id: q.id,
    person: { id: p.id, displayName: p.displayName },
    scope: q.scope,
    family: q.family,
    note: q.note,
    grantedBy: who(q.grantedBy),
    grantedAt: q.grantedAt.toISOString(),
    withdrawn:
      q.withdrawnAt && q.withdrawnBy
        ? { by: who(q.withdrawnBy), at: q.withdrawnAt.toISOString(), reason: q.withdrawReason ?? '' }
        : null,
  }));
}

/** The procedure families the shop's procedures name, for the grant form. */
export const procedureFamilies = async (db: Db) =>
  (
    await db
      .selectDistinct({ family: revisions.equipmentFamily })
      .from(revisions)
      .orderBy(asc(revisions.equipmentFamily))
  ).map((r) => r.family);

const words = (scope: string, family: string | null) =>
  scope === 'live' ? 'live work' : `${family} procedures`;

export async function grantQualification(db: Db | Tx, user: SessionUser, body: GrantBody, req?: Request) {
  return db.transaction(async (tx) => {
    const [person] = await tx.select().from(people).where(eq(people.id, body.personId));
    if (!person?.active || !person.roles.includes('technician'))
      throw refuse({
        field: 'body.personId',
        label: 'Technician',
        reason: 'This person is not an active technician',
      });
    const family = body.scope === 'family' ? (body.family ?? '') : null;
    const held = await heldBy(tx, person.id);
    if (
      held.some(
        (q) => q.scope === body.scope && (q.family ?? '').toLowerCase() === (family ?? '').toLowerCase(),
      )
    )
      throw conflict(`${person.displayName} already holds ${words(body.scope, family)}.`);
    const [row] = await tx
      .insert(qualifications)
      .values({ personId: person.id, scope: body.scope, family, note: body.note ?? '', grantedBy: user.id })
      .returning();
    await recordAudit(tx, {
      action: 'qualification.granted',
      actorId: user.id,
      subject: person.displayName,
      details: { qualificationId: row!.id, personId: person.id, scope: body.scope, family },
      req,
    });
    return row!;
  });
}

export async function withdrawQualification(
  db: Db,
  user: SessionUser,
  id: string,
  reason: string,
  req: Request,
) {
  await db.transaction(async (tx) => {
    const [row] = await tx.select().from(qualifications).where(eq(qualifications.id, id)).for('update');
    if (!row) throw notFound('No such qualification.');
    if (row.withdrawnAt) throw conflict('This qualification was already withdrawn.');
    await tx
      .update(qualifications)
      .set({ withdrawnAt: sql`now()`, withdrawnBy: user.id, withdrawReason: reason })
      .where(eq(qualifications.id, id));
    const [person] = await tx.select().from(people).where(eq(people.id, row.personId));
    await recordAudit(tx, {
      action: 'qualification.withdrawn',
      actorId: user.id,
      subject: person?.displayName,
      details: { qualificationId: id, scope: row.scope, family: row.family, reason },
      req,
    });
  });
}
