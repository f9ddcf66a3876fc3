/**
 * Non-conformance follow-ups: a signed run with out-of-band readings opens one in its signing
 * transaction; a later in-band signed run of the same procedure on the same unit closes it in its own
 * signing transaction; otherwise only a disposition closes it (a reviewer's accepted reason, or
 * return unrepaired). drizzle/0024 guards the same rules.
 */
import type { Request } from 'express';
import { and, asc, desc, eq, inArray, isNotNull, isNull, ne, sql, type SQL } from 'drizzle-orm';
import { paths } from '../../../shared/paths';
import {
  DISPOSITION_WORDS,
  type DispositionBody,
  type FollowUpView,
} from '../../../shared/schemas/follow-ups';
import { formatQuantity } from '../../../shared/units/format';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { followUps, people, runEntries, runs, units } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, HttpError, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { composeMail, enqueueMail } from '../../mail/outbox';
import type { RunRow } from '../runs/runs.service';
import { writeUnitState } from '../units/unit-state';

type FollowUpRow = typeof followUps.$inferSelect;
type EntryRow = typeof runEntries.$inferSelect;

const unitWords = (u: { model: string; serial: string }) => `${u.model} ${u.serial}`;

/**
 * Called in the transaction that signs a run as performed, after the run row became signed: the unit
 * goes on the bench; out-of-band readings open a follow-up owned by the performer; a run with none
 * closes the open follow-ups of the same procedure on the same unit. Returns the follow-up opened.
 */
export async function followUpOnSign(
  tx: Tx,
  run: RunRow,
  entries: EntryRow[],
  signer: SessionUser,
  at?: Date,
): Promise<FollowUpRow | null> {
  await writeUnitState(tx, signer, run.unitId, { state: 'on_bench', runId: run.id, at });
  const [unit] = await tx.select().from(units).where(eq(units.id, run.unitId));
  const subject = unitWords(unit!);
  const out = entries.filter((e) => e.within === false);
  if (out.length) {
    const [row] = await tx
      .insert(followUps)
      .values({
        runId: run.id,
        unitId: run.unitId,
        procedureId: run.procedureId,
        entryIds: out.map((e) => e.id),
        ownerId: run.performedBy,
        ...(at && { openedAt: at }),
      })
      .returning();
    await recordAudit(tx, {
      action: 'follow-up.opened',
      actorId: signer.id,
      subject,
      details: { followUpId: row!.id, runId: run.id, readings: out.map((e) => e.stepId) },
    });
    return row!;
  }
  const open = await tx
    .select()
    .from(followUps)
    .where(
      and(
        isNull(followUps.closedAt),
        eq(followUps.unitId, run.unitId),
        eq(followUps.procedureId, run.procedureId),
        ne(followUps.runId, run.id),
      ),
    )
    .for('update');
  for (const f of open) {
    await tx
      .update(followUps)
      .set({
        closingRunId: run.id,
        closedBy: signer.id,
        closedAt: at ?? sql`now()`,
        // A passing re-run is the repair's proof, whatever was (or was not) decided before.
        disposition: 'repair',
        dispositionBy: f.dispositionBy ?? signer.id,
        dispositionAt: f.dispositionAt ?? at ?? sql`now()`,
      })
      .where(eq(followUps.id, f.id));
    await recordAudit(tx, {
      action: 'follow-up.closed',
      actorId: signer.id,
      subject,
      details: { followUpId: f.id, closingRunId: run.id, how: 'in-band re-run' },
    });
  }
  return null;
}

/** Mails the owner of a follow-up just opened (through the outbox, in the signing transaction). */
export async function queueFollowUpMail(
  tx: Tx,
  deps: AppDeps,
  followUp: FollowUpRow,
  run: RunRow,
  entries: EntryRow[],
) {
  const [owner] = await tx.select().from(people).where(eq(people.id, followUp.ownerId));
  const [unit] = await tx.select().from(units).where(eq(units.id, run.unitId));
  if (!owner?.active) return;
  const lines = entries
    .filter((e) => followUp.entryIds.includes(e.id))
    .map((e) => {
      const step = run.steps.find((s) => s.id === e.stepId);
      const band =
        e.low !== null && e.high !== null
          ? `${formatQuantity(e.low, e.unit ?? '')} … ${formatQuantity(e.high, e.unit ?? '')}`
          : 'no band';
      return `• ${step?.text ?? e.stepId}: measured ${e.raw ?? ''}, band ${band}.`;
    });
  const { text, html } = composeMail({
    greeting: `Hello ${owner.displayName},`,
    lines: [
      `A follow-up is open in your name for ${unitWords(unit!)} after the bench run of “${run.title}” (revision ${run.revisionNumber}), for these out-of-band readings:`,
      ...lines,
      'Record a disposition: repair and re-run, return unrepaired, or ask a reviewer to accept the readings with a reason.',
    ],
    link: {
      url: new URL(paths.followUps.href(), deps.config.publicUrl).toString(),
      label: 'Open follow-ups',
    },
  });
  await enqueueMail(tx, {
    to: [owner.email],
    subject: `Follow-up open: ${unitWords(unit!)}, ${run.title}`.slice(0, 200),
    text,
    html,
    reason: 'follow-up-opened',
  });
}

