import { and, asc, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import type {
  TrendView,
  unitBody,
  UnitListItem,
  UnitRunSummary,
  UnitView,
  updateUnitBody,
} from '../../../shared/schemas/units';
import type { Db } from '../../db/client';
import { people, revisions, runEntries, runs, unitPhotos, units } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, notFound } from '../../http/errors';
import { storePhoto } from '../runs/photo-upload';

type UnitRow = typeof units.$inferSelect;

export function unitView(row: UnitRow, createdBy: { id: string; displayName: string }): UnitView {
  return {
    id: row.id,
    model: row.model,
    serial: row.serial,
    owner: row.owner,
    jobNumber: row.jobNumber,
    notes: row.notes,
    lockVersion: row.lockVersion,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    createdBy,
  };
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** The register: search over model, serial, owner, job number and notes; filter by model and run state. */
export async function listUnits(
  db: Db,
  filter: { q?: string; model?: string; state?: 'open-run' | 'out' | 'never-run' },
) {
  const where: SQL[] = [];
  if (filter.q) {
    const like = `%${escapeLike(filter.q)}%`;
    where.push(
      or(
        ilike(units.model, like),
        ilike(units.serial, like),
        ilike(units.owner, like),
        ilike(units.jobNumber, like),
        ilike(units.notes, like),
      )!,
    );
  }
  if (filter.model) where.push(eq(units.model, filter.model));
  const runCount = sql<number>`(select count(*) from ${runs} where ${runs.unitId} = ${units.id})`.mapWith(
    Number,
  );
  const openRuns =
    sql<number>`(select count(*) from ${runs} where ${runs.unitId} = ${units.id} and ${runs.status} = 'in_progress')`.mapWith(
      Number,
    );
  const outRuns =
    sql<number>`(select count(*) from ${runs} where ${runs.unitId} = ${units.id} and ${runs.outOfTolerance})`.mapWith(
      Number,
    );
  const lastRunAt = sql<
    string | null
  >`(select max(${runs.startedAt}) from ${runs} where ${runs.unitId} = ${units.id})`;
  if (filter.state === 'open-run') where.push(sql`${openRuns} > 0`);
  if (filter.state === 'out') where.push(sql`${outRuns} > 0`);
  if (filter.state === 'never-run') where.push(sql`${runCount} = 0`);
  const rows = await db
    .select({
      unit: units,
      by: { id: people.id, displayName: people.displayName },
      runCount,
      openRuns,
      outRuns,
      lastRunAt,
    })
    .from(units)
    .innerJoin(people, eq(people.id, units.createdBy))
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(units.updatedAt))
    .limit(500);
  const models = (await db.selectDistinct({ model: units.model }).from(units).orderBy(asc(units.model))).map(
    (m) => m.model,
  );
  const list: UnitListItem[] = rows.map((r) => ({
    ...unitView(r.unit, r.by),
    runCount: r.runCount,
    openRuns: r.openRuns,
    outRuns: r.outRuns,
    lastRunAt: r.lastRunAt ? new Date(r.lastRunAt).toISOString() : null,
  }));
  return { units: list, models };
}

export async function unitRuns(db: Db, unitId: string): Promise<UnitRunSummary[]> {
  const rows = await db
    .select({
      run: runs,
      by: { id: people.id, displayName: people.displayName },
      revisionState: revisions.state,
    })
    .from(runs)
    .innerJoin(people, eq(people.id, runs.startedBy))
    .innerJoin(revisions, eq(revisions.id, runs.revisionId))
    .where(eq(runs.unitId, unitId))
    .orderBy(desc(runs.startedAt));
  return rows.map(({ run, by, revisionState }) => ({
    id: run.id,
    title: run.title,
    revisionNumber: run.revisionNumber,
    revisionState,
    status: run.status,
    outOfTolerance: run.outOfTolerance,
    startedAt: run.startedAt.toISOString(),
    signedAt: run.signedAt?.toISOString() ?? null,
    startedBy: by,
    params: { mainsVoltage: run.params.mainsVoltage, mainsFrequency: run.params.mainsFrequency },
  }));
}

