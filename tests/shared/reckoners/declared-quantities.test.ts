/**
 * Every input field declares the quantity it holds (unit, measure, shop range, the parameter it
 * follows), and every value is checked against that declaration: the wrong measure or unit is
 * refused with the exact conversion where one exists, a slipped prefix raises a named caution, an
 * unknown input name is refused, and nothing falls back silently to zero.
 *
 * Conversions for a sine [derived; docs/references.md §2]: V_peak = √2 × V_rms, V_pp = 2 × V_peak.
 */
import { describe, expect, it } from 'vitest';
import { evaluateProcedure } from '../../../shared/reckoners/evaluate';
import { eachField } from '../../../shared/reckoners/field-paths';
import { listReckoners, RECKONER_KINDS, getReckoner } from '../../../shared/reckoners/registry';
import { runReckoner } from '../../../shared/reckoners/validate';
import type { FieldSpec } from '../../../shared/reckoners/types';
import { TYPICAL_INPUTS } from './examples';

const clone = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

function setPath(obj: Record<string, unknown>, path: string, value: unknown) {
  const keys = path.split('.');
  let o: Record<string, unknown> = obj;
  for (const k of keys.slice(0, -1)) o = o[k] as Record<string, unknown>;
  o[keys[keys.length - 1]!] = value;
}

/** Every numeric field of a reckoner at its path in the typical input, with the typed value there. */
function numericFields(kind: string): { spec: FieldSpec; path: string; value: unknown }[] {
  const out: { spec: FieldSpec; path: string; value: unknown }[] = [];
  eachField(getReckoner(kind)!.fields, TYPICAL_INPUTS[kind]!, (spec, path, value) => {
    if (spec.kind === 'quantity' && spec.unit) out.push({ spec, path, value });
  });
  return out;
}

describe('field declarations', () => {
  it('every reckoner has a typical example that evaluates cleanly (no input caution)', () => {
    for (const kind of RECKONER_KINDS) {
      const r = runReckoner(kind, TYPICAL_INPUTS[kind]);
      expect(r.ok, `${kind}: ${JSON.stringify(!r.ok && r.errors)}`).toBe(true);
      if (r.ok)
        expect(
          r.cautions.filter((c) => c.code.startsWith('implausible')),
          kind,
        ).toEqual([]);
    }
  });

  it('every volt and ampere field names its measure; every quantity field has a shop range inside its hard limits', () => {
    for (const def of listReckoners()) {
      const walk = (fields: FieldSpec[]) => {
        for (const f of fields) {
          if (f.kind === 'rows') walk(f.columns ?? []);
          if (f.kind !== 'quantity' || !f.unit) continue;
          if (f.unit === 'V' || f.unit === 'A')
            expect(f.measure, `${def.kind}.${f.key}`).toMatch(/^(rms|peak|peak-to-peak|dc)$/);
          else expect(f.measure, `${def.kind}.${f.key}`).toBeUndefined();
          expect(f.plausible, `${def.kind}.${f.key} has a shop range`).toBeDefined();
          if (f.min !== undefined) expect(f.plausible!.min).toBeGreaterThanOrEqual(f.min);
          if (f.max !== undefined) expect(f.plausible!.max).toBeLessThanOrEqual(f.max);
        }
      };
      walk(def.fields);
    }
  });

  it('every output of every reckoner carries a unit and a measure; volts and amps never as a bare scalar', () => {
    for (const kind of RECKONER_KINDS) {
      const r = runReckoner(kind, TYPICAL_INPUTS[kind]);
      if (!r.ok) throw new Error(kind);
      for (const [key, o] of Object.entries(r.outputs)) {
        expect(typeof o.unit, `${kind}.${key}`).toBe('string');
        expect(['rms', 'peak', 'peak-to-peak', 'dc', 'scalar'], `${kind}.${key}`).toContain(o.measure);
        if (o.unit === 'V' || o.unit === 'A') expect(o.measure, `${kind}.${key}`).not.toBe('scalar');
        else expect(o.measure, `${kind}.${key}`).toBe('scalar');
        if (typeof o.value !== 'number') expect(o.unit, `${kind}.${key}`).toBe('');
      }
    }
  });
});

