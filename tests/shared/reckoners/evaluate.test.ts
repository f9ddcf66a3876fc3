import { describe, expect, it } from 'vitest';
import { evaluateProcedure, type ProcedureBlock } from '../../../shared/reckoners/evaluate';
import { expectClose } from '../helpers';

// Tallow Creek Valve Works TC-18 combo (230 V / 50 Hz): invented values.
const tc18: ProcedureBlock[] = [
  // Deliberately listed out of dependency order.
  {
    name: 'screen',
    kind: 'dropper-ladder',
    inputs: {
      startVoltage: { ref: 'bplus.averageDc' },
      stages: [{ targetVoltage: 330, current: '12 mA', capacitance: '47u' }],
    },
  },
  {
    name: 'bplus',
    kind: 'loaded-bplus',
    inputs: {
      windingVoltage: { ref: 'ht.windingVoltage' },
      sourceResistance: '85R',
      reservoir: '47u',
      loadCurrent: '90 mA',
      mainsFrequency: { param: 'mainsFrequency' },
    },
  },
  {
    name: 'ht',
    kind: 'peak-no-load',
    inputs: {
      windingVoltage: '275 V',
      mainsActual: { param: 'mainsVoltage' },
      mainsNominal: { param: 'mainsNominal' },
    },
  },
  {
    name: 'b_plus_reading',
    kind: 'reading-tolerance',
    inputs: { unit: 'V', expected: { ref: 'bplus.averageDc' }, tolerance: '±10 %', measured: 352 },
  },
];
const params = { mainsVoltage: 240, mainsNominal: 230, mainsFrequency: 50 };

