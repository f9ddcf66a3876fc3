import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { INSTRUMENT_KINDS, instrumentBody, type InstrumentKind } from '../../shared/schemas/registers';
import { toSessionUser } from '../auth/passport';
import { addInstrument, today } from '../modules/registers/instruments.service';
import { grantQualification } from '../modules/registers/qualifications.service';
import type { Db } from './client';
import { instruments, people, qualifications } from './schema';

const registersFile = z.object({
  instruments: z.array(
    z
      .object({
        identifier: z.string(),
        kind: z.enum(Object.keys(INSTRUMENT_KINDS) as [InstrumentKind, ...InstrumentKind[]]),
        description: z.string().default(''),
        /** Due on the 15th, this many months from the month the demo is loaded (negative: past due). */
        dueInMonths: z.number().int(),
      })
      .strict(),
  ),
  qualifications: z.array(
    z.object({ person: z.email(), families: z.array(z.string()), live: z.boolean() }).strict(),
  ),
  grantedBy: z.email(),
});

/** The 15th of the month `months` from the month of `day` (YYYY-MM-DD). */
export function fifteenthFrom(day: string, months: number) {
  const [y, m] = day.split('-').map(Number) as [number, number];
  const d = new Date(Date.UTC(y, m - 1 + months, 15));
  return d.toISOString().slice(0, 10);
}

/** Demo instruments (by identifier) and qualifications (for people who hold none yet), through the services. */
export async function seedDemoRegisters(db: Db, dir: string) {
  const file = path.join(dir, 'registers.json');
  if (!existsSync(file)) return { instruments: 0, qualifications: 0 };
  const data = registersFile.parse(JSON.parse(readFileSync(file, 'utf8')));
  const [granter] = await db.select().from(people).where(eq(people.email, data.grantedBy));
  if (!granter) throw new Error(`content-seed/registers.json: no person ${data.grantedBy}`);
  const by = toSessionUser(granter);
  const now = await today(db);
  let added = 0;
  for (const i of data.instruments) {
    const [seen] = await db
      .select({ id: instruments.id })
      .from(instruments)
      .where(sql`lower(${instruments.identifier}) = lower(${i.identifier})`);
    if (seen) continue;
    const body = instrumentBody.parse({
      identifier: i.identifier,
      kind: i.kind,
      description: i.description,
      calibrationDue: fifteenthFrom(now, i.dueInMonths),
    });
    await addInstrument(db, by, body);
    added++;
  }
  let granted = 0;
  for (const q of data.qualifications) {
    const [person] = await db.select().from(people).where(eq(people.email, q.person));
    if (!person) throw new Error(`content-seed/registers.json: no person ${q.person}`);
    const [held] = await db
      .select({ id: qualifications.id })
      .from(qualifications)
      .where(eq(qualifications.personId, person.id));
    if (held) continue;
    for (const family of q.families) {
      await grantQualification(db, by, {
        personId: person.id,
        scope: 'family',
        family,
        note: 'Demo content',
      });
      granted++;
    }
    if (q.live) {
      await grantQualification(db, by, { personId: person.id, scope: 'live', note: 'Demo content' });
      granted++;
    }
  }
  return { instruments: added, qualifications: granted };
}
