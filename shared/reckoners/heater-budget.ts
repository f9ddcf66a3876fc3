/** Heater budget: valve heaters against a winding's current rating, in parallel or as one series string. */
import { formatNumber, formatQuantity } from '../units/format';
import { compact, LOCAL_CODES } from './cautions';
import { defineInputs, integer, quantity, rows, select, text, type InputOf } from './fields';
import { q, SRC } from './outputs';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const shape = {
  windingVoltage: quantity('V rms', {
    label: 'Heater winding voltage',
    default: 6.3,
    min: 1e-3,
    max: 500,
    plausible: { min: 1, max: 150 },
  }),
  windingCurrent: quantity('A rms', {
    label: 'Heater winding rating',
    min: 1e-6,
    max: 100,
    plausible: { min: 0.05, max: 20 },
  }),
  arrangement: select({
    label: 'Heaters wired',
    options: [
      { value: 'parallel', label: 'In parallel across the winding' },
      { value: 'series', label: 'As one series string' },
    ],
    default: 'parallel',
  }),
  heaters: rows(
    {
      label: text({ label: 'Valve' }),
      volts: quantity('V rms', {
        label: 'Heater voltage',
        min: 1e-3,
        max: 200,
        plausible: { min: 1, max: 120 },
      }),
      amps: quantity('A rms', {
        label: 'Heater current',
        min: 1e-6,
        max: 20,
        plausible: { min: 0.01, max: 5 },
      }),
      count: integer({ label: 'How many', default: 1, min: 1, max: 50 }),
    },
    { label: 'Heaters', minRows: 1, maxRows: 30 },
  ),
  nearLimit: quantity('%', {
    label: 'Warn above',
    default: 90,
    min: 50,
    max: 100,
    plausible: { min: 70, max: 100 },
    help: 'Percent of the winding rating at which the budget is flagged as close.',
  }),
};

const { schema: inputs, fields } = defineInputs(shape);
export type HeaterBudgetInput = InputOf<typeof shape>;

/** Heater supply tolerance ± 10 % (from memory: amateur radio handbooks). */
export const HEATER_TOLERANCE = 0.1;

function compute(input: HeaterBudgetInput): ReckonerResult {
  const series = input.arrangement === 'series';
  const heaterPower = input.heaters.reduce((sum, h) => sum + h.volts * h.amps * h.count, 0);
  const stringVolts = input.heaters.reduce((sum, h) => sum + h.volts * h.count, 0);
  // A series string runs at one current; if the rows disagree, budget for the largest.
  const current = series
    ? Math.max(...input.heaters.map((h) => h.amps))
    : input.heaters.reduce((sum, h) => sum + h.amps * h.count, 0);
  const percent = (current / input.windingCurrent) * 100;
  const outputs: ReckonerResult['outputs'] = {
    totalCurrent: q(
      current,
      'A rms',
      'Heater current',
      series ? 'One series string: the string current.' : 'Sum of heater currents × counts.',
      SRC.derived,
    ),
    windingVA: q(
      current * input.windingVoltage,
      'VA',
      'Winding load',
      'Winding voltage × heater current.',
      SRC.derived,
    ),
    heaterPower: q(heaterPower, 'W', 'Heater power', 'Σ heater volts × amps × count.', SRC.derived),
    percentOfRating: q(
      percent,
      '%',
      'Share of the winding rating',
      'Heater current ÷ winding rating × 100.',
      SRC.derived,
    ),
  };
  if (series) {
    outputs.stringVoltage = q(stringVolts, 'V rms', 'String voltage', 'Σ heater volts × count.', SRC.derived);
    if (input.windingVoltage > stringVolts) {
      const r = (input.windingVoltage - stringVolts) / current;
      outputs.dropperResistance = q(
        r,
        'Ω',
        'Series dropper',
        '(supply − string voltage) ÷ string current.',
        SRC.derived,
      );
      outputs.dropperDissipation = q(current * current * r, 'W', 'Dropper dissipation', 'I² R.', SRC.derived);
    }
  }
  return { outputs };
}

function cautions(input: HeaterBudgetInput, result: ReckonerResult): Caution[] {
  const percent = Number(result.outputs.percentOfRating!.value);
  const list: (Caution | false)[] = [
    percent > 100 && {
      level: 'warning',
      code: 'heater-overload',
      message: `The heaters draw ${formatNumber(percent)} % of the winding’s rating: the winding is overloaded and will run hot and low.`,
    },
    percent <= 100 &&
      percent >= input.nearLimit && {
        level: 'note',
        code: 'heater-near-limit',
        message: `The heaters draw ${formatNumber(percent)} % of the winding’s rating, close to its limit.`,
      },
  ];
  if (input.arrangement === 'parallel') {
    input.heaters.forEach((h, i) => {
      if (Math.abs(h.volts - input.windingVoltage) > HEATER_TOLERANCE * h.volts) {
        list.push({
          level: 'warning',
          code: 'heater-voltage',
          message: `Heater row ${i + 1}${h.label ? ` (${h.label})` : ''} is rated ${formatQuantity(h.volts, 'V')}, more than 10 % from the ${formatQuantity(input.windingVoltage, 'V')} winding.`,
          // From memory (docs/references.md §6 says so); the note on screen names the source only.
          source: 'heater supply within ± 10 % of rating (amateur radio handbooks)',
        });
      }
    });
  } else {
    const amps = input.heaters.map((h) => h.amps);
    if (Math.max(...amps) > Math.min(...amps) * 1.02) {
      list.push({
        level: 'warning',
        code: 'series-mismatch',
        message:
          'Heaters in one series string must share the same current rating; these differ, so some will be over- or under-run.',
      });
    }
    const stringVolts = Number(result.outputs.stringVoltage!.value);
    if (stringVolts > input.windingVoltage * (1 + 1e-9)) {
      list.push({
        level: 'warning',
        code: 'series-underrun',
        message: `The string needs ${formatQuantity(stringVolts, 'V')} but the supply is ${formatQuantity(input.windingVoltage, 'V')}: the heaters will be under-run.`,
      });
    }
  }
  return compact([...list, LOCAL_CODES]);
}

export const heaterBudget: ReckonerDefinition<HeaterBudgetInput> = {
  kind: 'heater-budget',
  label: 'Heater budget',
  summary: 'Total heater current and VA against the winding rating, in parallel or as a series string.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['totalCurrent', 'percentOfRating', 'dropperResistance'],
};
