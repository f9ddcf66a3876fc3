// Every client route with a real address and the person who would open it, for the browser tests
// that look at every page (layout at each width, accessibility). Built from `paths`, so a new
// route without a visit fails the tour's own check.
import { and, desc, eq } from 'drizzle-orm';
import { paths } from '../../shared/paths';
import { createDb, createPool } from '../../server/db/client';
import { people, procedures, revisions, runs, units } from '../../server/db/schema';
import { procedureInState } from './review-path';
import type { demo } from './test-app';

export type Visitor = keyof typeof demo | 'anonymous';
export interface Visit {
  route: keyof typeof paths;
  url: string;
  who: Visitor;
}

/** Adds a draft and a revision in review (copies of an approved demo document) and lists the visits. */
export async function routeTour(databaseUrl: string): Promise<Visit[]> {
  const pool = createPool(databaseUrl);
  const db = createDb(pool);
  try {
    const [approved] = await db
      .select({ revisionId: revisions.id, procedureId: procedures.id, document: revisions.document })
      .from(revisions)
      .innerJoin(procedures, eq(procedures.id, revisions.procedureId))
      .where(eq(revisions.state, 'approved'))
      .orderBy(procedures.title)
      .limit(1);
    if (!approved) throw new Error('the demo data has no approved revision');
    const copy = (title: string) => ({
      title,
      equipmentFamily: 'Tour',
      equipmentModel: 'TOUR-1',
      tags: ['tour'],
      document: approved.document,
    });
    const draft = await procedureInState(db, 'draft', copy('Tour draft with every block kind'));
    const inReview = await procedureInState(db, 'in_review', copy('Tour revision in review'), {
      author: 'hal',
    });
    const [unit] = await db.select({ id: units.id }).from(units).limit(1);
    const [open] = await db
      .select({ id: runs.id, performer: people.email })
      .from(runs)
      .innerJoin(people, eq(people.id, runs.performedBy))
      .where(eq(runs.status, 'in_progress'))
      .limit(1);
    const [signed] = await db
      .select({ id: runs.id })
      .from(runs)
      .where(and(eq(runs.status, 'signed')))
      .orderBy(desc(runs.startedAt))
      .limit(1);
    if (!unit || !open || !signed)
      throw new Error('the demo data needs a unit, an open run and a signed run');
    // The open run is seen by the technician doing it, with every step still to enter.
    const performer = open.performer.split('@')[0] as Visitor;

    const visits: Record<keyof typeof paths, Visit[]> = {
      home: (['tom', 'hal', 'marek', 'admin'] as const).map((who) => ({ route: 'home', url: '/', who })),
      signIn: [{ route: 'signIn', url: paths.signIn.href(), who: 'anonymous' }],
      setPassword: [{ route: 'setPassword', url: paths.setPassword.href('no-such-token'), who: 'anonymous' }],
      people: [{ route: 'people', url: paths.people.href(), who: 'admin' }],
      account: [{ route: 'account', url: paths.account.href(), who: 'tom' }],
      search: [{ route: 'search', url: paths.search.href('heater supply'), who: 'tom' }],
      procedures: [{ route: 'procedures', url: paths.procedures.href(), who: 'hal' }],
      newProcedure: [{ route: 'newProcedure', url: paths.newProcedure.href(), who: 'hal' }],
      procedure: [{ route: 'procedure', url: paths.procedure.href(approved.procedureId), who: 'tom' }],
      revision: [{ route: 'revision', url: paths.revision.href(approved.revisionId), who: 'tom' }],
      editRevision: [{ route: 'editRevision', url: paths.editRevision.href(draft.revision.id), who: 'hal' }],
      reviewQueue: [{ route: 'reviewQueue', url: paths.reviewQueue.href(), who: 'marek' }],
      reviewRevision: [
        { route: 'reviewRevision', url: paths.reviewRevision.href(inReview.revision.id), who: 'marek' },
      ],
      audit: [{ route: 'audit', url: paths.audit.href(), who: 'admin' }],
      outbox: [{ route: 'outbox', url: paths.outbox.href(), who: 'admin' }],
      apiReference: [{ route: 'apiReference', url: paths.apiReference.href(), who: 'admin' }],
      units: [{ route: 'units', url: paths.units.href(), who: 'tom' }],
      unit: [{ route: 'unit', url: paths.unit.href(unit.id), who: 'tom' }],
      runs: [{ route: 'runs', url: paths.runs.href(), who: 'tom' }],
      newRun: [{ route: 'newRun', url: paths.newRun.href(), who: 'tom' }],
      run: [{ route: 'run', url: paths.run.href(open.id), who: performer }],
      runSheet: [{ route: 'runSheet', url: paths.runSheet.href(signed.id), who: 'tom' }],
      // Seen by a reviewer, who keeps the registers (every form shown), and by a technician.
      instruments: (['marek', 'tom'] as const).map((who) => ({
        route: 'instruments',
        url: paths.instruments.href(),
        who,
      })),
      qualifications: [{ route: 'qualifications', url: paths.qualifications.href(), who: 'marek' }],
    };
    return Object.values(visits).flat();
  } finally {
    await pool.end();
  }
}