describe('measures', () => {
  it('"424 V pk" in an rms winding field is refused, offering 299.8 V rms [derived: V_rms = V_peak ÷ √2]', () => {
    const r = runReckoner('peak-no-load', { ...TYPICAL_INPUTS['peak-no-load'], windingVoltage: '424 V pk' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]!.field).toBe('windingVoltage');
    expect(r.errors[0]!.reason).toMatch(/peak/);
    expect(r.errors[0]!.reason).toContain('299.8 V rms'); // 424 / 1.41421 = 299.81
  });

  it('a peak-to-peak value offers rms = pp ÷ (2√2) [derived]: 848 Vpp → 299.8 V rms', () => {
    const r = runReckoner('loaded-bplus', { ...TYPICAL_INPUTS['loaded-bplus'], windingVoltage: '848 Vpp' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.reason).toContain('299.8 V rms');
  });

  it('every volt or ampere field refuses a value written in any other measure, and accepts its own', () => {
    const words: Record<string, string> = { rms: 'rms', peak: 'pk', 'peak-to-peak': 'pp', dc: 'DC' };
    let checked = 0;
    for (const kind of RECKONER_KINDS) {
      for (const { spec, path } of numericFields(kind)) {
        if (!spec.measure) continue;
        const value = (spec.plausible!.min + spec.plausible!.max) / 2;
        for (const [measure, word] of Object.entries(words)) {
          const input = clone(TYPICAL_INPUTS[kind]!);
          setPath(input, path, `${value} ${spec.unit}${word}`);
          const r = runReckoner(kind, input);
          const fieldError =
            !r.ok && r.errors.some((e) => e.field === path && /this field takes/.test(e.reason));
          expect(fieldError, `${kind}.${path} given ${measure}`).toBe(measure !== spec.measure);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(60);
  });

  it('"VAC" is read as rms and "VDC" as DC: an AC value in a DC field has no conversion offered', () => {
    const r = runReckoner('bleeder', { ...TYPICAL_INPUTS.bleeder, chargedVoltage: '450 VAC' });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]!.reason).toMatch(/rms value, but this field takes V DC/);
      expect(r.errors[0]!.reason).not.toMatch(/did you mean/);
    }
  });
});

describe('unknown input names are refused, with the nearest name', () => {
  it.each([
    ['bleeder', 'resistance', 'bleederResistance'],
    ['peak-no-load', 'diodedrop', 'diodeDrop'],
    ['mains-fuse', 'effciency', 'efficiency'],
  ])('%s: "%s" → did you mean "%s"', (kind, typo, meant) => {
    const r = runReckoner(kind, { ...TYPICAL_INPUTS[kind], [typo]: '1' });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors).toContainEqual({
        field: typo,
        reason: expect.stringContaining(`did you mean "${meant}"`),
      });
  });

  it('inside rows too: a ladder stage with "fitted" is refused', () => {
    const input = clone(TYPICAL_INPUTS['dropper-ladder']!);
    (input.stages as Record<string, unknown>[])[1]!.fitted = '4k7';
    const r = runReckoner('dropper-ladder', input);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors).toContainEqual({
        field: 'stages.1.fitted',
        reason: expect.stringContaining('"fittedResistance"'),
      });
  });

  it('every reckoner refuses a made-up key', () => {
    for (const kind of RECKONER_KINDS) {
      const r = runReckoner(kind, { ...TYPICAL_INPUTS[kind], zzExtra: 1 });
      expect(r.ok, kind).toBe(false);
      if (!r.ok)
        expect(
          r.errors.map((e) => e.field),
          kind,
        ).toContain('zzExtra');
    }
  });
});

/**
 * The slips people make, through every reckoner: nF for µF, mV for V, mA for A, k for M (and M for k),
 * peak for rms. Each is refused with a field message or raises a named caution on that field.
 * Fields whose shop range starts at zero are skipped for the ÷1000 slips: a small value there is
 * legitimate, so no rule can tell it from a slip (common practice, no source).
 */
