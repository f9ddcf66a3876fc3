/**
 * Bench runs work every expected value out again at the measured mains — including blocks whose
 * mains fields were left as the editor used to insert them (nominal typed, actual empty) — and a
 * reading typed in another measure than the step's is refused.
 * Winding scaling [derived: V × V_mains,actual ÷ V_mains,nominal; docs/references.md §2].
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { procedureInState } from '../../../support/review-path';
import type { ProcedureDoc } from '../../../../shared/document/schema';
import { createTestApp, type TestApp } from '../../../support/test-app';
import { entry, newUnit, startRun } from './runs-fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const para = (text: string) => ({ type: 'paragraph', content: [{ type: 'text', text }] });

/** A peak/no-load block as inserted from the menu before fields declared what they follow. */
const doc: ProcedureDoc = {
  type: 'doc',
  content: [
    {
      type: 'hazardNote',
      attrs: { id: 'hz-live', level: 'danger' },
      content: [para('HT live. One hand; isolation transformer.')],
    },
    {
      type: 'reckoner',
      attrs: {
        id: 'rk-peak',
        name: 'peakNoLoad',
        kind: 'peak-no-load',
        inputs: {
          windingVoltage: '245 V',
          windingBasis: 'nominal',
          mainsNominal: '230',
          mainsActual: '',
          rectifier: 'silicon-bridge',
          diodeDrop: '0.9',
          valveDrop: '',
          unloadedRise: '10',
          filterNodes: '',
        },
      },
    },
    {
      type: 'reading',
      attrs: {
        id: 'rd-noload',
        label: 'No-load DC at the reservoir',
        testPoint: 'TP3',
        meterRange: 'DC 1000 V',
        unit: 'V',
        expected: { ref: 'peakNoLoad.noLoadDc' },
        tolerance: '±10 %',
      },
    },
    {
      type: 'reading',
      attrs: {
        id: 'rd-winding',
        label: 'HT winding',
        testPoint: 'TP1',
        meterRange: 'AC 750 V',
        unit: 'V',
        expected: { ref: 'peakNoLoad.windingVoltage' },
        tolerance: '±5 %',
      },
    },
  ],
};

async function approved() {
  const { revision } = await procedureInState(t.db, 'approved', {
    title: 'Menu-inserted block',
    equipmentFamily: 'Guitar amplifier',
    equipmentModel: 'TC-18',
    tags: [],
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    document: structuredClone(doc),
  });
  return revision;
}

type Step = { id: string; reading?: { expected: number; low: number; high: number; measure?: string } };

describe('a bench run at 236 V', () => {
  it('expects the no-load DC for 236 V, not for the 230 V the block was designed at', async () => {
    const tom = await t.as('tom');
    const revision = await approved();
    const res = await startRun(tom, revision.id, (await newUnit(tom)).id, 236);
    expect(res.status).toBe(201);
    const step = (res.body.run.steps as Step[]).find((s) => s.id === 'rd-noload')!;
    const expected = Math.SQRT2 * 245 * (236 / 230) - 2 * 0.9;
    expect(step.reading!.expected).toBeCloseTo(expected, 6);
    expect(step.reading!.low).toBeCloseTo(expected * 0.9, 6);
    expect(step.reading!.measure).toBe('dc');
  });
});

describe('readings typed in the wrong measure', () => {
  it('"350 VAC" on a DC reading and "424 V pk" on an rms reading get 400 naming the value, with the conversion where one exists', async () => {
    const tom = await t.as('tom');
    const revision = await approved();
    const run = (await startRun(tom, revision.id, (await newUnit(tom)).id, 230)).body.run;
    await entry(tom, run.id, 'hz-live', { done: true });
    const ac = await entry(tom, run.id, 'rd-noload', { value: '350 VAC' });
    expect(ac.status).toBe(400);
    expect(ac.body.fields[0]).toMatchObject({
      field: 'body.value',
      reason: expect.stringMatching(/rms value, but this reading takes V DC/),
    });
    const pk = await entry(tom, run.id, 'rd-winding', { value: '424 V pk' });
    expect(pk.status).toBe(400);
    expect(pk.body.fields[0].reason).toContain('299.8 V rms');
    // Nothing was stored by the refusals; the right measure is taken.
    const ok = await entry(tom, run.id, 'rd-winding', { value: '245 V rms' });
    expect(ok.status).toBe(200);
    expect(ok.body.entry.measured).toBe(245);
  });
});
