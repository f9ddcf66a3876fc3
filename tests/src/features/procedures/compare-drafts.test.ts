/** The save-conflict view: the fields that differ by their labels, each side's value in words. */
import { describe, expect, it } from 'vitest';
import type { ProcedureDoc } from '@shared/document/schema';
import { compareDrafts } from '@/features/procedures/draft/compare-drafts';
import type { DraftFields } from '@/features/procedures/draft/draft-fields';

const fuse = (htVolts: unknown) => ({
  type: 'reckoner',
  attrs: {
    id: 'fuse-block-1',
    name: 'mainsFuse',
    kind: 'mains-fuse',
    inputs: {
      windings: [{ label: 'HT', volts: htVolts, amps: '0.1 A' }],
      mainsVoltage: { param: 'mainsVoltage' },
    },
  },
});
const draft = (over: Partial<DraftFields>, ...blocks: unknown[]): DraftFields => ({
  title: 'TC-18 first power-up',
  equipmentFamily: 'Guitar amplifier',
  equipmentModel: 'TC-18',
  tags: ['fuse'],
  params: { mainsNominal: 230, mainsVoltage: 230, mainsFrequency: 50 },
  document: {
    type: 'doc',
    content: [{ type: 'paragraph', content: [{ type: 'text', text: 'Fit the lamp limiter.' }] }, ...blocks],
  } as ProcedureDoc,
  ...over,
});

describe('compareDrafts', () => {
  it('names each differing field by its label with yours and the saved value', () => {
    const mine = draft({ title: 'TC-18 first power-up, checked' }, fuse('300 V'));
    const saved = draft({ params: { mainsNominal: 120, mainsVoltage: 120, mainsFrequency: 60 } }, fuse(''));
    const rows = compareDrafts(mine, saved);
    expect(rows).toEqual(
      expect.arrayContaining([
        { label: 'Title', yours: 'TC-18 first power-up, checked', saved: 'TC-18 first power-up' },
        { label: 'Nominal mains', yours: '230 V', saved: '120 V' },
        { label: 'Mains fuse block: Winding 1 voltage', yours: '300 V', saved: '—' },
      ]),
    );
    // No raw data: no JSON, no internal names or paths.
    for (const r of rows)
      expect(`${r.label} ${r.yours} ${r.saved}`).not.toMatch(/[{}]|mainsFuse|windings\.|attrs/);
  });

  it('says nothing differs when nothing does, and names an added block and changed text', () => {
    expect(compareDrafts(draft({}), draft({}))).toEqual([]);
    const rows = compareDrafts(
      draft({}, fuse('300 V')),
      draft({ document: { type: 'doc', content: [] } as ProcedureDoc }),
    );
    expect(rows).toEqual(
      expect.arrayContaining([
        { label: 'Mains fuse block', yours: 'added', saved: 'not there' },
        { label: 'Text', yours: expect.stringContaining('Fit the lamp limiter.'), saved: '—' },
      ]),
    );
  });
});