describe('unit slips through every reckoner', () => {
  const slipsFor = (spec: FieldSpec): { name: string; factor: number; suffix?: string }[] => {
    const down = spec.plausible!.min > 0;
    switch (spec.unit) {
      case 'V':
        return [
          ...(down ? [{ name: 'mV for V', factor: 1e-3 }] : []),
          ...(spec.measure === 'rms' ? [{ name: 'peak for rms', factor: 1, suffix: 'pk' }] : []),
        ];
      case 'A':
        return down ? [{ name: 'mA for A', factor: 1e-3 }] : [];
      case 'F':
        return [
          { name: 'nF for µF', factor: 1e-3 },
          { name: 'mF for µF', factor: 1e3 },
        ];
      case 'Ω':
        return [...(down ? [{ name: 'k for M', factor: 1e-3 }] : []), { name: 'M for k', factor: 1e3 }];
      default:
        return [];
    }
  };

  const table: { kind: string; path: string; slip: string; typed: string }[] = [];
  for (const kind of RECKONER_KINDS) {
    for (const { spec, path, value } of numericFields(kind)) {
      if (typeof value !== 'string') continue; // only fields the example types
      const typical = runReckoner(kind, TYPICAL_INPUTS[kind]);
      if (!typical.ok) continue;
      const intended = (typical.input as Record<string, unknown>) && readPath(typical.input, path);
      if (typeof intended !== 'number' || intended === 0) continue;
      for (const s of slipsFor(spec)) {
        const v = intended * s.factor;
        table.push({
          kind,
          path,
          slip: s.name,
          typed: `${Number(v.toPrecision(6))} ${spec.unit}${s.suffix ?? ''}`,
        });
      }
    }
  }

  it('covers every reckoner with a volt, ampere, farad or ohm field', () => {
    const kinds = new Set(table.map((t) => t.kind));
    for (const k of [
      'mains-fuse',
      'peak-no-load',
      'loaded-bplus',
      'dropper-ladder',
      'bleeder',
      'heater-budget',
    ])
      expect(kinds).toContain(k);
    expect(table.length).toBeGreaterThan(25);
  });

  it.each(table)('$kind $path: $slip ($typed) is refused or cautioned by name', ({ kind, path, typed }) => {
    const input = clone(TYPICAL_INPUTS[kind]!);
    setPath(input, path, typed);
    const r = runReckoner(kind, input);
    if (r.ok) {
      expect(
        r.cautions.some((c) => c.code === 'implausible-input' && c.field === path),
        JSON.stringify(r.cautions.map((c) => c.code)),
      ).toBe(true);
    } else {
      expect(
        r.errors.some(
          (e) => e.field === path || e.field.startsWith(`${path}`) || e.field === path.split('.')[0],
        ),
      ).toBe(true);
    }
  });
});

function readPath(obj: unknown, path: string): unknown {
  return path
    .split('.')
    .reduce<unknown>(
      (o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined),
      obj,
    );
}

describe('no silent fallbacks', () => {
  it('a 300 mV winding is refused or cautioned, never a 0 V no-load DC', () => {
    const r = runReckoner('peak-no-load', { ...TYPICAL_INPUTS['peak-no-load'], windingVoltage: '300 mV' });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors[0]).toMatchObject({
        field: 'windingVoltage',
        reason: expect.stringMatching(/no more than the rectifier drop/),
      });
  });

  it('a peak below a valve rectifier’s drop is refused [derived: no-load DC = V_peak − drop, docs/references.md §2]', () => {
    // 10 V rms → 14.1 V peak, below a 20 V valve drop.
    const r = runReckoner('peak-no-load', {
      ...TYPICAL_INPUTS['peak-no-load'],
      windingVoltage: '10 V',
      rectifier: 'valve',
      valveDrop: '20 V',
    });
    expect(r.ok).toBe(false);
  });

  it('"47u" for a fitted resistor (47 µΩ) is refused', () => {
    const input = clone(TYPICAL_INPUTS['dropper-ladder']!);
    (input.stages as Record<string, unknown>[])[0]!.fittedResistance = '47u';
    const r = runReckoner('dropper-ladder', input);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]!.field).toBe('stages.0.fittedResistance');
  });

  it('a 1 mΩ bleeder is cautioned, and its kilowatt-rated part suggestion named as impossible [P = V²/R, docs/references.md §5]', () => {
    const r = runReckoner('bleeder', { ...TYPICAL_INPUTS.bleeder, bleederResistance: '1m' });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.cautions.map((c) => c.code)).toContain('implausible-input');
    // 450² / 1e-3 = 2.0e8 W
    expect(
      r.cautions.some((c) => c.code === 'implausible-result' && /Bleeder dissipation/.test(c.message)),
    ).toBe(true);
  });

  it('a ladder drawing 10 A is cautioned', () => {
    const input = clone(TYPICAL_INPUTS['dropper-ladder']!);
    (input.stages as Record<string, unknown>[])[0]!.current = '10 A';
    delete (input.stages as Record<string, unknown>[])[0]!.fittedResistance;
    const r = runReckoner('dropper-ladder', input);
    if (r.ok) expect(r.cautions.map((c) => c.code)).toContain('implausible-input');
    else expect(r.errors[0]!.field).toMatch(/stages\.0/);
  });

  it('an expected value of 1e308 is a field message, not an internal error', () => {
    const r = runReckoner('reading-tolerance', { ...TYPICAL_INPUTS['reading-tolerance'], expected: 1e308 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]!.field).toBe('expected');
      expect(r.errors[0]!.reason).not.toMatch(/internal/);
    }
  });
});

