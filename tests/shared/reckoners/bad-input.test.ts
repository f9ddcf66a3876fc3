/**
 * Every reckoner rejects negative, zero-where-impossible, missing and non-numeric inputs with an
 * error that names the field — never NaN, Infinity or a silent clamp.
 */
import { describe, expect, it } from 'vitest';
import { runReckoner, validateInputs } from '../../../shared/reckoners/validate';
import { RECKONER_KINDS } from '../../../shared/reckoners/registry';

type Case = {
  kind: string;
  valid: Record<string, unknown>;
  required: string[];
  positive: string[];
  nonNegative?: string[];
};

const cases: Case[] = [
  {
    kind: 'mains-fuse',
    valid: {
      windings: [
        { volts: 250, amps: 0.1 },
        { volts: 6.3, amps: 3 },
      ],
      mainsVoltage: 230,
    },
    required: ['windings.0.volts', 'windings.1.amps'],
    positive: ['windings.0.volts', 'windings.1.amps', 'mainsVoltage', 'efficiency', 'margin'],
  },
  {
    kind: 'peak-no-load',
    valid: { windingVoltage: 300, mainsActual: 240 },
    required: ['windingVoltage'],
    positive: ['windingVoltage', 'mainsNominal', 'mainsActual'],
    nonNegative: ['diodeDrop'],
  },
  {
    kind: 'loaded-bplus',
    valid: { windingVoltage: 300, sourceResistance: 80, reservoir: 47e-6, loadCurrent: 0.08 },
    required: ['windingVoltage', 'sourceResistance', 'reservoir', 'loadCurrent'],
    positive: ['windingVoltage', 'sourceResistance', 'reservoir', 'mainsFrequency'],
    nonNegative: ['loadCurrent', 'diodeDrop'],
  },
  {
    kind: 'dropper-ladder',
    valid: { startVoltage: 350, stages: [{ targetVoltage: 300, current: 0.02, capacitance: 47e-6 }] },
    required: ['startVoltage', 'stages.0.targetVoltage', 'stages.0.current', 'stages.0.capacitance'],
    positive: ['startVoltage', 'stages.0.targetVoltage', 'stages.0.capacitance', 'mainsFrequency'],
    nonNegative: ['stages.0.current'],
  },
  {
    kind: 'choke-input',
    valid: { windingVoltage: 350, chokeInductance: 10, chokeResistance: 100, loadCurrent: 0.1 },
    required: ['windingVoltage', 'chokeInductance', 'chokeResistance', 'loadCurrent'],
    positive: ['windingVoltage', 'chokeInductance', 'loadCurrent', 'mainsFrequency'],
    nonNegative: ['chokeResistance', 'windingResistance', 'diodeDrop'],
  },
  {
    kind: 'mains-conversion',
    valid: { fromVoltage: 120, toVoltage: 230, connections: [{ volts: 120 }, { volts: 240 }], fuseRating: 1 },
    required: ['connections.0.volts', 'fuseRating'],
    positive: [
      'fromVoltage',
      'toVoltage',
      'fromFrequency',
      'toFrequency',
      'connections.1.volts',
      'fuseRating',
    ],
  },
  {
    kind: 'switch-on-surge',
    valid: { windingVoltage: 300, secondaryResistance: 50, primaryResistance: 20, reservoir: 100e-6 },
    required: ['windingVoltage', 'reservoir'],
    positive: ['windingVoltage', 'mainsVoltage', 'reservoir', 'mainsFrequency'],
    nonNegative: ['secondaryResistance', 'primaryResistance', 'diodeDrop'],
  },
  {
    kind: 'transformer-loading',
    valid: { windings: [{ volts: 300, amps: 0.1, resistance: 80 }], primaryResistance: 12 },
    required: ['windings.0.volts', 'windings.0.amps'],
    positive: ['mainsVoltage', 'efficiency', 'windings.0.volts'],
    nonNegative: ['windings.0.amps', 'windings.0.resistance', 'primaryResistance'],
  },
  {
    kind: 'rectifier-substitution',
    valid: { windingVoltage: 350, fromValveDrop: 45, loadCurrent: 0.15 },
    required: ['windingVoltage', 'loadCurrent'],
    positive: ['windingVoltage', 'loadCurrent'],
    nonNegative: ['diodeDrop', 'highMains', 'outputWarmUp'],
  },
  {
    kind: 'part-ratings',
    valid: { windingVoltage: 300, sourceResistance: 80, loadCurrent: 0.1, reservoir: 47e-6 },
    required: ['windingVoltage', 'sourceResistance', 'loadCurrent', 'reservoir'],
    positive: ['windingVoltage', 'sourceResistance', 'reservoir', 'mainsFrequency'],
    nonNegative: ['loadCurrent', 'highMains', 'diodeDrop'],
  },
  {
    kind: 'bleeder',
    valid: { capacitance: 100e-6, chargedVoltage: 450, bleederResistance: 22000 },
    required: ['capacitance', 'chargedVoltage'],
    positive: ['capacitance', 'chargedVoltage', 'bleederResistance', 'threshold', 'targetTime'],
  },
  {
    kind: 'heater-budget',
    valid: { windingCurrent: 3, heaters: [{ volts: 6.3, amps: 0.3, count: 4 }] },
    required: ['windingCurrent', 'heaters.0.volts', 'heaters.0.amps'],
    positive: ['windingVoltage', 'windingCurrent', 'heaters.0.volts', 'heaters.0.amps', 'heaters.0.count'],
  },
  {
    kind: 'reading-tolerance',
    valid: { unit: 'V', expected: 325, tolerance: { kind: 'percent', percent: 5 }, measured: 320 },
    required: ['expected', 'tolerance'],
    positive: [],
    nonNegative: ['tolerance.percent'],
  },
];

