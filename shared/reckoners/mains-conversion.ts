/**
 * Mains conversion: a unit built for one mains moved to another (120 V / 60 Hz ↔ 230 V / 50 Hz).
 * Picks the primary connection, scales the secondaries and the fuse, and says what happens to the
 * core flux when the frequency falls (B ∝ V / f, the transformer EMF equation).
 */
import { FUSE_SERIES, nextFuseRating } from '../standards/fuses';
import { formatNumber, formatQuantity } from '../units/format';
import { compact, LOCAL_CODES } from './cautions';
import { ReckonerInputError } from './errors';
import { defineInputs, optionalQuantity, quantity, rows, select, text, type InputOf } from './fields';
import { n, q, s, SRC } from './outputs';
import type { Caution, ReckonerDefinition, ReckonerResult } from './types';

const mains = (label: string, extra: { default?: number; follows?: 'mainsNominal'; help?: string } = {}) =>
  quantity('V rms', { label, min: 50, max: 300, plausible: { min: 90, max: 260 }, ...extra });
const frequency = (label: string, extra: { default: number; follows?: 'mainsFrequency' }) =>
  quantity('Hz', { label, min: 16, max: 440, plausible: { min: 45, max: 65 }, ...extra });

const shape = {
  fromVoltage: mains('Mains the unit was built for', { default: 120 }),
  fromFrequency: frequency('Frequency it was built for', { default: 60 }),
  toVoltage: mains('Mains it will run on', { default: 230, follows: 'mainsNominal' }),
  toFrequency: frequency('Frequency it will run on', { default: 50, follows: 'mainsFrequency' }),
  connections: rows(
    {
      label: text({ label: 'Connection' }),
      volts: quantity('V rms', {
        label: 'Rated primary voltage',
        min: 1,
        max: 500,
        plausible: { min: 90, max: 260 },
      }),
    },
    {
      label: 'Primary connections available',
      help: 'Each tap or wiring of the primary and the mains it is rated for, e.g. dual primaries in parallel (120 V) and in series (240 V).',
      minRows: 1,
      maxRows: 10,
    },
  ),
  fuseRating: quantity('A rms', {
    label: 'Mains fuse at the old mains',
    min: 1e-3,
    max: 30,
    plausible: { min: 0.05, max: 10 },
  }),
  series: select({
    label: 'Fuse series',
    options: [
      { value: 'iec', label: FUSE_SERIES.iec.label },
      { value: 'north-american', label: FUSE_SERIES['north-american'].label },
    ],
    default: 'iec',
  }),
  secondaryVoltage: optionalQuantity('V rms', {
    label: 'A secondary to follow',
    min: 1e-3,
    max: 3000,
    plausible: { min: 2, max: 1500 },
    help: 'Its rated figure at the old mains, e.g. the high-voltage winding; shows what it becomes.',
  }),
};

const { schema: inputs, fields } = defineInputs(shape);
export type MainsConversionInput = InputOf<typeof shape>;

/** How far a connection is from the mains, as a ratio either way: |ln(V_mains / V_rated)|. */
const mismatch = (mainsVolts: number, rated: number) => Math.abs(Math.log(mainsVolts / rated));

/** The connection nearest the new mains by ratio; on a tie the higher one (secondaries and flux lower). */
export function chooseConnection<T extends { volts: number }>(
  connections: readonly T[],
  mainsVolts: number,
): T {
  return connections.reduce((best, c) => {
    const d = mismatch(mainsVolts, c.volts) - mismatch(mainsVolts, best.volts);
    return d < -1e-12 || (Math.abs(d) <= 1e-12 && c.volts > best.volts) ? c : best;
  });
}

/** Core flux relative to its design: B ∝ V / f (EMF equation E = 4.44 f N A B) [derived]. */
export function fluxRatio(volts: number, ratedVolts: number, hz: number, ratedHz: number): number {
  return volts / ratedVolts / (hz / ratedHz);
}