/** One reading (by its id in the procedure) across every run on this unit, oldest first. */
export async function unitTrend(db: Db, unitId: string, readingId: string | undefined): Promise<TrendView> {
  const rows = await db
    .select({
      run: {
        id: runs.id,
        startedAt: runs.startedAt,
        revisionNumber: runs.revisionNumber,
        params: runs.params,
        steps: runs.steps,
      },
      entry: runEntries,
    })
    .from(runEntries)
    .innerJoin(runs, eq(runs.id, runEntries.runId))
    .where(
      and(eq(runs.unitId, unitId), eq(runEntries.kind, 'reading'), sql`${runEntries.measured} is not null`),
    )
    .orderBy(asc(runs.startedAt));
  const readings = new Map<string, TrendView['readings'][number]>();
  for (const { run, entry } of rows) {
    const step = run.steps.find((s) => s.id === entry.stepId);
    const item = readings.get(entry.stepId) ?? {
      id: entry.stepId,
      label: step?.text ?? entry.stepId,
      unit: entry.unit ?? '',
      measure: step?.reading?.measure ?? null,
      count: 0,
    };
    item.count++;
    readings.set(entry.stepId, item);
  }
  const chosen = readingId ? readings.get(readingId) : undefined;
  return {
    readings: [...readings.values()].sort((a, b) => b.count - a.count || a.label.localeCompare(b.label)),
    reading: chosen
      ? { id: chosen.id, label: chosen.label, unit: chosen.unit, measure: chosen.measure }
      : null,
    points: chosen
      ? rows
          .filter((r) => r.entry.stepId === chosen.id)
          .map(({ run, entry }) => ({
            runId: run.id,
            at: run.startedAt.toISOString(),
            revisionNumber: run.revisionNumber,
            measured: entry.measured!,
            expected: entry.expected,
            low: entry.low,
            high: entry.high,
            within: entry.within,
            mainsVoltage: run.params.mainsVoltage,
          }))
      : [],
  };
}

const isUniqueViolation = (err: unknown) =>
  (err as { code?: string; cause?: { code?: string } })?.code === '23505' ||
  (err as { cause?: { code?: string } })?.cause?.code === '23505';
const duplicate = () =>
  conflict('A unit with this model and serial is already in the register.', {
    fields: [{ field: 'body.serial', reason: 'already registered for this model' }],
  });
/** Model + serial is unique (case-insensitively): the database says so, the caller hears 409. */
async function refusingDuplicates<T>(write: () => Promise<T>) {
  try {
    return await write();
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicate();
    throw err;
  }
}

/** One unit with who registered it; 404 when there is none. */
export async function unitById(db: Db, id: string) {
  const [row] = await db
    .select({ unit: units, by: { id: people.id, displayName: people.displayName } })
    .from(units)
    .innerJoin(people, eq(people.id, units.createdBy))
    .where(eq(units.id, id));
  if (!row) throw notFound('No such unit.');
  return unitView(row.unit, row.by);
}

/** Registers a unit; `at` dates it (demo history), by default now. 409 when model + serial is taken. */
export async function registerUnit(db: Db, userId: string, body: z.output<typeof unitBody>, at?: Date) {
  const [row] = await refusingDuplicates(() =>
    db
      .insert(units)
      .values({ ...body, createdBy: userId, ...(at && { createdAt: at, updatedAt: at }) })
      .returning(),
  );
  return unitById(db, row!.id);
}

/** Saves the unit under its optimistic lock; a stale lockVersion gets 409 with the current unit. */
export async function updateUnit(db: Db, id: string, body: z.output<typeof updateUnitBody>) {
  const { lockVersion, ...fields } = body;
  const [row] = await refusingDuplicates(() =>
    db
      .update(units)
      .set({ ...fields, lockVersion: sql`${units.lockVersion} + 1`, updatedAt: new Date() })
      .where(and(eq(units.id, id), eq(units.lockVersion, lockVersion)))
      .returning(),
  );
  if (!row) {
    const current = await unitById(db, id);
    throw conflict('Someone changed this unit after you opened it; here is the current record.', { current });
  }
  return unitById(db, row.id);
}

export async function unitPhotosOf(db: Db, unitId: string) {
  const photos = await db
    .select()
    .from(unitPhotos)
    .where(eq(unitPhotos.unitId, unitId))
    .orderBy(asc(unitPhotos.addedAt));
  return photos.map((p) => ({
    id: p.id,
    attachmentId: p.attachmentId,
    url: `/api/attachments/${p.attachmentId}`,
    caption: p.caption,
    addedAt: p.addedAt.toISOString(),
  }));
}

/** Stores an uploaded photo of the unit (404 for no such unit, before anything is stored). */
export async function addUnitPhoto(
  deps: AppDeps,
  unitId: string,
  file: Express.Multer.File | undefined,
  caption: string,
  userId: string,
) {
  await unitById(deps.db, unitId);
  const attachment = await storePhoto(deps, file, userId);
  const [photo] = await deps.db
    .insert(unitPhotos)
    .values({ unitId, attachmentId: attachment.id, caption, addedBy: userId })
    .returning();
  return {
    id: photo!.id,
    attachmentId: attachment.id,
    url: `/api/attachments/${attachment.id}`,
    caption,
    addedAt: photo!.addedAt.toISOString(),
  };
}
