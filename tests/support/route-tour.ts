// Every client route with a real address and each role that can open it, for the browser tests
// that look at every page (layout at each width, accessibility). Built from `paths`, so a new
// route without a visit fails the tour's own check. Besides the demo content it adds a draft with
// every kind of block (tests/support/every-kind-document.ts), a revision in review and a bench run
// in progress with a reading in band, one out of band and a ticked check step.
import { randomUUID } from 'node:crypto';
import { and, desc, eq, gt } from 'drizzle-orm';
import { paths } from '../../shared/paths';
import type { Role } from '../../shared/schemas/roles';
import { entryBody, startRunBody } from '../../shared/schemas/runs';
import { toSessionUser } from '../../server/auth/passport';
import { createDb, createPool, type Db } from '../../server/db/client';
import { attachments, people, procedures, revisions, runs, units } from '../../server/db/schema';
import { recordEntry, startRun } from '../../server/modules/runs/runs.service';
import { fileStore, NO_FILES } from '../../server/storage/files';
import { everyKindDocument } from './every-kind-document';
import { pngOf } from './png';
import { procedureInState } from './review-path';
import type { demo } from './test-app';

export type Visitor = keyof typeof demo | 'anonymous';
export interface Visit {
  route: keyof typeof paths;
  url: string;
  who: Visitor;
  /** What the visit shows, where a route is visited more than once ("draft"). */
  what?: string;
}

/** One demo person per role, each holding only that role. */
export const ROLE_VISITORS = {
  technician: 'tom',
  author: 'hal',
  reviewer: 'marek',
  admin: 'admin',
} as const satisfies Record<Role, keyof typeof demo>;
const ALL: Role[] = ['technician', 'author', 'reviewer', 'admin'];
const STAFF: Role[] = ['author', 'reviewer', 'admin'];

async function person(db: Db, who: keyof typeof demo) {
  const [p] = await db
    .select()
    .from(people)
    .where(eq(people.email, `${who}@tallowcreek.example`));
  if (!p) throw new Error(`no demo person ${who}`);
  return p;
}

/**
 * A bench run by tom on `revisionId`, in progress: hazard notes acknowledged as they come, the first
 * check step ticked, the first reading in its band and the second out of it with a note; the rest
 * left to do. Entries go through the same recordEntry the API uses.
 */
async function runInProgress(db: Db, revisionId: string, unitId: string) {
  const tom = toSessionUser(await person(db, 'tom'));
  const [revision] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
  const { run } = await startRun(
    db,
    NO_FILES,
    tom,
    startRunBody.parse({
      revisionId,
      unitId,
      mainsVoltage: revision!.params.mainsNominal,
      mainsFrequency: revision!.params.mainsFrequency,
      key: randomUUID(),
    }),
  );
  const entry = (stepId: string, body: object) =>
    recordEntry(db, tom, run.id, stepId, entryBody.parse({ key: randomUUID(), ...body }));
  let ticked = false;
  let readings = 0;
  for (const step of run.steps) {
    if (readings === 2) break;
    if (step.kind === 'hazard') await entry(step.id, { done: true });
    else if (step.kind === 'check' && !ticked) {
      await entry(step.id, { done: true });
      ticked = true;
    } else if (step.kind === 'reading' && step.reading?.expected && step.reading.high !== null) {
      const { expected, high } = step.reading;
      await entry(
        step.id,
        readings === 0
          ? { value: String(expected) }
          : { value: String(high * 1.5), note: 'Reads high; meter leads checked, same again.' },
      );
      readings++;
    }
  }
  if (!ticked || readings < 2)
    throw new Error('the approved demo revision needs a check step and two readings for the tour run');
  return run;
}

/**
 * Adds the tour's draft, revision in review and bench run to the database and lists the visits:
 * every route as each role that can open it (the first listed is the one the layout test uses).
 */
