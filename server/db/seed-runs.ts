import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { and, eq, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { entryBody, startRunBody } from '../../shared/schemas/runs';
import { unitBody } from '../../shared/schemas/units';
import { HttpError } from '../http/errors';
import type { SessionUser } from '../http/route';
import { toSessionUser } from '../auth/passport';
import { decideFollowUp } from '../modules/follow-ups/follow-ups.service';
import { writeRunRelease } from '../modules/runs/run-release';
import { writeRunSignature, writeWitnessSignature } from '../modules/runs/run-sign';
import { decideDeviation, decideHold, recordStepException } from '../modules/runs/run-decisions';
import { recordEntry, startRun } from '../modules/runs/runs.service';
import { registerUnit } from '../modules/units/units.service';
import { NO_FILES } from '../storage/files';
import type { Db, Tx } from './client';
import {
  instruments,
  people,
  procedures,
  revisions,
  runEntries,
  runHolds,
  runs,
  runStepExceptions,
  units,
} from './schema';

const email = z.email();
const instant = z.iso.datetime({ offset: true });

const unitsFile = z.object({
  units: z.array(
    z
      .object({
        model: z.string().trim().min(1).max(80),
        serial: z.string().trim().min(1).max(80),
        owner: z.string().max(200).default(''),
        jobNumber: z.string().max(80).default(''),
        notes: z.string().max(4000).default(''),
        registeredBy: email,
        registeredAt: instant.optional(),
      })
      .strict(),
  ),
});

const runsFile = z.object({
  runs: z.array(
    z
      .object({
        key: z.string().regex(/^[a-z0-9-]+$/),
        procedure: z.string(),
        unit: z.object({ model: z.string(), serial: z.string() }).strict(),
        technician: email,
        /** A trainee's run: the qualified witness, who co-signs at witnessedAt (before signedAt). */
        witness: email.optional(),
        witnessedAt: instant.optional(),
        /** The bench's usual instrument for the run, by identifier. */
        instrument: z.string().optional(),
        mains: z.object({ voltage: z.number(), frequency: z.number() }).strict(),
        startedAt: instant,
        /** A signed run sheet: every step finished, signed at this time. */
        signedAt: instant.optional(),
        /** An open run: every step up to and including this one is finished. */
        through: z.string().optional(),
        readings: z.record(z.string(), z.string()),
        notes: z.record(z.string(), z.string()).default({}),
        /** A signed run's follow-up (opened by its out-of-band readings): the disposition recorded on it. */
        disposition: z
          .object({
            value: z.enum(['repair', 'accept', 'return']),
            reason: z.string().optional(),
            by: email,
            at: instant,
          })
          .strict()
          .optional(),
        /** A signed run checked and released by a second person. */
        release: z.object({ by: email, at: instant }).strict().optional(),
        /** A hold point the run stops at (out of band), decided by a senior: step → decision. */
        holds: z
          .record(
            z.string(),
            z
              .object({ decidedBy: email, decision: z.enum(['continue', 'abandon']), reason: z.string() })
              .strict(),
          )
          .default({}),
        /** A step done another way, in place of its entry, and the senior's decision: step → deviation. */
        deviations: z
          .record(
            z.string(),
            z
              .object({
                reason: z.string(),
                decidedBy: email,
                decision: z.enum(['approved', 'refused']),
                note: z.string(),
              })
              .strict(),
          )
          .default({}),
      })
      .strict()
      .refine(
        (r) => !!r.signedAt !== !!r.through,
        'give either signedAt (a signed run) or through (an open run)',
      ),
  ),
});

export type SeedUnit = z.infer<typeof unitsFile>['units'][number];
export type SeedRun = z.infer<typeof runsFile>['runs'][number];

function readJson<T extends z.ZodType>(dir: string, file: string, schema: T): z.infer<T> | null {
  const full = path.join(dir, file);
  if (!existsSync(full)) return null;
  const parsed = schema.safeParse(JSON.parse(readFileSync(full, 'utf8')));
  if (!parsed.success)
    throw new Error(
      `content-seed/${file}: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`,
    );
  return parsed.data;
}

export const readDemoUnits = (dir: string): SeedUnit[] => readJson(dir, 'units.json', unitsFile)?.units ?? [];
export const readDemoRuns = (dir: string): SeedRun[] => readJson(dir, 'runs.json', runsFile)?.runs ?? [];

/** A stable UUID (RFC 9562 version 8, name-based on SHA-256) for a demo row, so a second seeding finds the first. */
export function demoUuid(name: string): string {
  const h = createHash('sha256').update(`benchwright demo content: ${name}`, 'utf8').digest('hex');
  const variant = ((parseInt(h[16]!, 16) & 0x3) | 0x8).toString(16);
  const hex = `${h.slice(0, 12)}8${h.slice(13, 16)}${variant}${h.slice(17, 32)}`;
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20, 32)}`;
}

async function personByEmail(db: Db | Tx, address: string): Promise<SessionUser | undefined> {
  const [p] = await db.select().from(people).where(eq(people.email, address));
  return p ? toSessionUser(p) : undefined;
}

const findUnit = async (db: Db | Tx, model: string, serial: string) =>
  (
    await db
      .select()
      .from(units)
      .where(
        and(sql`lower(${units.model}) = lower(${model})`, sql`lower(${units.serial}) = lower(${serial})`),
      )
  )[0];

/** Demo units by model + serial; one already registered (whatever people changed on it) is left alone. */
export async function seedDemoUnits(db: Db, dir: string) {
  let added = 0;
  let present = 0;
  for (const u of readDemoUnits(dir)) {
    if (await findUnit(db, u.model, u.serial)) {
      present++;
      continue;
    }
    const by = await personByEmail(db, u.registeredBy);
    if (!by) throw new Error(`demo unit ${u.model} ${u.serial}: no person ${u.registeredBy}`);
    const at = u.registeredAt ? new Date(u.registeredAt) : undefined;
    const body = unitBody.parse({
      model: u.model,
      serial: u.serial,
      owner: u.owner,
      jobNumber: u.jobNumber,
      notes: u.notes,
    });
    try {
      await registerUnit(db, by.id, body, at);
      added++;
    } catch (err) {
      // Registered meanwhile (model + serial is unique).
      if (!(err instanceof HttpError && err.status === 409)) throw err;
      present++;
    }
  }
  return { added, present };
}

class SkipRun extends Error {}

/**
 * One demo run, in one transaction: started on the procedure's approved revision at the bench's
 * mains, every entry through the same recordEntry the API uses (the server decides each reading),
 * then dated and, for a signed run, signed.
 */
async function seedOneRun(db: Db, r: SeedRun) {
  const [procedure] = await db.select().from(procedures).where(eq(procedures.seedKey, r.procedure));
  if (!procedure) throw new SkipRun(`no procedure ${r.procedure}`);
  const [revision] = await db
    .select()
    .from(revisions)
    .where(and(eq(revisions.procedureId, procedure.id), eq(revisions.state, 'approved')));
  if (!revision) throw new SkipRun(`${r.procedure} has no approved revision`);
  const unit = await findUnit(db, r.unit.model, r.unit.serial);
  if (!unit) throw new SkipRun(`no unit ${r.unit.model} ${r.unit.serial}`);
  const tech = await personByEmail(db, r.technician);
  if (!tech?.roles.includes('technician')) throw new SkipRun(`${r.technician} is not a technician`);
  const startedAt = new Date(r.startedAt);
  const [sameVisit] = await db
    .select({ id: runs.id })
    .from(runs)
    .where(and(eq(runs.unitId, unit.id), eq(runs.startedAt, startedAt)));
  if (sameVisit) return false;

  const witness = r.witness ? await personByEmail(db, r.witness) : undefined;
  if (r.witness && !witness) throw new SkipRun(`no witness ${r.witness}`);
  const decider = r.disposition ? await personByEmail(db, r.disposition.by) : undefined;
  if (r.disposition && !decider) throw new SkipRun(`no person ${r.disposition.by}`);
  const releaser = r.release ? await personByEmail(db, r.release.by) : undefined;
  if (r.release && !releaser) throw new SkipRun(`no person ${r.release.by}`);
  const [instrument] = r.instrument
    ? await db.select().from(instruments).where(eq(instruments.identifier, r.instrument))
    : [];
  if (r.instrument && !instrument) throw new SkipRun(`no instrument ${r.instrument}`);
  const body = startRunBody.parse({
    revisionId: revision.id,
    unitId: unit.id,
    mainsVoltage: r.mains.voltage,
    mainsFrequency: r.mains.frequency,
    key: demoUuid(`run ${r.key}`),
    ...(witness && { witnessId: witness.id }),
    ...(instrument && { instrumentId: instrument.id }),
  });
  await db.transaction(async (tx) => {
    // Demo revisions attach no files and demo runs take no photos.
    const { run, created } = await startRun(tx, NO_FILES, tech, body);
    if (!created) throw new SkipRun('already started');
    const last = r.through ? run.steps.findIndex((s) => s.id === r.through) : run.steps.length - 1;
    if (last < 0) throw new SkipRun(`revision ${revision.number} of ${r.procedure} has no step ${r.through}`);
    const todo = run.steps.slice(0, last + 1);
    const unknown = [...Object.keys(r.readings), ...Object.keys(r.notes)].filter(
      (id) => !todo.some((s) => s.id === id),
    );
    const missing = todo
      .filter((s) => s.kind === 'reading' && r.readings[s.id] === undefined)
      .map((s) => s.id);
    if (unknown.length || missing.length) {
      throw new SkipRun(
        `revision ${revision.number} of ${r.procedure} does not match: ${[...unknown.map((id) => `no step ${id}`), ...missing.map((id) => `no reading for ${id}`)].join(', ')}`,
      );
    }
    // Entries spread evenly between the start and the signature (two minutes apart on an open run).
    const end = r.signedAt
      ? new Date(r.signedAt).getTime()
      : startedAt.getTime() + (todo.length + 1) * 120_000;
    const gap = (end - startedAt.getTime()) / (todo.length + 1);
    for (const [i, step] of todo.entries()) {
      const deviation = r.deviations[step.id];
      if (deviation) {
        const senior = await personByEmail(tx, deviation.decidedBy);
        if (!senior) throw new SkipRun(`no senior ${deviation.decidedBy}`);
        await recordStepException(tx, tech, run.id, {
          stepId: step.id,
          kind: 'deviation',
          reason: deviation.reason,
        });
        const [row] = await tx
          .select({ id: runStepExceptions.id })
          .from(runStepExceptions)
          .where(and(eq(runStepExceptions.runId, run.id), eq(runStepExceptions.stepId, step.id)));
        await decideDeviation(tx, senior, run.id, row!.id, {
          decision: deviation.decision,
          note: deviation.note,
        });
        continue;
      }
      const note = r.notes[step.id];
      const entry = entryBody.parse({
        key: demoUuid(`run ${r.key} step ${step.id}`),
        ...(step.kind === 'reading' ? { value: r.readings[step.id] } : { done: true }),
        ...(note ? { note } : {}),
      });
      await recordEntry(tx, tech, run.id, step.id, entry);
      // A hold point reached out of band: the senior's decision from the file, or the run is left out.
      const [held] = await tx
        .select({ id: runHolds.id })
        .from(runHolds)
        .where(and(eq(runHolds.runId, run.id), isNull(runHolds.decision)));
      if (held) {
        const decided = r.holds[step.id];
        const senior = decided && (await personByEmail(tx, decided.decidedBy));
        if (!decided || !senior) throw new SkipRun(`the hold point at ${step.id} has no senior's decision`);
        await decideHold(tx, senior, run.id, held.id, { decision: decided.decision, reason: decided.reason });
      }
      const at = new Date(startedAt.getTime() + Math.round((i + 1) * gap));
      await tx
        .update(runEntries)
        .set({ firstEnteredAt: at, enteredAt: at })
        .where(and(eq(runEntries.runId, run.id), eq(runEntries.stepId, step.id)));
    }
    await tx.update(runs).set({ startedAt }).where(eq(runs.id, run.id));
    // Signed as the API signs (same checks, hash, rows and audit entry), dated in the past, without
    // the password re-entry a seeder cannot give and without the out-of-tolerance mail.
    if (r.signedAt && witness)
      await writeWitnessSignature(tx, NO_FILES, witness, run.id, {
        requestId: 'demo-content',
        signedAt: new Date(r.witnessedAt ?? r.signedAt),
      });
    if (r.signedAt) {
      // Out-of-band readings open the run's follow-up here; a passing re-run closes an earlier one.
      const { followUp } = await writeRunSignature(tx, NO_FILES, tech, run.id, {
        meaning: 'performed',
        requestId: 'demo-content',
        signedAt: new Date(r.signedAt),
      });
      if (r.disposition && !followUp)
        throw new SkipRun('a disposition is given but no reading was out of band');
      if (r.disposition && followUp)
        await decideFollowUp(
          tx,
          decider!,
          followUp.id,
          { disposition: r.disposition.value, reason: r.disposition.reason },
          { at: new Date(r.disposition.at) },
        );
      if (r.release)
        await writeRunRelease(tx, releaser!, run.id, {
          requestId: 'demo-content',
          signedAt: new Date(r.release.at),
        });
    }
  });
  return true;
}

/** Demo runs by seed key (and by unit + start time); one already there, open or signed, is never touched. */
export async function seedDemoRuns(db: Db, dir: string, log: (line: string) => void = () => undefined) {
  let added = 0;
  let present = 0;
  let skipped = 0;
  for (const r of readDemoRuns(dir)) {
    const [seen] = await db
      .select({ id: runs.id })
      .from(runs)
      .where(eq(runs.startKey, demoUuid(`run ${r.key}`)));
    if (seen) {
      present++;
      continue;
    }
    try {
      if (await seedOneRun(db, r)) added++;
      else present++;
    } catch (err) {
      if (!(err instanceof SkipRun)) throw err;
      skipped++;
      log(`demo run ${r.key} skipped: ${err.message}`);
    }
  }
  return { added, present, skipped };
}

/** Demo units, then the demo bench runs on them. */
export async function seedDemoBench(db: Db, dir: string, log: (line: string) => void = () => undefined) {
  const u = await seedDemoUnits(db, dir);
  const r = await seedDemoRuns(db, dir, log);
  return { units: u, runs: r };
}
