import type { Request } from 'express';
import { asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import {
  instrumentRefusal,
  type instrumentBody,
  type InstrumentView,
  type updateInstrumentBody,
} from '../../../shared/schemas/registers';
import type { RunInstrument } from '../../../shared/schemas/runs';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { attachments, instruments } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { conflict, notFound, refuse } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { storeUpload } from '../attachments/attachments.service';

type InstrumentRow = typeof instruments.$inferSelect;

/** Today's date by the database's clock (YYYY-MM-DD), the one clock calibration is judged by. */
export const today = async (db: Db | Tx) => {
  const { rows } = await db.execute<{ d: string }>(sql`select current_date::text as d`);
  return rows[0]!.d;
};

function view(row: InstrumentRow, now: string, cert: { fileName: string } | null): InstrumentView {
  return {
    id: row.id,
    identifier: row.identifier,
    kind: row.kind,
    description: row.description,
    calibrationDue: row.calibrationDue,
    refusal: instrumentRefusal(row, now),
    certificate:
      row.certificateId && cert
        ? { url: `/api/attachments/${row.certificateId}`, fileName: cert.fileName }
        : null,
    lockVersion: row.lockVersion,
  };
}

export async function listInstruments(db: Db): Promise<InstrumentView[]> {
  const [rows, now] = await Promise.all([
    db
      .select({ i: instruments, fileName: attachments.originalName })
      .from(instruments)
      .leftJoin(attachments, eq(attachments.id, instruments.certificateId))
      .orderBy(asc(instruments.calibrationDue), asc(instruments.identifier)),
    today(db),
  ]);
  return rows.map((r) => view(r.i, now, r.fileName ? { fileName: r.fileName } : null));
}

async function instrumentView(db: Db | Tx, id: string) {
  const [r] = await db
    .select({ i: instruments, fileName: attachments.originalName })
    .from(instruments)
    .leftJoin(attachments, eq(attachments.id, instruments.certificateId))
    .where(eq(instruments.id, id));
  if (!r) throw notFound('No such instrument.');
  return view(r.i, await today(db), r.fileName ? { fileName: r.fileName } : null);
}

const taken = (identifier: string) =>
  refuse({
    field: 'body.identifier',
    label: 'Identifier',
    reason: `An instrument named ${identifier} is already in the register`,
  });
const isUniqueViolation = (e: unknown) =>
  (e as { code?: string; cause?: { code?: string } }).code === '23505' ||
  (e as { cause?: { code?: string } }).cause?.code === '23505';

export async function addInstrument(
  db: Db | Tx,
  user: SessionUser,
  body: z.output<typeof instrumentBody>,
  req?: Request,
) {
  const id = await db
    .transaction(async (tx) => {
      const [row] = await tx
        .insert(instruments)
        .values({ ...body, createdBy: user.id })
        .returning();
      await recordAudit(tx, {
        action: 'instrument.added',
        actorId: user.id,
        subject: row!.identifier,
        details: { instrumentId: row!.id, kind: row!.kind, calibrationDue: row!.calibrationDue },
        req,
      });
      return row!.id;
    })
    .catch((e: unknown) => {
      throw isUniqueViolation(e) ? taken(body.identifier) : e;
    });
  return instrumentView(db, id);
}

export async function updateInstrument(
  db: Db,
  user: SessionUser,
  id: string,
  body: z.output<typeof updateInstrumentBody>,
  req: Request,
) {
  const { lockVersion, ...values } = body;
  await db
    .transaction(async (tx) => {
      const [row] = await tx.select().from(instruments).where(eq(instruments.id, id)).for('update');
      if (!row) throw notFound('No such instrument.');
      if (row.lockVersion !== lockVersion)
        throw conflict(
          'Someone else changed this instrument since you opened it; your changes were not saved.',
          {
            instrument: await instrumentView(tx, id),
          },
        );
      await tx
        .update(instruments)
        .set({ ...values, lockVersion: row.lockVersion + 1, updatedAt: sql`now()` })
        .where(eq(instruments.id, id));
      const changed = (Object.keys(values) as (keyof typeof values)[]).filter((k) => values[k] !== row[k]);
      await recordAudit(tx, {
        action: 'instrument.changed',
        actorId: user.id,
        subject: values.identifier,
        details: { instrumentId: id, changed, calibrationDue: values.calibrationDue },
        req,
      });
    })
    .catch((e: unknown) => {
      throw isUniqueViolation(e) ? taken(values.identifier) : e;
    });
  return instrumentView(db, id);
}

/** Stores a calibration certificate (PDF or image, by the rules every upload follows) on an instrument. */
export async function addCertificate(
  deps: AppDeps,
  user: SessionUser,
  id: string,
  file: Express.Multer.File | undefined,
  req: Request,
) {
  const [row] = await deps.db.select().from(instruments).where(eq(instruments.id, id));
  if (!row) throw notFound('No such instrument.');
  const attachment = await storeUpload(deps, file, user.id, 'file');
  await deps.db.transaction(async (tx) => {
    await tx
      .update(instruments)
      .set({
        certificateId: attachment.id,
        lockVersion: sql`${instruments.lockVersion} + 1`,
        updatedAt: sql`now()`,
      })
      .where(eq(instruments.id, id));
    await recordAudit(tx, {
      action: 'instrument.certificate-added',
      actorId: user.id,
      subject: row.identifier,
      details: { instrumentId: id, attachmentId: attachment.id, sha256: attachment.sha256 },
      req,
    });
  });
  return instrumentView(deps.db, id);
}

/**
 * The instrument that may take a reading now: in the register and not past its calibration due
 * date; a 400 naming the field and the reason otherwise.
 */
export async function usableInstrument(db: Db | Tx, id: string, field: string): Promise<RunInstrument> {
  const [row] = await db.select().from(instruments).where(eq(instruments.id, id));
  if (!row) throw refuse({ field, label: 'Instrument', reason: 'No such instrument is in the register' });
  const refusal = instrumentRefusal(row, await today(db));
  if (refusal)
    throw refuse({ field, label: 'Instrument', reason: refusal[0]!.toUpperCase() + refusal.slice(1) });
  return { id: row.id, identifier: row.identifier, kind: row.kind, calibrationDue: row.calibrationDue };
}