function setPath(obj: Record<string, unknown>, path: string, value: unknown): Record<string, unknown> {
  const copy = structuredClone(obj);
  const keys = path.split('.');
  let cur: Record<string, unknown> = copy;
  for (const k of keys.slice(0, -1)) cur = cur[k] as Record<string, unknown>;
  const last = keys[keys.length - 1]!;
  if (value === undefined) delete cur[last];
  else cur[last] = value;
  return copy;
}

function expectFieldError(kind: string, input: unknown, field: string, reason?: RegExp) {
  const r = runReckoner(kind, input);
  expect(r.ok, `${kind} should reject ${JSON.stringify(input)}`).toBe(false);
  if (r.ok) return;
  const e = r.errors.find((x) => x.field === field);
  expect(e, `${kind}: an error naming "${field}" in ${JSON.stringify(r.errors)}`).toBeDefined();
  expect(e!.reason.length).toBeGreaterThan(3);
  if (reason) expect(e!.reason).toMatch(reason);
}

describe('bad input, every reckoner', () => {
  it('covers every registered reckoner', () => {
    expect(cases.map((c) => c.kind).sort()).toEqual([...RECKONER_KINDS].sort());
  });

  for (const c of cases) {
    describe(c.kind, () => {
      it('accepts its baseline input', () => {
        expect(runReckoner(c.kind, c.valid).ok).toBe(true);
      });
      it.each(c.required)('missing %s → "is required"', (field) => {
        expectFieldError(c.kind, setPath(c.valid, field, undefined), field, /required/);
      });
      it.each([...c.positive, ...(c.nonNegative ?? [])])('negative %s → field error', (field) => {
        expectFieldError(c.kind, setPath(c.valid, field, -1), field);
      });
      it.each(c.positive)('zero %s → field error', (field) => {
        expectFieldError(c.kind, setPath(c.valid, field, 0), field);
      });
      it.each([...c.positive, ...(c.nonNegative ?? []), ...c.required.filter((f) => f !== 'tolerance')])(
        'non-numeric %s → field error',
        (field) => {
          expectFieldError(c.kind, setPath(c.valid, field, 'lots'), field, /not a number|cannot read/);
          expectFieldError(c.kind, setPath(c.valid, field, Number.NaN), field, /finite/);
          expectFieldError(c.kind, setPath(c.valid, field, Infinity), field, /finite/);
          expectFieldError(c.kind, setPath(c.valid, field, true), field);
        },
      );
      it('rejects a non-object', () => {
        const r = validateInputs(c.kind, 42);
        expect(r.ok).toBe(false);
      });
    });
  }

  it('names an unknown select option and lists the choices', () => {
    expectFieldError(
      'loaded-bplus',
      {
        windingVoltage: 300,
        sourceResistance: 80,
        reservoir: 47e-6,
        loadCurrent: 0.08,
        rectifier: 'selenium',
      },
      'rectifier',
      /one of/,
    );
  });

  it('rejects an out-of-range value instead of clamping it', () => {
    expectFieldError(
      'mains-fuse',
      { windings: [{ volts: 250, amps: 0.1 }], mainsVoltage: '2 kV' },
      'mainsVoltage',
      /at most/,
    );
    expectFieldError(
      'heater-budget',
      { windingCurrent: 3, heaters: [{ volts: 6.3, amps: 0.3, count: 1.5 }] },
      'heaters.0.count',
      /whole/,
    );
  });

  it('rejects a wrong unit in a typed value', () => {
    expectFieldError(
      'bleeder',
      { capacitance: '100 V', chargedVoltage: 450 },
      'capacitance',
      /expected a value in F/,
    );
  });

  it('rejects a tolerance that is neither text nor a tolerance object', () => {
    expectFieldError('reading-tolerance', { expected: 325, tolerance: 'lots' }, 'tolerance');
    expectFieldError('reading-tolerance', { expected: 325, tolerance: 5 }, 'tolerance');
    expectFieldError(
      'reading-tolerance',
      { expected: 325, tolerance: { kind: 'percent' } },
      'tolerance.percent',
      /required/,
    );
    expectFieldError(
      'reading-tolerance',
      { expected: 325, tolerance: { kind: 'roughly', percent: 5 } },
      'tolerance.kind',
    );
  });

  it('rejects values below a sensible floor (no tiny-but-positive underflow)', () => {
    expectFieldError('bleeder', { capacitance: 5e-324, chargedVoltage: 450 }, 'capacitance', /at least 1 pF/);
  });

  it('reports an unknown kind', () => {
    expect(validateInputs('flux-capacitor', {})).toEqual({
      ok: false,
      errors: [{ field: 'kind', reason: 'unknown reckoner "flux-capacitor"' }],
    });
  });
});