export async function routeTour(databaseUrl: string, uploadDir: string): Promise<Visit[]> {
  const pool = createPool(databaseUrl);
  const db = createDb(pool);
  try {
    const [approved] = await db
      .select({
        revisionId: revisions.id,
        procedureId: procedures.id,
        document: revisions.document,
        params: revisions.params,
      })
      .from(revisions)
      .innerJoin(procedures, eq(procedures.id, revisions.procedureId))
      .where(eq(revisions.state, 'approved'))
      .orderBy(procedures.title)
      .limit(1);
    if (!approved) throw new Error('the demo data has no approved revision');
    const hal = await person(db, 'hal');
    const png = pngOf(320, 200);
    const [picture] = await db
      .insert(attachments)
      .values({
        sha256: await fileStore(uploadDir).put(png),
        originalName: 'filter-board.png',
        mediaType: 'image/png',
        size: png.length,
        uploadedBy: hal.id,
      })
      .returning();
    const copy = (title: string, document = approved.document) => ({
      title,
      equipmentFamily: 'Tour',
      equipmentModel: 'TOUR-1',
      tags: ['tour'],
      params: approved.params,
      document,
    });
    const draft = await procedureInState(
      db,
      'draft',
      copy('Tour draft with every block kind', everyKindDocument(approved.document, picture!.id)),
    );
    const inReview = await procedureInState(db, 'in_review', copy('Tour revision in review'), {
      author: 'hal',
    });
    const [unit] = await db.select({ id: units.id }).from(units).limit(1);
    const [signed] = await db
      .select({ id: runs.id })
      .from(runs)
      .where(and(eq(runs.status, 'signed')))
      .orderBy(desc(runs.startedAt))
      .limit(1);
    if (!unit || !signed) throw new Error('the demo data needs a unit and a signed run');
    const open = await runInProgress(db, approved.revisionId, unit.id);
    const [later] = await db
      .select({ id: revisions.id })
      .from(revisions)
      .where(and(eq(revisions.state, 'approved'), gt(revisions.number, 1)))
      .limit(1);
    if (!later) throw new Error('the demo data needs a revision approved after an earlier one');

    const as = (roles: Role[], route: keyof typeof paths, url: string, what?: string): Visit[] =>
      roles.map((role) => ({ route, url, who: ROLE_VISITORS[role], ...(what ? { what } : {}) }));
    const visits: Record<keyof typeof paths, Visit[]> = {
      home: as(ALL, 'home', paths.home.href()),
      signIn: [{ route: 'signIn', url: paths.signIn.href(), who: 'anonymous' }],
      setPassword: [{ route: 'setPassword', url: paths.setPassword.href('no-such-token'), who: 'anonymous' }],
      people: as(['admin'], 'people', paths.people.href()),
      account: as(ALL, 'account', paths.account.href()),
      search: as(ALL, 'search', paths.search.href('heater supply')),
      procedures: as(ALL, 'procedures', paths.procedures.href()),
      newProcedure: as(['author'], 'newProcedure', paths.newProcedure.href()),
      procedure: as(ALL, 'procedure', paths.procedure.href(approved.procedureId)),
      revision: [
        ...as(ALL, 'revision', paths.revision.href(approved.revisionId)),
        // Staff read drafts: the reader with every kind of block.
        ...as(STAFF, 'revision', paths.revision.href(draft.revision.id), 'draft'),
      ],
      editRevision: as(['author'], 'editRevision', paths.editRevision.href(draft.revision.id)),
      reviewQueue: as(['reviewer'], 'reviewQueue', paths.reviewQueue.href()),
      reviewDue: as(['reviewer', 'admin'], 'reviewDue', paths.reviewDue.href()),
      runDecisions: as(['reviewer', 'admin'], 'runDecisions', paths.runDecisions.href()),
      // The demo's pending acknowledgement: a revision approved after its technician ran the one before.
      acknowledgeRevision: [
        { route: 'acknowledgeRevision', url: paths.acknowledgeRevision.href(later.id), who: 'priya' },
      ],
      reviewRevision: as(
        ['reviewer', 'author', 'admin'],
        'reviewRevision',
        paths.reviewRevision.href(inReview.revision.id),
      ),
      audit: as(['admin'], 'audit', paths.audit.href()),
      outbox: as(['admin'], 'outbox', paths.outbox.href()),
      apiReference: as(['admin'], 'apiReference', paths.apiReference.href()),
      units: as(ALL, 'units', paths.units.href()),
      unit: as(ALL, 'unit', paths.unit.href(unit.id)),
      runs: as(ALL, 'runs', paths.runs.href()),
      newRun: as(['technician'], 'newRun', paths.newRun.href()),
      // The performer first (entries, signing panel), then those who watch it.
      run: as(ALL, 'run', paths.run.href(open.id)),
      runSheet: as(ALL, 'runSheet', paths.runSheet.href(signed.id)),
      // Everyone reads the registers; reviewers and admins keep them (every form shown).
      instruments: as(ALL, 'instruments', paths.instruments.href()),
      qualifications: as(ALL, 'qualifications', paths.qualifications.href()),
      followUps: as(ALL, 'followUps', paths.followUps.href()),
    };
    return Object.values(visits).flat();
  } finally {
    await pool.end();
  }
}

/** One visit per address (its first visitor): for checks that look the same to every role. */
export const onePerAddress = (tour: Visit[]) =>
  tour.filter((v, i) => tour.findIndex((w) => w.url === v.url) === i);
