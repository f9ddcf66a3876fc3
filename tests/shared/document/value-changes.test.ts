import { describe, expect, it } from 'vitest';
import { describeRevision } from '../../../shared/document/block-view';
import type { ProcedureDoc } from '../../../shared/document/schema';
import { valueChanges } from '../../../server/modules/review/diff/value-changes';
import { bleedBlock, doc, fuseBlock, htBlock, params, reading, stored, withoutInputs } from './figures';

const figures = (d: ProcedureDoc, p = params) => describeRevision(d, stored(d, p));
const rows = (before: ProcedureDoc | null, after: ProcedureDoc, p = params) =>
  valueChanges(before && figures(before), figures(after, p));
const brief = (c: { kind: string; subject: string; label: string }) => `${c.kind} ${c.subject}: ${c.label}`;

describe('the review’s value changes', () => {
  it('follows a renamed block by its id: one “renamed from” row, no block removed or added', () => {
    const before = doc(htBlock('ht'), bleedBlock('ht'));
    const after = doc(htBlock('hv'), bleedBlock('hv'));
    const changes = rows(before, after);
    expect(changes).toEqual([
      {
        kind: 'block',
        subject: 'hv',
        blockId: 'blk-ht',
        blockLabel: 'Peak and no-load DC',
        label: 'name',
        before: 'ht',
        after: 'hv',
        renamedFrom: 'ht',
      },
    ]);
  });

  it('lists a changed input with its before and after value and source, beside the outputs that moved', () => {
    const changes = rows(doc(fuseBlock('85 %')), doc(fuseBlock('80 %')));
    const eff = changes.find((c) => c.kind === 'input' && c.label === 'Transformer efficiency');
    expect(eff).toMatchObject({
      subject: 'fuse',
      blockLabel: 'Mains fuse',
      before: '85 %',
      after: '80 %',
      sourceBefore: 'typed',
      sourceAfter: 'typed',
    });
    // 80 % instead of 85 % raises the primary current by 85/80 [derived: P_primary = VA ÷ η; docs/references.md §1].
    const primary = changes.find((c) => c.kind === 'output' && c.label === 'Primary current');
    expect(primary).toBeDefined();
    const amps = (s: string | null) => Number(s!.replace(/ mA rms$/, '')) / 1000;
    expect(amps(primary!.after) / amps(primary!.before)).toBeCloseTo(85 / 80, 2);
  });

  it('lists an input whose value stayed but whose source changed', () => {
    const changes = rows(doc(fuseBlock('85 %', '230 V')), doc(fuseBlock('85 %', { param: 'mainsNominal' })));
    expect(changes).toEqual([
      expect.objectContaining({
        kind: 'input',
        label: 'Mains voltage',
        before: '230 V rms',
        after: '230 V rms',
        sourceBefore: 'typed',
        sourceAfter: 'procedure parameter “Nominal mains”',
      }),
    ]);
  });

  it('keeps the author’s order: parameters, then each block in document order with inputs in field order before outputs in declaration order', () => {
    const before = doc(htBlock('ht', '250 V'), fuseBlock('85 %'));
    const after = doc(htBlock('ht', '260 V'), fuseBlock('80 %'));
    const changes = rows(before, after, { ...params, mainsVoltage: 230 });
    const order = changes.map(brief);
    expect(order[0]).toBe('parameter Parameters: Measured mains');
    const firstFuse = order.findIndex((s) => s.includes(' fuse: '));
    expect(order.slice(1, firstFuse)).toEqual([
      'input ht: Winding voltage (rms)',
      'input ht: Actual mains',
      // Declared in this order in shared/reckoners/peak-no-load.ts; at 230 V measured mains the ratio
      // becomes 1 and the winding is no longer scaled, so those change too.
      'output ht: Winding voltage at this mains',
      'output ht: Peak voltage',
      'output ht: No-load DC at the reservoir',
      'output ht: Unloaded winding check, low',
      'output ht: Unloaded winding check, high',
      'output ht: No-load DC, high end',
      'output ht: Mains ratio',
      'output ht: Scaled to actual mains',
    ]);
    expect(order[firstFuse]).toBe('input fuse: Transformer efficiency');
  });

  it('compares an old snapshot without stored inputs with a new one as equals', () => {
    const d = doc(htBlock(), bleedBlock());
    expect(valueChanges(describeRevision(d, withoutInputs(stored(d))), figures(d))).toEqual([]);
  });

  it('shows a first revision as what it assumes and what follows, not every output as new', () => {
    const d = doc(fuseBlock(), htBlock(), reading('ht.noLoadDc'));
    const changes = rows(null, d);
    expect(changes.every((c) => c.before === null)).toBe(true);
    const outputs = changes.filter((c) => c.kind === 'output').map(brief);
    // The reckoners' key outputs, and the one a reading uses.
    expect(outputs).toEqual([
      'output fuse: Total secondary load',
      'output fuse: Primary current',
      'output fuse: Fuse',
      'output fuse: Surge inside the guaranteed holding time',
      'output ht: Winding voltage at this mains',
      'output ht: Peak voltage',
      'output ht: No-load DC at the reservoir',
      'output ht: No-load DC, high end',
    ]);
    const inputs = changes.filter((c) => c.kind === 'input');
    expect(inputs.find((c) => c.label === 'Actual mains')).toMatchObject({
      after: '240 V rms',
      sourceAfter: expect.stringMatching(/Measured mains.*left empty/),
    });
    expect(inputs.some((c) => c.label === 'Valve rectifier drop')).toBe(false); // not given: nothing assumed
    expect(changes.filter((c) => c.kind === 'reading')).toEqual([
      expect.objectContaining({ subject: 'B+1', label: 'expected', after: expect.stringMatching(/±5 %/) }),
    ]);
    const all = figures(d).blocks.reduce((n, b) => n + b.outputs.length, 0);
    expect(outputs.length).toBeLessThan(all / 2);
  });
});
