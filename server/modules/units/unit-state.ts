import type { Request } from 'express';
import { desc, eq, inArray, sql } from 'drizzle-orm';
import {
  UNIT_STATE_WORDS,
  type UnitState,
  type UnitStateBody,
  type UnitStateView,
} from '../../../shared/schemas/follow-ups';
import { recordAudit } from '../../audit/record';
import type { Db, Tx } from '../../db/client';
import { people, unitStateChanges, units } from '../../db/schema';
import { notFound } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/**
 * Records a unit's new state (append-only; its latest row is its state now). A signature names its
 * run; a person's change gives a reason. `at` dates demo history.
 */
export async function writeUnitState(
  tx: Db | Tx,
  who: { id: string; displayName?: string },
  unitId: string,
  change: { state: UnitState; runId?: string; reason?: string; at?: Date },
) {
  const [person] = await tx.select({ name: people.displayName }).from(people).where(eq(people.id, who.id));
  await tx.insert(unitStateChanges).values({
    unitId,
    state: change.state,
    runId: change.runId ?? null,
    reason: change.reason ?? null,
    byId: who.id,
    byName: person?.name ?? who.displayName ?? 'unknown',
    ...(change.at && { at: change.at }),
  });
}

/** A person puts the unit on the bench, waiting for parts or returned, with a reason (audited). */
export async function setUnitState(
  db: Db,
  user: SessionUser,
  unitId: string,
  body: UnitStateBody,
  req: Request,
) {
  await db.transaction(async (tx) => {
    const [unit] = await tx.select().from(units).where(eq(units.id, unitId)).for('update');
    if (!unit) throw notFound('No such unit.');
    await writeUnitState(tx, user, unitId, { state: body.state, reason: body.reason });
    await recordAudit(tx, {
      action: 'unit.state-changed',
      actorId: user.id,
      subject: `${unit.model} ${unit.serial}`,
      details: { unitId, state: body.state, stateWords: UNIT_STATE_WORDS[body.state], reason: body.reason },
      req,
    });
  });
}

const viewOf = (r: typeof unitStateChanges.$inferSelect): UnitStateView => ({
  state: r.state,
  reason: r.reason,
  runId: r.runId,
  by: { id: r.byId, displayName: r.byName },
  at: r.at.toISOString(),
});

/** A unit's states, newest first (the first is its state now). */
export const unitStateHistory = async (db: Db | Tx, unitId: string) =>
  (
    await db
      .select()
      .from(unitStateChanges)
      .where(eq(unitStateChanges.unitId, unitId))
      .orderBy(desc(unitStateChanges.id))
  ).map(viewOf);

/** The state now of each of these units (absent: never signed on the bench nor set). */
export async function currentUnitStates(db: Db | Tx, unitIds: string[]) {
  if (!unitIds.length) return new Map<string, UnitState>();
  const rows = await db
    .selectDistinctOn([unitStateChanges.unitId], {
      unitId: unitStateChanges.unitId,
      state: unitStateChanges.state,
    })
    .from(unitStateChanges)
    .where(inArray(unitStateChanges.unitId, unitIds))
    .orderBy(unitStateChanges.unitId, sql`${unitStateChanges.id} desc`);
  return new Map(rows.map((r) => [r.unitId, r.state]));
}
