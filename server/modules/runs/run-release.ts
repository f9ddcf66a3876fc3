/**
 * The second signature on a run sheet: "checked and released", by a reviewer or a technician
 * qualified for the run, never its performer, over the content hash the performed signature covers.
 * The unit's state becomes "released". drizzle/0024 guards the same rules.
 */
import type { Request } from 'express';
import { eq } from 'drizzle-orm';
import type { RunReleaseView } from '../../../shared/schemas/follow-ups';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, revisions, runReleases, runs, units } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, HttpError, notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { followUpBarsRelease, followUpsOfRun } from '../follow-ups/follow-ups.service';
import { heldBy, isLiveWork, missing } from '../registers/qualifications.service';
import { confirmSignerPassword } from '../review/reauth';
import { writeUnitState } from '../units/unit-state';
import type { RunRow } from './runs.service';

/** Why this person may not release this run now (null: they may), and the capacity they sign in. */
async function releaseRefusal(db: Db | Tx, user: SessionUser, run: RunRow) {
  if (run.status !== 'signed')
    return conflict('This run is not signed as performed yet; it is released only after that signature.', {
      code: 'not-performed',
    });
  const [released] = await db.select().from(runReleases).where(eq(runReleases.runId, run.id));
  if (released) return conflict('This run is already released.', { code: 'already-released' });
  if (user.id === run.performedBy)
    return new HttpError(403, 'You performed this run; someone else checks and releases it.', {
      code: 'performer-cannot-release',
    });
  if (!user.roles.includes('reviewer')) {
    const [rev] = await db
      .select({ family: revisions.equipmentFamily })
      .from(revisions)
      .where(eq(revisions.id, run.revisionId));
    const lacks = missing(await heldBy(db, user.id), rev!.family, isLiveWork(run.steps));
    if (lacks.length)
      return new HttpError(
        403,
        `You are not qualified for ${lacks.join(' or ')}; a reviewer or a qualified technician releases this run.`,
        { code: 'not-qualified' },
      );
  }
  const bar = await followUpBarsRelease(db, run.id);
  if (bar) return conflict(bar, { code: 'follow-up-open' });
  return null;
}

/** The API's release: every refusal said before the password is asked for, then again under the lock. */
export async function releaseRun(
  deps: AppDeps,
  user: SessionUser,
  runId: string,
  password: string,
  req: Request,
) {
  const [run] = await deps.db.select().from(runs).where(eq(runs.id, runId));
  if (!run) throw notFound('No such bench run.');
  const refusal = await releaseRefusal(deps.db, user, run);
  if (refusal) throw refusal;
  await confirmSignerPassword(deps.db, user, password, req, `run ${runId}`);
  await deps.db.transaction((tx) =>
    writeRunRelease(tx, user, runId, { requestId: String(req.id ?? ''), req }),
  );
}

/** Writes the release in the caller's transaction (demo content dates it with `signedAt`). */
export async function writeRunRelease(
  tx: Tx,
  user: SessionUser,
  runId: string,
  how: { requestId: string; signedAt?: Date; req?: Request },
) {
  const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
  if (!run) throw notFound('No such bench run.');
  const refusal = await releaseRefusal(tx, user, run);
  if (refusal) throw refusal;
  const [person] = await tx.select({ name: people.displayName }).from(people).where(eq(people.id, user.id));
  await tx.insert(runReleases).values({
    runId,
    signerId: user.id,
    signerName: person?.name ?? user.displayName,
    signerRole: user.roles.includes('reviewer') ? 'reviewer' : 'technician',
    contentHash: run.contentHash!,
    requestId: how.requestId,
    ...(how.signedAt && { signedAt: how.signedAt }),
  });
  await writeUnitState(tx, user, run.unitId, { state: 'released', runId, at: how.signedAt });
  const [unit] = await tx.select().from(units).where(eq(units.id, run.unitId));
  await recordAudit(tx, {
    action: 'run.released',
    actorId: user.id,
    subject: `run ${runId}`,
    details: { contentHash: run.contentHash, unit: `${unit!.model} ${unit!.serial}` },
    req: how.req,
  });
}

/** The run's release signature, if any, and whether it covers the hash the run was signed with. */
export async function releaseOf(db: Db | Tx, run: RunRow): Promise<RunReleaseView | null> {
  const [r] = await db.select().from(runReleases).where(eq(runReleases.runId, run.id));
  return r
    ? {
        signer: { id: r.signerId, displayName: r.signerName },
        signerRole: r.signerRole,
        meaning: 'released',
        signedAt: r.signedAt.toISOString(),
        contentHash: r.contentHash,
        matchesRun: r.contentHash === run.contentHash,
      }
    : null;
}

/** What the run view adds for the release and the follow-ups (the run's own, and those it closed). */
export async function releaseAndFollowUps(db: Db | Tx, run: RunRow) {
  if (run.status !== 'signed') return { release: null, followUp: null, closesFollowUps: [] };
  const [release, follow] = await Promise.all([releaseOf(db, run), followUpsOfRun(db, run.id)]);
  return { release, ...follow };
}
