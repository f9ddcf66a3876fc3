import { eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { attachments } from '../../db/schema';
import type { AppDeps } from '../../deps';
import { notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';
import { PUBLISHED_STATES, seesDrafts } from '../procedures/procedures.service';
import { ALLOWED_TYPES, checkUpload, type UploadKind } from './upload';

/** Checks an uploaded file against the rules, stores its bytes and records its attachment row. */
export async function storeUpload(
  deps: AppDeps,
  given: Express.Multer.File | undefined,
  uploadedBy: string,
  what: UploadKind,
) {
  const { file, mediaType, name } = await checkUpload(given, what);
  const sha256 = await deps.files.put(file.buffer);
  const [row] = await deps.db
    .insert(attachments)
    .values({ sha256, originalName: name, mediaType, size: file.size, uploadedBy })
    .returning();
  return row!;
}

/**
 * Whether this person may read the attachment: staff read every one (as they read every draft);
 * technicians only what a published revision shows, run and unit photos and calibration certificates.
 */
async function mayRead(db: Db, user: SessionUser, id: string) {
  if (seesDrafts(user)) return true;
  const published = sql.raw(PUBLISHED_STATES.map((s) => `'${s}'`).join(', '));
  const { rows } = await db.execute<{ ok: boolean }>(sql`
    select exists (select 1 from run_photos where attachment_id = ${id})
        or exists (select 1 from unit_photos where attachment_id = ${id})
        or exists (select 1 from instruments where certificate_id = ${id})
        or exists (
             select 1 from revisions
             where state in (${published})
               and jsonb_path_exists(document, '$.** ? (@.attachmentId == $id)', jsonb_build_object('id', ${id}::text))
           ) as ok`);
  return rows[0]?.ok === true;
}

/** An attachment the person may read, with its bytes checked against their SHA-256; 404 otherwise. */
export async function readableAttachment(deps: AppDeps, user: SessionUser, id: string) {
  const [row] = await deps.db.select().from(attachments).where(eq(attachments.id, id));
  if (!row || !(ALLOWED_TYPES as string[]).includes(row.mediaType) || !(await mayRead(deps.db, user, row.id)))
    throw notFound('No such attachment.');
  const bytes = await deps.files.get(row.sha256);
  if (!bytes)
    throw notFound(
      'The stored file does not match this attachment’s recorded SHA-256 (missing or altered); tell an admin.',
    );
  return { row, bytes };
}
