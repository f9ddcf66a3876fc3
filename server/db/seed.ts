import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { ROLES } from '../../shared/schemas/roles';
import { hashPassword } from '../auth/passwords';
import type { Db } from './client';
import { addPerson } from '../modules/people/people.service';
import { people } from './schema';
import { seedDemoProcedures } from './seed-procedures';
import { seedDemoRegisters } from './seed-registers';
import { seedDemoBench } from './seed-runs';
import { seedDemoRevisions } from './seed-revisions';

export const contentSeedDir = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../content-seed',
);

const peopleFile = z.object({
  people: z.array(
    z.object({
      email: z.string(),
      displayName: z.string(),
      roles: z.array(z.enum(ROLES)),
      password: z.string(),
    }),
  ),
});

export function readDemoPeople() {
  return peopleFile.parse(JSON.parse(readFileSync(path.join(contentSeedDir, 'people.json'), 'utf8'))).people;
}

/**
 * Loads the demo content. Idempotent: rows that already exist (by natural key) are left exactly as
 * people changed them; only missing ones are added.
 */
export async function seedDemoContent(db: Db, log: (line: string) => void = () => undefined) {
  const demo = readDemoPeople();
  const existing = new Set((await db.select({ email: people.email }).from(people)).map((r) => r.email));
  let added = 0;
  for (const p of demo) {
    if (existing.has(p.email)) continue;
    const person = await addPerson(db, {
      email: p.email,
      displayName: p.displayName,
      roles: p.roles,
      passwordHash: await hashPassword(p.password),
    });
    if (person) added++;
  }
  log(`demo people: ${added} added, ${demo.length - added} already present`);
  const procs = await seedDemoProcedures(db, contentSeedDir);
  log(`demo procedures: ${procs.added} added, ${procs.present} already present`);
  const registers = await seedDemoRegisters(db, contentSeedDir);
  log(
    `demo instruments: ${registers.instruments} added; demo qualifications: ${registers.qualifications} granted`,
  );
  const bench = await seedDemoBench(db, contentSeedDir, log);
  log(
    `demo units: ${bench.units.added} added, ${bench.units.present} already present; demo bench runs: ${bench.runs.added} added, ${bench.runs.present} already present, ${bench.runs.skipped} skipped`,
  );
  // After the runs: a revision approved since someone ran the one before it waits for their acknowledgement.
  const later = await seedDemoRevisions(db, contentSeedDir);
  log(`demo later revisions: ${later.added} added, ${later.present} already present`);
}