describe('evaluateProcedure', () => {
  it('evaluates blocks in dependency order and passes outputs and parameters along', () => {
    const r = evaluateProcedure(tc18, params);
    expect(r.errors).toEqual([]);
    expect(r.order).toEqual(['ht', 'bplus', 'screen', 'b_plus_reading']);
    expect(r.blocks.map((b) => b.name)).toEqual(['screen', 'bplus', 'ht', 'b_plus_reading']);
    for (const b of r.blocks) expect(b.ok, JSON.stringify(b)).toBe(true);
    const [screen, bplus, ht] = r.blocks;
    if (!screen?.ok || !bplus?.ok || !ht?.ok) throw new Error('unreachable');
    // The measured mains scales the winding: 275 × 240 / 230 [derived, docs/references.md §2]
    expectClose(ht.outputs.windingVoltage!.value as number, (275 * 240) / 230, 1e-9);
    expectClose(bplus.outputs.peakVoltage!.value as number, Math.SQRT2 * ((275 * 240) / 230), 1e-9);
    // The ladder starts from the loaded B+ average [derived: R = (V_start − 330) / 12 mA, docs/references.md §4]
    const start = bplus.outputs.averageDc!.value as number;
    expectClose(screen.outputs['stage1.resistanceExact']!.value as number, (start - 330) / 0.012, 1e-9);
  });

  it('changing a parameter changes the dependent results', () => {
    const low = evaluateProcedure(tc18, { ...params, mainsVoltage: 207 });
    const high = evaluateProcedure(tc18, { ...params, mainsVoltage: 253 });
    const v = (r: typeof low) => (r.blocks[1]!.ok ? (r.blocks[1]!.outputs.averageDc!.value as number) : NaN);
    expect(v(high)).toBeGreaterThan(v(low));
  });

  it('names the block and reference when a block is missing', () => {
    const r = evaluateProcedure(
      [
        {
          name: 'ladder',
          kind: 'dropper-ladder',
          inputs: { startVoltage: { ref: 'nowhere.averageDc' }, stages: [] },
        },
      ],
      {},
    );
    const b = r.blocks[0]!;
    expect(b.ok).toBe(false);
    if (b.ok) return;
    expect(b.errors[0]!.field).toBe('startVoltage');
    expect(b.errors[0]!.reason).toMatch(/nowhere\.averageDc/);
    expect(b.errors[0]!.reason).toMatch(/no block named "nowhere"/);
  });

  it('names a missing output and lists the ones there are', () => {
    const blocks: ProcedureBlock[] = [
      { name: 'ht', kind: 'peak-no-load', inputs: { windingVoltage: 275 } },
      { name: 'b', kind: 'bleeder', inputs: { capacitance: '47u', chargedVoltage: { ref: 'ht.bogus' } } },
    ];
    const b = evaluateProcedure(blocks, {}).blocks[1]!;
    expect(b.ok).toBe(false);
    if (!b.ok) {
      expect(b.errors[0]).toMatchObject({ field: 'chargedVoltage' });
      // The block by its label and the results it does give by theirs, not by internal names.
      expect(b.errors[0]!.reason).toMatch(/Peak and no-load DC block does not give \("bogus"\)/);
      expect(b.errors[0]!.reason).toMatch(/“Peak voltage”/);
      expect(b.errors[0]!.reason).not.toMatch(/peakVoltage|"ht"/);
    }
  });

  it('reports a cycle as a procedure error naming the blocks, without throwing', () => {
    const blocks: ProcedureBlock[] = [
      {
        name: 'a',
        kind: 'bleeder',
        inputs: { capacitance: '47u', chargedVoltage: { ref: 'c.storedEnergy' } },
      },
      {
        name: 'b',
        kind: 'bleeder',
        inputs: { capacitance: '47u', chargedVoltage: { ref: 'a.storedEnergy' } },
      },
      {
        name: 'c',
        kind: 'bleeder',
        inputs: { capacitance: '47u', chargedVoltage: { ref: 'b.storedEnergy' } },
      },
      {
        name: 'd',
        kind: 'bleeder',
        inputs: { capacitance: '47u', chargedVoltage: { ref: 'c.storedEnergy' } },
      },
      { name: 'free', kind: 'bleeder', inputs: { capacitance: '47u', chargedVoltage: 300 } },
    ];
    const r = evaluateProcedure(blocks, {});
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]!.message).toMatch(/cycle/);
    expect([...r.errors[0]!.blocks].sort()).toEqual(['a', 'b', 'c']);
    expect(r.blocks.map((b) => b.ok)).toEqual([false, false, false, false, true]);
    const d = r.blocks[3]!;
    if (!d.ok) expect(d.errors[0]!.reason).toMatch(/cycle/);
  });

  it('reports a self-reference, an unset parameter, an unknown kind and a duplicate name', () => {
    const r = evaluateProcedure(
      [
        {
          name: 'self',
          kind: 'bleeder',
          inputs: { capacitance: '47u', chargedVoltage: { ref: 'self.storedEnergy' } },
        },
        {
          name: 'p',
          kind: 'peak-no-load',
          inputs: { windingVoltage: 6.3, mainsActual: { param: 'mainsVoltage' } },
        },
        { name: 'k', kind: 'flux', inputs: {} },
        { name: 'dup', kind: 'bleeder', inputs: { capacitance: '47u', chargedVoltage: 300 } },
        { name: 'dup', kind: 'bleeder', inputs: { capacitance: '47u', chargedVoltage: 300 } },
        { name: 'bad name!', kind: 'bleeder', inputs: {} },
      ],
      {},
    );
    const reasons = r.blocks.map((b) =>
      b.ok ? '' : b.errors.map((e) => `${e.field}: ${e.reason}`).join('; '),
    );
    expect(reasons[0]).toMatch(/chargedVoltage: .*same block/);
    expect(reasons[1]).toMatch(/mainsActual: .*"mainsVoltage", which is not set/);
    expect(reasons[2]).toMatch(/kind: unknown reckoner "flux"/);
    expect(reasons[3]).toMatch(/name: another block/);
    expect(reasons[4]).toMatch(/name: another block/);
    expect(reasons[5]).toMatch(/name: a block name/);
    expect(r.errors.some((e) => /more than one block is named "dup"/.test(e.message))).toBe(true);
  });

  it('marks blocks that depend on a failed block', () => {
    const r = evaluateProcedure(
      [
        { name: 'ht', kind: 'peak-no-load', inputs: { windingVoltage: -5 } },
        {
          name: 'b',
          kind: 'bleeder',
          inputs: { capacitance: '47u', chargedVoltage: { ref: 'ht.peakVoltage' } },
        },
      ],
      {},
    );
    const [ht, b] = r.blocks;
    expect(ht!.ok).toBe(false);
    if (!ht!.ok) expect(ht!.errors[0]!.field).toBe('windingVoltage');
    if (!b!.ok) expect(b!.errors[0]!.reason).toMatch(/depend on the Peak and no-load DC block/);
    else expect.unreachable();
  });

  it('resolves references inside rows', () => {
    const r = evaluateProcedure(
      [
        {
          name: 'bplus',
          kind: 'loaded-bplus',
          inputs: { windingVoltage: 300, sourceResistance: 80, reservoir: '47u', loadCurrent: '80 mA' },
        },
        {
          name: 'fuse',
          kind: 'mains-fuse',
          inputs: {
            windings: [
              { volts: 300, amps: { ref: 'bplus.windingRmsCurrent' } },
              { volts: 6.3, amps: 2 },
            ],
            mainsVoltage: { param: 'mainsVoltage' },
          },
        },
      ],
      { mainsVoltage: 230 },
    );
    const [bplus, fuse] = r.blocks;
    if (!bplus?.ok || !fuse?.ok) throw new Error(JSON.stringify(r));
    expectClose(
      fuse.outputs.totalVA!.value as number,
      300 * (bplus.outputs.windingRmsCurrent!.value as number) + 12.6,
      1e-12,
    );
  });
});