/** Follow-ups as people read them: the readings concerned, owner, disposition and closure. */
async function views(db: Db | Tx, rows: FollowUpRow[]): Promise<FollowUpView[]> {
  if (!rows.length) return [];
  const runIds = [...new Set(rows.flatMap((r) => [r.runId, ...(r.closingRunId ? [r.closingRunId] : [])]))];
  const [runRows, unitRows, entryRows] = await Promise.all([
    db
      .select({ id: runs.id, title: runs.title, signedAt: runs.signedAt, steps: runs.steps })
      .from(runs)
      .where(inArray(runs.id, runIds)),
    db
      .select({ id: units.id, model: units.model, serial: units.serial })
      .from(units)
      .where(
        inArray(
          units.id,
          rows.map((r) => r.unitId),
        ),
      ),
    db
      .select()
      .from(runEntries)
      .where(
        inArray(
          runEntries.id,
          rows.flatMap((r) => r.entryIds),
        ),
      ),
  ]);
  const personIds = [
    ...new Set(rows.flatMap((r) => [r.ownerId, r.dispositionBy, r.closedBy].filter((x) => x !== null))),
  ];
  const names = new Map(
    (
      await db
        .select({ id: people.id, displayName: people.displayName })
        .from(people)
        .where(inArray(people.id, personIds))
    ).map((p) => [p.id, p]),
  );
  const who = (id: string) => names.get(id) ?? { id, displayName: 'unknown' };
  const runOf = (id: string) => {
    const r = runRows.find((x) => x.id === id)!;
    return { id: r.id, title: r.title, signedAt: r.signedAt?.toISOString() ?? null };
  };
  return rows.map((f) => {
    const steps = runRows.find((x) => x.id === f.runId)!.steps;
    return {
      id: f.id,
      run: runOf(f.runId),
      unit: unitRows.find((u) => u.id === f.unitId)!,
      readings: f.entryIds.map((id) => {
        const e = entryRows.find((x) => x.id === id)!;
        const step = steps.find((s) => s.id === e.stepId);
        return {
          entryId: id,
          stepId: e.stepId,
          label: step?.text ?? e.stepId,
          band: step?.reading?.bandText ?? null,
          raw: e.raw,
          measured: e.measured,
          unit: e.unit,
          low: e.low,
          high: e.high,
        };
      }),
      owner: who(f.ownerId),
      disposition:
        f.disposition && f.dispositionBy && f.dispositionAt
          ? {
              value: f.disposition,
              reason: f.dispositionReason,
              by: who(f.dispositionBy),
              at: f.dispositionAt.toISOString(),
            }
          : null,
      closed:
        f.closedAt && f.closedBy
          ? {
              at: f.closedAt.toISOString(),
              by: who(f.closedBy),
              run: f.closingRunId ? runOf(f.closingRunId) : null,
            }
          : null,
      openedAt: f.openedAt.toISOString(),
    };
  });
}

/** Open follow-ups first (oldest first), then closed ones (newest first). */
export async function listFollowUps(
  db: Db | Tx,
  filter: { status?: 'open' | 'closed' | 'all'; ownerId?: string; unitId?: string },
) {
  const where: SQL[] = [];
  if (filter.status === 'open') where.push(isNull(followUps.closedAt));
  if (filter.status === 'closed') where.push(isNotNull(followUps.closedAt));
  if (filter.ownerId) where.push(eq(followUps.ownerId, filter.ownerId));
  if (filter.unitId) where.push(eq(followUps.unitId, filter.unitId));
  const rows = await db
    .select()
    .from(followUps)
    .where(where.length ? and(...where) : undefined)
    .orderBy(
      sql`${followUps.closedAt} is not null`,
      asc(sql`case when ${followUps.closedAt} is null then ${followUps.openedAt} end`),
      desc(followUps.closedAt),
    )
    .limit(500);
  return views(db, rows);
}

