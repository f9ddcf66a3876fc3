import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { paramsSchema } from '../../shared/document/params';
import { procedureMetaSchema } from '../../shared/schemas/procedures';
import { checkDocument } from '../modules/procedures/document-check';
import { createApprovedProcedure } from '../modules/review/transitions';
import { NO_FILES } from '../storage/files';
import type { Db } from './client';
import { people, procedures } from './schema';

const seedFile = procedureMetaSchema.extend({
  seedKey: z.string().regex(/^[a-z0-9-]+$/),
  author: z.string(),
  reviewer: z.string(),
  params: paramsSchema,
  document: z.unknown(),
});
export type SeedProcedure = z.infer<typeof seedFile>;

export function readDemoProcedures(dir: string): SeedProcedure[] {
  const folder = path.join(dir, 'procedures');
  if (!existsSync(folder)) return [];
  return readdirSync(folder)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => {
      const parsed = seedFile.safeParse(JSON.parse(readFileSync(path.join(folder, f), 'utf8')));
      if (!parsed.success)
        throw new Error(
          `content-seed/procedures/${f}: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`,
        );
      return parsed.data;
    });
}

/** Demo procedures, each as an approved revision 1 signed by its reviewer; an existing seed key is left untouched. */
export async function seedDemoProcedures(db: Db, dir: string) {
  const demo = readDemoProcedures(dir);
  if (!demo.length) return { added: 0, present: 0 };
  const present = new Set(
    (
      await db
        .select({ key: procedures.seedKey })
        .from(procedures)
        .where(
          inArray(
            procedures.seedKey,
            demo.map((d) => d.seedKey),
          ),
        )
    ).map((r) => r.key),
  );
  let added = 0;
  for (const p of demo) {
    if (present.has(p.seedKey)) continue;
    const checked = checkDocument(p.document, `${p.seedKey}.document`);
    if (!checked.ok)
      throw new Error(
        `demo procedure ${p.seedKey} is invalid: ${checked.problems.map((x) => `${x.field}: ${x.reason}`).join('; ')}`,
      );
    const [author] = await db.select().from(people).where(eq(people.email, p.author));
    if (!author) throw new Error(`demo procedure ${p.seedKey}: no person ${p.author}`);
    const [reviewer] = await db.select().from(people).where(eq(people.email, p.reviewer));
    if (!reviewer?.roles.includes('reviewer'))
      throw new Error(`demo procedure ${p.seedKey}: ${p.reviewer} is not a reviewer`);
    if (reviewer.id === author.id)
      throw new Error(`demo procedure ${p.seedKey}: the reviewer must not be the author`);
    // The way any procedure is approved: a draft, submitted, approved with a real reviewer
    // signature over the stored content (so it verifies), in one transaction.
    await db.transaction((tx) =>
      createApprovedProcedure(
        tx,
        NO_FILES,
        author,
        reviewer,
        { ...p, document: checked.doc, changeReason: 'First issue for the shop’s starting library.' },
        'Approved for the shop’s starting library (demo content).',
      ),
    );
    added++;
  }
  return { added, present: present.size };
}
