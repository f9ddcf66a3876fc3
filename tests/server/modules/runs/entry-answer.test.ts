// A bench-run entry answers what it changed (shared/runs/entry-answer.ts), small enough for a
// workshop tablet; applied to the run the client holds, it gives the run the server would send.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyEntryAnswer, entryAnswer } from '../../../../shared/runs/entry-answer';
import type { RunView } from '../../../../shared/schemas/runs';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { benchProcedure, entry, newUnit, startRun } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Client = Awaited<ReturnType<TestApp['as']>>;
const byStep = (run: RunView) => ({
  ...run,
  entries: [...run.entries].sort((a, b) => a.stepId.localeCompare(b.stepId)),
});
const runOf = async (c: Client, id: string) => (await c.get(`/api/runs/${id}`)).body.run as RunView;

describe('the answer to a bench-run entry', () => {
  it('is under 2 kB, has the documented shape, and applied to the run held equals the run read again', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const started = await startRun(tom, revision.id, (await newUnit(tom)).id);
    expect(started.status).toBe(201);
    const runId = started.body.run.id as string;
    let held = await runOf(tom, runId);
    expect(held.locked.length).toBeGreaterThan(0);

    const steps: [string, Record<string, unknown>][] = [
      ['hz-ht-live', { done: true }], // unlocks the steps after it
      ['rd-ht-ac', { value: '251 V' }],
      ['rd-ht-ac', { value: '280 V', reason: 'Meter lead slipped; taken again.' }], // version 2, out of band
      ['rd-ht-ac', { value: '252 V', reason: 'Taken a third time.' }], // version 3
      ['rd-heater', { value: '6.4' }],
      ['ck-discharge', { done: true }],
    ];
    for (const [stepId, body] of steps) {
      const res = await entry(tom, runId, stepId, body);
      expect(res.status).toBe(200);
      expect(Buffer.byteLength(res.text)).toBeLessThan(2048);
      const answer = entryAnswer.parse(res.body);
      expect(answer.entry.stepId).toBe(stepId);
      expect(answer.step).toEqual({ id: stepId, finished: true });
      const applied = applyEntryAnswer(held, answer);
      const fresh = await runOf(tom, runId);
      // The server lists entries in no particular order; the page finds them by step.
      expect(byStep(applied!)).toEqual(byStep(fresh));
      held = fresh;
    }
    expect(held.locked).toEqual([]);
    expect(held.progress).toEqual({ done: 4, total: 4, outOfTolerance: 0 });
    expect(held.entries.find((e) => e.stepId === 'rd-ht-ac')!.history.map((h) => h.version)).toEqual([
      1, 2, 3,
    ]);
  });

  it('a resend answers the entry as stored, marked replayed; a client missing a version reads the run again', async () => {
    const tom = await t.as('tom');
    const revision = await benchProcedure(t);
    const runId = (await startRun(tom, revision.id, (await newUnit(tom)).id)).body.run.id as string;
    await entry(tom, runId, 'hz-ht-live', { done: true });
    const stale = await runOf(tom, runId);
    const key = randomUUID();
    const body = { key, value: '250 V' };
    const first = await tom.put(`/api/runs/${runId}/entries/rd-ht-ac`).send(body);
    await entry(tom, runId, 'rd-ht-ac', { value: '251 V', reason: 'Again.' });
    const again = await tom.put(`/api/runs/${runId}/entries/rd-ht-ac`).send(body);
    expect(again.status).toBe(200);
    expect(first.body.replayed).toBe(false);
    expect(again.body.replayed).toBe(true);
    // The entry as it stands now (version 2), not the resent value.
    expect(again.body.entry.version).toBe(2);
    expect(again.body.entry.raw).toBe('251 V');
    // The client held version 0 of this entry: version 2 cannot be applied to it.
    expect(applyEntryAnswer(stale, entryAnswer.parse(again.body))).toBeNull();
  });

  it('a witnessed run: a new entry shows the witness co-signature as no longer covering the run', async () => {
    const held = {
      id: 'run-1',
      entries: [],
      witness: {
        person: { id: 'w', displayName: 'W' },
        signature: { signedAt: '', contentHash: 'h', current: true },
      },
    } as unknown as RunView;
    const answer = entryAnswer.parse({
      replayed: false,
      entry: {
        stepId: 'ck',
        kind: 'check',
        raw: null,
        measured: null,
        unit: null,
        expected: null,
        low: null,
        high: null,
        within: null,
        deviation: null,
        deviationPercent: null,
        done: true,
        note: '',
        version: 1,
        lastKey: 'k',
        enteredBy: { id: 'p', displayName: 'P' },
        enteredAt: '2026-01-01T00:00:00.000Z',
        takenOn: null,
        instrument: null,
        recentHistory: [],
      },
      step: { id: 'ck', finished: true },
      run: {
        id: 'run-1',
        outOfTolerance: false,
        progress: { done: 1, total: 1, outOfTolerance: 0 },
        locked: [],
        stoppedAtHoldPoint: false,
      },
    });
    expect(applyEntryAnswer(held, answer)!.witness!.signature!.current).toBe(false);
    expect(applyEntryAnswer(held, { ...answer, replayed: true })!.witness!.signature!.current).toBe(true);
    // An entry that stopped the run at a hold point: the run (with its hold) is read again.
    expect(
      applyEntryAnswer(held, { ...answer, run: { ...answer.run, stoppedAtHoldPoint: true } }),
    ).toBeNull();
  });
});