describe('parameters and references', () => {
  it('an empty field that follows the measured mains follows it: 280 V at 236 V on 230 V mains → 287.3 V [derived: V × actual ÷ nominal, docs/references.md §2]', () => {
    const inputs = { ...TYPICAL_INPUTS['peak-no-load'], mainsNominal: '', mainsActual: '' };
    const r = evaluateProcedure([{ name: 'pk', kind: 'peak-no-load', inputs }], {
      mainsNominal: 230,
      mainsVoltage: 236,
      mainsFrequency: 50,
    });
    const b = r.blocks[0]!;
    if (!b.ok) throw new Error(JSON.stringify(b.errors));
    expect(b.outputs.windingVoltage!.value).toBeCloseTo((280 * 236) / 230, 6);
    expect(b.sources.mainsActual).toEqual({ kind: 'param', param: 'mainsVoltage', followed: true });
  });

  it('a measured-mains field typed by hand stays put on the bench, and the block says so', () => {
    const inputs = { ...TYPICAL_INPUTS['peak-no-load'], mainsNominal: '', mainsActual: '230 V' };
    const r = evaluateProcedure([{ name: 'pk', kind: 'peak-no-load', inputs }], {
      mainsNominal: 230,
      mainsVoltage: 236,
      mainsFrequency: 50,
    });
    const b = r.blocks[0]!;
    if (!b.ok) throw new Error(JSON.stringify(b.errors));
    expect(b.outputs.windingVoltage!.value).toBeCloseTo(280, 9);
    expect(b.cautions).toContainEqual(
      expect.objectContaining({ code: 'parameter-typed', field: 'mainsActual', level: 'warning' }),
    );
  });

  it('every field that declares a parameter names one that exists, with the same unit and measure', () => {
    for (const def of listReckoners()) {
      eachField(def.fields, {}, (spec) => {
        if (!spec.follows) return;
        expect(['mainsNominal', 'mainsVoltage', 'mainsFrequency']).toContain(spec.follows);
        expect(spec.unit).toBe(spec.follows === 'mainsFrequency' ? 'Hz' : 'V');
        if (spec.unit === 'V') expect(spec.measure).toBe('rms');
      });
    }
  });

  it('a reference from an ampere output into a volt field is refused', () => {
    const r = evaluateProcedure([
      { name: 'bplus', kind: 'loaded-bplus', inputs: TYPICAL_INPUTS['loaded-bplus']! },
      {
        name: 'bleed',
        kind: 'bleeder',
        inputs: { ...TYPICAL_INPUTS.bleeder, chargedVoltage: { ref: 'bplus.windingRmsCurrent' } },
      },
    ]);
    const b = r.blocks[1]!;
    expect(b.ok).toBe(false);
    if (!b.ok)
      expect(b.errors[0]).toMatchObject({
        field: 'chargedVoltage',
        reason: expect.stringMatching(/A rms.*takes V DC/),
      });
  });

  it('a peak output into an rms field is refused; a DC output into a DC field is accepted', () => {
    const r = evaluateProcedure([
      { name: 'bplus', kind: 'loaded-bplus', inputs: TYPICAL_INPUTS['loaded-bplus']! },
      {
        name: 'again',
        kind: 'loaded-bplus',
        inputs: { ...TYPICAL_INPUTS['loaded-bplus'], windingVoltage: { ref: 'bplus.peakVoltage' } },
      },
      {
        name: 'bleed',
        kind: 'bleeder',
        inputs: { ...TYPICAL_INPUTS.bleeder, chargedVoltage: { ref: 'bplus.noLoadDc' } },
      },
    ]);
    expect(r.blocks[1]!.ok).toBe(false);
    expect(r.blocks[2]!.ok).toBe(true);
  });

  it('a procedure parameter in volts cannot feed a field in hertz', () => {
    const r = evaluateProcedure(
      [
        {
          name: 'b',
          kind: 'loaded-bplus',
          inputs: { ...TYPICAL_INPUTS['loaded-bplus'], mainsFrequency: { param: 'mainsVoltage' } },
        },
      ],
      {
        mainsVoltage: 230,
      },
    );
    expect(r.blocks[0]!.ok).toBe(false);
  });
});
