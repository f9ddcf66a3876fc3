/**
 * The home page: what waits for the signed-in person, in one answer. Each section belongs to a role
 * and holds only the person's own work (their runs, drafts, acknowledgements, witness duties), or the
 * shop's shared lists their role keeps (the review queue, reviews due, instruments falling due).
 */
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import {
  HOME_ITEMS_SHOWN,
  INSTRUMENT_DUE_SOON_DAYS,
  type HomeItem,
  type HomeSection,
  type HomeSectionKey,
  type HomeView,
} from '../../../shared/schemas/home';
import { paths } from '../../../shared/paths';
import type { Role } from '../../../shared/schemas/roles';
import type { Db } from '../../db/client';
import { instruments, revisions, runReleases, runs, units } from '../../db/schema';
import type { SessionUser } from '../../http/route';
import type { FileStore } from '../../storage/files';
import { dueReviews } from '../review-due/review-due.service';
import { loadRunView } from '../runs/run-view';
import { awaitingDecisions } from '../runs/run-decisions';
import { reviewQueue } from '../review/review-view';
import { listFollowUps } from '../follow-ups/follow-ups.service';

type Items = Omit<HomeItem, 'urgent'> & { urgent?: boolean };
/** The shop's review interval, and the file store (a co-signature covers the run's photos' bytes). */
type Context = { months: number; files: FileStore };

/** One row per section: who sees it, its words and where its whole list lives, and how its items are found. */
const SECTIONS: Record<
  HomeSectionKey,
  {
    roles: Role[];
    title: string;
    href: string;
    linkLabel: string;
    items: (db: Db, user: SessionUser, ctx: Context) => Promise<Items[]>;
  }