/** The follow-up a run opened, and those it closed as a passing re-run. */
export async function followUpsOfRun(db: Db | Tx, runId: string) {
  const [opened] = await views(db, await db.select().from(followUps).where(eq(followUps.runId, runId)));
  const closes = await views(db, await db.select().from(followUps).where(eq(followUps.closingRunId, runId)));
  return { followUp: opened ?? null, closesFollowUps: closes };
}

async function lockOpen(tx: Tx, id: string) {
  const [row] = await tx.select().from(followUps).where(eq(followUps.id, id)).for('update');
  if (!row) throw notFound('No such follow-up.');
  if (row.closedAt)
    throw conflict('This follow-up is closed; a closed follow-up cannot be changed or reopened.', {
      code: 'follow-up-closed',
    });
  const [unit] = await tx.select().from(units).where(eq(units.id, row.unitId));
  return { row, subject: unitWords(unit!) };
}

/**
 * Records a disposition: repair and re-run (the owner, a reviewer or an admin; stays open until a
 * passing re-run), accept with a reason (a reviewer; closes it), or return unrepaired with a reason
 * (the owner, a reviewer or an admin; closes it and records the unit as returned).
 */
export async function decideFollowUp(
  db: Db | Tx,
  user: SessionUser,
  id: string,
  body: DispositionBody,
  how: { req?: Request; at?: Date },
) {
  const when = how.at ?? sql`now()`;
  return db.transaction(async (tx) => {
    const { row, subject } = await lockOpen(tx, id);
    const reviewer = user.roles.includes('reviewer');
    if (body.disposition === 'accept' && !reviewer)
      throw new HttpError(403, 'Only a reviewer accepts out-of-band readings, with a reason.', {
        code: 'reviewer-required',
      });
    if (
      body.disposition !== 'accept' &&
      !reviewer &&
      !user.roles.includes('admin') &&
      row.ownerId !== user.id
    )
      throw new HttpError(
        403,
        'Only the follow-up’s owner, a reviewer or an admin records this disposition.',
        { code: 'not-the-owner' },
      );
    const closes = body.disposition !== 'repair';
    if (body.disposition === 'return')
      await writeUnitState(tx, user, row.unitId, {
        state: 'returned',
        reason: `Returned unrepaired: ${body.reason}`,
        at: how.at,
      });
    await tx
      .update(followUps)
      .set({
        disposition: body.disposition,
        dispositionReason: body.reason || null,
        dispositionBy: user.id,
        dispositionAt: when,
        ...(closes && { closedAt: when, closedBy: user.id }),
      })
      .where(eq(followUps.id, id));
    await recordAudit(tx, {
      action: closes ? 'follow-up.closed' : 'follow-up.decided',
      actorId: user.id,
      subject,
      details: {
        followUpId: id,
        disposition: body.disposition,
        words: DISPOSITION_WORDS[body.disposition],
        reason: body.reason ?? null,
      },
      req: how.req,
    });
    const [view] = await views(tx, [(await tx.select().from(followUps).where(eq(followUps.id, id)))[0]!]);
    return view!;
  });
}

/** A reviewer or an admin gives an open follow-up to another active technician or reviewer. */
export async function reassignFollowUp(db: Db, user: SessionUser, id: string, ownerId: string, req: Request) {
  return db.transaction(async (tx) => {
    const { row, subject } = await lockOpen(tx, id);
    const [owner] = await tx.select().from(people).where(eq(people.id, ownerId));
    if (!owner?.active || !owner.roles.some((r) => r === 'technician' || r === 'reviewer'))
      throw refuse({
        field: 'body.ownerId',
        label: 'Owner',
        reason: 'The owner must be an active technician or reviewer',
      });
    await tx.update(followUps).set({ ownerId }).where(eq(followUps.id, id));
    await recordAudit(tx, {
      action: 'follow-up.reassigned',
      actorId: user.id,
      subject,
      details: { followUpId: id, from: row.ownerId, to: ownerId },
      req,
    });
    const [view] = await views(tx, [(await tx.select().from(followUps).where(eq(followUps.id, id)))[0]!]);
    return view!;
  });
}

/** Whether a run may be released as far as its follow-up goes, and if not, why (the trigger holds the same). */
export async function followUpBarsRelease(db: Db | Tx, runId: string): Promise<string | null> {
  const [f] = await db.select().from(followUps).where(eq(followUps.runId, runId));
  if (!f) return null;
  if (!f.closedAt)
    return 'This run has an open follow-up for its out-of-band readings; it is released only once a reviewer accepts them with a reason (after a repair, release the passing re-run instead).';
  if (f.closingRunId)
    return 'This run’s follow-up was closed by a later passing run; release that run instead.';
  if (f.disposition === 'return')
    return 'The unit was returned unrepaired after this run; it is not released.';
  return null;
}
