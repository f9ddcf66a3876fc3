// Shared by the bench-run and unit API tests: a small approved procedure of the TC-18 kind.
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { people } from '../../../../server/db/schema';
import type { RevisionState } from '../../../../server/db/schema';
import { procedureInState } from '../../../support/review-path';
import type { TestApp } from '../../../support/test-app';
import type { ProcedureDoc } from '../../../../shared/document/schema';

const para = (text: string) => ({ type: 'paragraph', content: [{ type: 'text', text }] });

/** Hazard note → winding reading (scales with mains) → heater reading → check step. */
export const benchDoc: ProcedureDoc = {
  type: 'doc',
  content: [
    { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'HT winding, unloaded' }] },
    {
      type: 'hazardNote',
      attrs: { id: 'hz-ht-live', level: 'danger' },
      content: [
        para('The HT winding is live at several hundred volts. One hand; meter clipped on before power.'),
      ],
    },
    {
      type: 'reckoner',
      attrs: {
        id: 'rk-ht-peak',
        name: 'ht',
        kind: 'peak-no-load',
        inputs: {
          windingVoltage: '250 V',
          windingBasis: 'nominal',
          mainsNominal: { param: 'mainsNominal' },
          mainsActual: { param: 'mainsVoltage' },
          rectifier: 'silicon-bridge',
          diodeDrop: '0.9 V',
          unloadedRise: '10 %',
        },
      },
    },
    {
      type: 'reading',
      attrs: {
        id: 'rd-ht-ac',
        label: 'HT winding, each half',
        testPoint: 'TP1, end to centre tap',
        meterRange: 'AC 750 V',
        unit: 'V',
        expected: { ref: 'ht.windingVoltage' },
        tolerance: '±5 %',
      },
    },
    {
      type: 'reading',
      attrs: {
        id: 'rd-heater',
        label: 'Heater winding',
        testPoint: 'TP2',
        meterRange: 'AC 20 V',
        unit: 'V',
        expected: { literal: '6.3 V' },
        tolerance: '±0.3 V',
      },
    },
    {
      type: 'checkStep',
      attrs: { id: 'ck-discharge', text: 'Reservoir discharged below 60 V and verified with a meter.' },
    },
  ],
};

export async function personId(t: TestApp, who: string) {
  const [row] = await t.db
    .select({ id: people.id })
    .from(people)
    .where(eq(people.email, `${who}@tallowcreek.example`));
  return row!.id;
}

/** An approved (or other-state) revision by hal, taken there as demo content is (approved by marek). */
export async function benchProcedure(
  t: TestApp,
  state: RevisionState = 'approved',
  title = 'TC-18 HT winding check',
) {
  const { revision } = await procedureInState(t.db, state, {
    title,
    equipmentFamily: 'Guitar amplifier',
    equipmentModel: 'TC-18',
    tags: ['ht'],
    params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
    document: structuredClone(benchDoc),
  });
  return revision;
}

type Client = Awaited<ReturnType<TestApp['as']>>;

export async function newUnit(
  c: Client,
  serial = `TC18-${randomUUID().slice(0, 6)}`,
  extra: Record<string, string> = {},
) {
  const res = await c
    .post('/api/units')
    .send({ model: 'TC-18', serial, owner: 'M. Quill', jobNumber: 'J-2041', ...extra });
  if (res.status !== 201) throw new Error(`unit: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.unit as { id: string; lockVersion: number };
}

export async function startRun(
  c: Client,
  revisionId: string,
  unitId: string,
  mainsVoltage = 230,
  mainsFrequency = 50,
) {
  return c.post('/api/runs').send({ revisionId, unitId, mainsVoltage, mainsFrequency });
}

export const entry = (c: Client, runId: string, stepId: string, body: Record<string, unknown>) =>
  c.put(`/api/runs/${runId}/entries/${stepId}`).send({ key: randomUUID(), ...body });

export { tinyPng } from '../../../support/png';