> = {
  runs: {
    roles: ['technician'],
    title: 'My bench runs in progress',
    href: paths.runs.href(),
    linkLabel: 'All bench runs',
    items: async (db, user) => {
      const rows = await db
        .select({
          id: runs.id,
          title: runs.title,
          number: runs.revisionNumber,
          model: units.model,
          serial: units.serial,
          state: revisions.state,
        })
        .from(runs)
        .innerJoin(units, eq(units.id, runs.unitId))
        .innerJoin(revisions, eq(revisions.id, runs.revisionId))
        .where(and(eq(runs.performedBy, user.id), eq(runs.status, 'in_progress')))
        .orderBy(desc(runs.startedAt));
      return rows.map((r) => ({
        id: r.id,
        label: `${r.model} ${r.serial}`,
        detail: `${r.title}, revision ${r.number}${RUN_REVISION_NOTE[r.state] ?? ''}`,
        href: paths.run.href(r.id),
        urgent: r.state === 'withdrawn',
      }));
    },
  },
  witness: {
    roles: ['technician'],
    title: 'Runs I witness, to co-sign',
    href: paths.runs.href(),
    linkLabel: 'All bench runs',
    // Open runs naming me as witness, unless my co-signature covers the run as it stands now
    // (decided as the run page decides it, so a later entry brings the run back here).
    items: async (db, user, { files }) => {
      const rows = await db
        .select({ id: runs.id })
        .from(runs)
        .where(and(eq(runs.witnessId, user.id), eq(runs.status, 'in_progress')))
        .orderBy(asc(runs.startedAt));
      const views = await Promise.all(rows.map((r) => loadRunView(db, files, r.id)));
      return views
        .filter((v) => !v.hold && !v.witness?.signature?.current)
        .map((v) => ({
          id: v.id,
          label: `${v.unit.model} ${v.unit.serial}`,
          detail: `${v.title}, performed by ${v.performedBy.displayName}${v.witness?.signature ? ' (changed since your co-signature)' : ''}`,
          href: paths.run.href(v.id),
        }));
    },
  },
  decisions: {
    roles: ['reviewer', 'admin'],
    title: 'Holds and deviations to decide',
    href: paths.runDecisions.href(),
    linkLabel: 'All holds and deviations waiting',
    items: async (db, user) =>
      (await awaitingDecisions(db, user)).map((a) => ({
        id: a.id,
        label: `${a.unit.model} ${a.unit.serial}: ${a.kind === 'hold' ? 'hold point' : 'deviation'} at step ${a.step.position}`,
        detail: `${a.runTitle}, ${a.performedBy.displayName}. ${a.detail}`,
        href: paths.run.href(a.runId),
        urgent: a.kind === 'hold',
      })),
  },
  acknowledgements: {
    roles: ['technician'],
    title: 'New revisions to read before my next run',
    href: paths.procedures.href(),
    linkLabel: 'Approved procedures',
    // As acknowledgements.service decides it: ran an earlier revision, not this one, not acknowledged.
    items: async (db, user) => {
      const rows = await db
        .select({ id: revisions.id, title: revisions.title, number: revisions.number })
        .from(revisions)
        .where(
          and(
            eq(revisions.state, 'approved'),
            sql`exists (select 1 from runs x where x.procedure_id = ${revisions.procedureId}
                  and x.revision_number < ${revisions.number}
                  and (x.performed_by = ${user.id} or x.started_by = ${user.id}))`,
            sql`not exists (select 1 from runs x where x.revision_id = ${revisions.id}
                  and (x.performed_by = ${user.id} or x.started_by = ${user.id}))`,
            sql`not exists (select 1 from revision_acknowledgements a
                  where a.revision_id = ${revisions.id} and a.person_id = ${user.id})`,
          ),
        )
        .orderBy(asc(revisions.decidedAt));
      return rows.map((r) => ({
        id: r.id,
        label: r.title,
        detail: `Revision ${r.number}: read what changed`,
        href: paths.acknowledgeRevision.href(r.id),
      }));
    },
  },
  reviews: {
    roles: ['reviewer'],
    title: 'Revisions waiting for my review',
    href: paths.reviewQueue.href(),
    linkLabel: 'Review queue',
    items: async (db, user) =>
      (await reviewQueue(db, user))
        .filter((q) => !q.ownWork)
        .map((q) => ({
          id: q.revisionId,
          label: q.title,
          detail: `Revision ${q.number} by ${q.author.displayName}`,
          href: paths.reviewRevision.href(q.revisionId),
        })),
  },
  drafts: {
    roles: ['author'],
    title: 'My drafts and returned revisions',
    href: paths.procedures.href(),
    linkLabel: 'Procedures and drafts',
    items: async (db, user) => {
      const rows = await db
        .select({
          id: revisions.id,
          title: revisions.title,
          number: revisions.number,
          state: revisions.state,
        })
        .from(revisions)
        .where(and(eq(revisions.authorId, user.id), inArray(revisions.state, ['draft', 'returned'])))
        .orderBy(desc(revisions.updatedAt));
      return rows.map((r) => ({
        id: r.id,
        label: r.title,
        detail: `Revision ${r.number}, ${r.state === 'returned' ? 'returned by the reviewer' : 'draft'}`,
        href: r.state === 'draft' ? paths.editRevision.href(r.id) : paths.revision.href(r.id),
        urgent: r.state === 'returned',
      }));
    },
  },
  reviewDue: {
    roles: ['reviewer'],
    title: 'Procedures due for periodic review',
    href: paths.reviewDue.href(),
    linkLabel: 'Reviews due',
    items: async (db, _user, { months }) =>
      (await dueReviews(db, months)).map((d) => ({
        id: d.revisionId,
        label: d.title,
        detail: `Revision ${d.number}, ${d.status === 'overdue' ? 'overdue since' : 'due on'} ${d.dueAt.slice(0, 10)}`,
        href: paths.revision.href(d.revisionId),
        urgent: d.status === 'overdue',
      })),
  },
  instruments: {
    roles: ['technician', 'reviewer', 'admin'],
    title: 'Instruments due for calibration',
    href: paths.instruments.href(),
    linkLabel: 'Instrument register',
    items: async (db) => {
      const rows = await db
        .select({
          id: instruments.id,
          identifier: instruments.identifier,
          description: instruments.description,
          due: instruments.calibrationDue,
          overdue: sql<boolean>`${instruments.calibrationDue} < current_date`,
        })
        .from(instruments)
        .where(sql`${instruments.calibrationDue} <= current_date + ${INSTRUMENT_DUE_SOON_DAYS}::int`)
        .orderBy(asc(instruments.calibrationDue), asc(instruments.identifier));
      return rows.map((r) => ({
        id: r.id,
        label: r.identifier,
        detail: `${r.overdue ? 'Overdue since' : 'Due on'} ${r.due}: ${r.description}`,
        href: paths.instruments.href(),
        urgent: r.overdue,
      }));
    },
  },
  followUps: {
    roles: ['technician', 'reviewer', 'admin'],
    title: 'Open follow-ups',
    href: paths.followUps.href(),
    linkLabel: 'All follow-ups',
    // Reviewers and admins keep the shop's list; a technician sees the ones they own.
    items: async (db, user) =>
      (
        await listFollowUps(db, {
          status: 'open',
          ownerId: user.roles.some((r) => r === 'reviewer' || r === 'admin') ? undefined : user.id,
        })
      ).map((f) => ({
        id: f.id,
        label: `${f.unit.model} ${f.unit.serial}`,
        detail: `${f.readings.length} reading${f.readings.length === 1 ? '' : 's'} out of band, ${f.disposition ? 'repair and re-run' : 'no disposition yet'}; owner ${f.owner.displayName}`,
        href: paths.followUps.href(),
        urgent: !f.disposition,
      })),
  },
  releases: {
    roles: ['reviewer'],
    title: 'Signed runs to check and release',
    href: paths.runs.href(),
    linkLabel: 'All bench runs',
    // Signed, not released, and no follow-up in the way (none, or closed by a reviewer's acceptance).
    items: async (db) => {
      const rows = await db
        .select({ id: runs.id, title: runs.title, model: units.model, serial: units.serial })
        .from(runs)
        .innerJoin(units, eq(units.id, runs.unitId))
        .where(
          and(
            eq(runs.status, 'signed'),
            sql`not exists (select 1 from ${runReleases} x where x.run_id = ${runs.id})`,
            sql`not exists (select 1 from follow_ups f where f.run_id = ${runs.id}
                  and not (f.closed_at is not null and f.closing_run_id is null and f.disposition = 'accept'))`,
          ),
        )
        .orderBy(asc(runs.signedAt));
      return rows.map((r) => ({
        id: r.id,
        label: `${r.model} ${r.serial}`,
        detail: r.title,
        href: paths.run.href(r.id),
      }));
    },
  },
};

/** Words after a run's revision when it is no longer the current one. */
const RUN_REVISION_NOTE: Partial<Record<string, string>> = {
  superseded: ' (a newer revision is approved)',
  withdrawn: ' (withdrawn: on hold)',
};

export async function homeView(db: Db, user: SessionUser, ctx: Context): Promise<HomeView> {
  const keys = (Object.keys(SECTIONS) as HomeSectionKey[]).filter((k) =>
    SECTIONS[k].roles.some((r) => user.roles.includes(r)),
  );
  const sections = await Promise.all(
    keys.map(async (key): Promise<HomeSection> => {
      const { roles: _roles, items, ...words } = SECTIONS[key];
      const all = await items(db, user, ctx);
      return {
        key,
        ...words,
        count: all.length,
        items: all.slice(0, HOME_ITEMS_SHOWN).map((i) => ({ urgent: false, ...i })),
      };
    }),
  );
  return { sections };
}
