import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { revisions } from '../db/schema';
import type { IndexedProcedure } from './search-index';

type RevisionRow = typeof revisions.$inferSelect;

/** What search sees of an approved revision: text, readings, and each reckoner's results. */
export function toIndexed(r: RevisionRow): IndexedProcedure {
  const readings = r.snapshot.readings
    .map((x) => [x.label, x.testPoint, x.bandText].filter(Boolean).join(' — '))
    .join('\n');
  const reckoners = r.snapshot.blocks
    .filter((b) => b.ok)
    .map(
      (b) =>
        `${b.name}: ${Object.values(b.ok ? b.outputs : {})
          .map((o) => `${o.label} ${o.formatted}`)
          .join('; ')}`,
    )
    .join('\n');
  return {
    id: r.procedureId,
    revisionId: r.id,
    revisionNumber: r.number,
    title: r.title,
    family: r.equipmentFamily,
    model: r.equipmentModel,
    tags: r.tags,
    body: r.plainText,
    readings,
    reckoners,
  };
}

export async function loadApproved(db: Db, onProgress?: (done: number) => void): Promise<IndexedProcedure[]> {
  const out: IndexedProcedure[] = [];
  const pageSize = 1_000;
  for (let offset = 0; ; offset += pageSize) {
    const rows = await db
      .select()
      .from(revisions)
      .where(eq(revisions.state, 'approved'))
      .orderBy(revisions.id)
      .limit(pageSize)
      .offset(offset);
    out.push(...rows.map(toIndexed));
    onProgress?.(out.length);
    if (rows.length < pageSize) return out;
  }
}

export async function loadApprovedOf(db: Db, procedureId: string): Promise<IndexedProcedure | undefined> {
  const [row] = await db
    .select()
    .from(revisions)
    .where(and(eq(revisions.procedureId, procedureId), eq(revisions.state, 'approved')));
  return row ? toIndexed(row) : undefined;
}
