import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { describeBlocks, type BlockView, type InputRow } from '../../../shared/document/block-view';
import { expectClose } from '../helpers';
import { bleedBlock, doc, fuseBlock, htBlock, params, reckoner, stored, withoutInputs } from './figures';

const input = (b: BlockView, label: string): InputRow => {
  const row = b.inputs.find((i) => i.label === label);
  if (!row) throw new Error(`no input "${label}" (have: ${b.inputs.map((i) => i.label).join(' | ')})`);
  return row;
};

const d = doc(htBlock(), bleedBlock(), fuseBlock());
const [ht, bleed, fuse] = describeBlocks(d, stored(d));

describe('what a block assumes', () => {
  it('lists inputs in the registry’s field order, labelled in its words, rows named by row and column', () => {
    expect(ht!.inputs.map((i) => i.label)).toEqual([
      'Winding voltage (rms)',
      'Winding figure is',
      'Nominal mains',
      'Actual mains',
      'Rectifier',
      'Silicon diode forward drop',
      'Valve rectifier drop',
      'Unloaded rise of a rated winding',
      'DC filter nodes',
    ]);
    expect(fuse!.inputs.slice(0, 5).map((i) => i.label)).toEqual([
      'Load given as',
      'Secondary windings, row 1 (HT): Winding voltage',
      'Secondary windings, row 1 (HT): Winding current (AC rms)',
      'Secondary windings, row 2 (Heaters): Winding voltage',
      'Secondary windings, row 2 (Heaters): Winding current (AC rms)',
    ]);
  });

  it('gives each typed value in SI base units with its prefix, unit and measure [SI prefixes: BIPM SI Brochure, 9th ed., table 7; cross-check with mathjs]', () => {
    const amps = input(fuse!, 'Secondary windings, row 1 (HT): Winding current (AC rms)');
    expect(amps).toMatchObject({
      formatted: '100 mA',
      unit: 'A',
      measure: 'rms',
      source: { kind: 'typed' },
      sourceText: 'typed',
    });
    expect(amps.value).toBeCloseTo(unit('100 mA').toNumber('A'), 12);
    const heater = input(fuse!, 'Secondary windings, row 2 (Heaters): Winding voltage');
    expect(heater).toMatchObject({ value: 6.3, formatted: '6.3 V', measure: 'rms' });
    const cap = input(bleed!, 'Capacitance');
    expect(cap.value).toBeCloseTo(unit('47 uF').toNumber('F'), 15);
    expect(cap).toMatchObject({ formatted: '47 µF', unit: 'F', measure: null });
    expect(input(bleed!, 'Bleeder resistance')).toMatchObject({
      value: unit('220 kohm').toNumber('ohm'),
      formatted: '220 kΩ',
    });
    expect(input(fuse!, 'Transformer efficiency')).toMatchObject({
      value: 85,
      formatted: '85 %',
      source: { kind: 'typed' },
    });
  });

  it('says which procedure parameter a value came from, and whether it was followed because the field was left empty', () => {
    expect(input(ht!, 'Nominal mains')).toMatchObject({
      value: 230,
      measure: 'rms',
      source: { kind: 'param', param: 'mainsNominal', paramLabel: 'Nominal mains', followed: false },
    });
    const actual = input(ht!, 'Actual mains');
    expect(actual).toMatchObject({
      value: params.mainsVoltage,
      formatted: '240 V',
      source: { kind: 'param', param: 'mainsVoltage', followed: true },
    });
    expect(actual.sourceText).toMatch(/Measured mains.*left empty/);
  });

  it('names the block and output an input was taken from, with the value that output gave', () => {
    const v = input(bleed!, 'Charged voltage');
    expect(v.source).toEqual({
      kind: 'ref',
      blockId: 'blk-ht',
      block: 'ht',
      blockLabel: 'Peak and no-load DC',
      output: 'noLoadDc',
      outputLabel: 'No-load DC at the reservoir',
    });
    // People see the output and the block by their labels, not the internal name "ht".
    expect(v.sourceText).toBe('“No-load DC at the reservoir” from the Peak and no-load DC block');
    // 250 V rated at 230 V, on 240 V mains: 250 × 240 ÷ 230 V rms; peak √2 × that, less one 0.9 V diode
    // (centre-tap) [derived; docs/references.md §2].
    expectClose(v.value as number, Math.SQRT2 * ((250 * 240) / 230) - 0.9, 1e-9, 'charged voltage');
    expect(v.measure).toBe('dc');
  });

  it('marks a field left empty with a registry default as the default, and an empty optional one as not given', () => {
    expect(input(ht!, 'Silicon diode forward drop')).toMatchObject({
      value: 0.9,
      formatted: '900 mV',
      source: { kind: 'default' },
    });
    expect(input(ht!, 'Valve rectifier drop')).toMatchObject({
      value: null,
      formatted: '—',
      source: { kind: 'empty' },
      sourceText: 'not given',
    });
    expect(input(ht!, 'Rectifier')).toMatchObject({
      formatted: 'Silicon full-wave, centre-tapped winding (one diode conducts)',
      sourceText: 'chosen',
    });
  });

  it('lists outputs in the reckoner’s declaration order, not the order jsonb stores keys in', () => {
    // Declared in shared/reckoners/peak-no-load.ts in this order; jsonb would put "scaled" first.
    expect(ht!.outputs.map((o) => o.key)).toEqual([
      'windingVoltage',
      'peakVoltage',
      'noLoadDc',
      'windingUnloadedLow',
      'windingUnloadedHigh',
      'noLoadDcHigh',
      'mainsRatio',
      'scaled',
    ]);
    expect(
      Object.keys(stored(d).blocks[0]!.ok ? (stored(d).blocks[0] as { outputs: object }).outputs : {})[0],
    ).toBe('scaled');
    expect(ht!.outputs.find((o) => o.key === 'peakVoltage')).toMatchObject({
      label: 'Peak voltage',
      measure: 'peak',
      unit: 'V',
    });
  });

  it('reads a snapshot stored before blocks kept their input and sources from the document, to the same description', () => {
    const old = describeBlocks(d, withoutInputs(stored(d)));
    expect(old.map((b) => b.inputs)).toEqual([ht, bleed, fuse].map((b) => b!.inputs));
    expect(old.map((b) => b.outputs.map((o) => o.key))).toEqual(
      [ht, bleed, fuse].map((b) => b!.outputs.map((o) => o.key)),
    );
  });

  it('names a failed block’s problem fields in words, and still shows what was typed', () => {
    const bad = doc(fuseBlock('lots'));
    const [b] = describeBlocks(bad, stored(bad));
    expect(b!.ok).toBe(false);
    expect(b!.errors.map((e) => e.field)).toEqual(['Transformer efficiency']);
    expect(input(b!, 'Transformer efficiency').formatted).toBe('lots');
    expect(input(b!, 'Secondary windings, row 2 (Heaters): Winding current (AC rms)').value).toBe(2);
  });

  it('shows people no internal keys or dotted paths', () => {
    const words = [ht, bleed, fuse].flatMap((b) => [
      ...b!.inputs.flatMap((i) => [i.label, i.sourceText]),
      ...b!.outputs.map((o) => o.label),
    ]);
    for (const w of words) expect(w).not.toMatch(/\b[a-z]+[A-Z]\w*\b|\w\.\d+\.\w|\w\.\w+Dc\b/);
  });

  it('does not fail on old or odd stored data: a block missing from the results, an unknown kind, a reference to nothing', () => {
    const odd = doc(htBlock(), reckoner('blk-x', 'x', 'no-such-kind', { a: 1 }), bleedBlock('gone'));
    const snap = stored(doc(htBlock()));
    const views = describeBlocks(odd, snap);
    expect(views.map((v) => [v.name, v.ok])).toEqual([
      ['ht', true],
      ['x', false],
      ['bleed', false],
    ]);
    expect(views[1]!.errors[0]!.reason).toMatch(/unknown reckoner/);
    expect(views[2]!.errors).toEqual([{ field: 'Block', reason: 'missing from the stored results' }]);
    expect(input(views[2]!, 'Charged voltage')).toMatchObject({
      formatted: '—',
      source: { kind: 'ref', block: 'gone', blockId: null },
    });
  });
});