function compute(input: MainsConversionInput): ReckonerResult {
  const chosen = chooseConnection(input.connections, input.toVoltage);
  const k = input.toVoltage / chosen.volts;
  const flux = fluxRatio(input.toVoltage, chosen.volts, input.toFrequency, input.fromFrequency);
  const fuseExact = (input.fuseRating * input.fromVoltage) / input.toVoltage;
  const fuse = nextFuseRating(fuseExact, input.series);
  if (fuse === null)
    throw new ReckonerInputError('fuseRating', 'scales above the largest rating in the chosen fuse series');
  const name = chosen.label
    ? `${chosen.label} (${formatQuantity(chosen.volts, 'V')})`
    : formatQuantity(chosen.volts, 'V');
  const outputs: ReckonerResult['outputs'] = {
    connection: s(name, 'Primary connection to use', 'The available connection nearest the new mains.'),
    secondaryRatio: n(
      100 * k,
      'Secondaries at the new mains, % of rated',
      `${formatQuantity(input.toVoltage, 'V')} ÷ ${formatQuantity(chosen.volts, 'V')}: every secondary, heaters included, scales with it.`,
      SRC.derived,
    ),
    fluxChange: n(
      100 * (flux - 1),
      'Core flux change, %',
      `B ∝ V ÷ f: (${formatNumber(k, 4)}) × ${formatQuantity(input.fromFrequency, 'Hz')} ÷ ${formatQuantity(input.toFrequency, 'Hz')}, against the transformer’s design.`,
      'derived from the transformer EMF equation E = 4.44 f N A B',
    ),
    fuseExact: q(
      fuseExact,
      'A rms',
      'Fuse current scaled to the new mains',
      `The old fuse × ${formatQuantity(input.fromVoltage, 'V')} ÷ ${formatQuantity(input.toVoltage, 'V')}: the same power draws less current at a higher voltage.`,
      SRC.derived,
    ),
    newFuse: q(
      fuse,
      'A rms',
      'New fuse rating',
      `Next standard rating at or above, from the ${FUSE_SERIES[input.series].label}; keep the old fuse type (time-delay stays time-delay).`,
      FUSE_SERIES[input.series].source,
    ),
    rippleFrequency: q(
      2 * input.toFrequency,
      'Hz',
      'Full-wave ripple frequency',
      'Twice the new mains.',
      SRC.derived,
    ),
    rippleChange: n(
      100 * (input.fromFrequency / input.toFrequency - 1),
      'Capacitor-input ripple change, %',
      'Ripple ∝ 1 ÷ f for the same load and reservoir.',
      SRC.derived,
    ),
  };
  if (input.secondaryVoltage !== undefined) {
    outputs.secondaryAfter = q(
      input.secondaryVoltage * k,
      'V rms',
      'That secondary at the new mains',
      'Its rated figure × the secondary scaling.',
      SRC.derived,
    );
  }
  return { outputs };
}

function cautions(input: MainsConversionInput, result: ReckonerResult): Caution[] {
  const flux = 1 + Number(result.outputs.fluxChange!.value) / 100;
  const k = Number(result.outputs.secondaryRatio!.value) / 100;
  return compact([
    {
      level: 'danger',
      code: 'mains-wiring',
      message:
        'Rewiring a primary works on mains conductors: unplug the unit, discharge the filter capacitors, and check the new wiring and the fuse marking before the first power-up through a current limiter.',
    },
    flux > 1.05 && {
      level: 'warning',
      code: 'flux-rise',
      field: 'toFrequency',
      message: `The core carries about ${formatNumber(100 * (flux - 1), 2)} % more flux than it was built for (a ${formatQuantity(input.fromFrequency, 'Hz')} transformer on ${formatQuantity(input.toFrequency, 'Hz')}): it may saturate, draw a large magnetising current, run hot and hum. Use a connection rated above the mains, or a transformer built for ${formatQuantity(input.toFrequency, 'Hz')}.`,
      source: 'derived from the transformer EMF equation E = 4.44 f N A B',
    },
    k > 1.05 && {
      level: 'warning',
      code: 'secondaries-high',
      field: 'connections',
      message: `Every secondary runs ${formatNumber(100 * (k - 1), 2)} % above its rating: heaters, B+ and capacitor voltages rise with it.`,
    },
    Math.abs(Math.log(k)) > Math.log(1.1) && {
      level: 'warning',
      code: 'no-suitable-connection',
      field: 'connections',
      message: `No connection is within 10 % of ${formatQuantity(input.toVoltage, 'V')}: use a step-up or step-down transformer instead of rewiring.`,
    },
    LOCAL_CODES,
  ]);
}

export const mainsConversion: ReckonerDefinition<MainsConversionInput> = {
  kind: 'mains-conversion',
  label: 'Mains conversion',
  summary:
    'Moving a unit between mains voltages and frequencies: the primary connection, the secondaries, the core flux, the new fuse and the ripple.',
  inputs,
  fields,
  compute,
  cautions,
  keyOutputs: ['connection', 'secondaryRatio', 'fluxChange', 'newFuse'],
};
