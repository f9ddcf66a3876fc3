import { z } from 'zod';
import {
  READING_MEASURES,
  READING_UNITS,
  readingUnitSpec,
  takesMeasure,
} from '../../reckoners/reading-units';
import { blockId, defineNode, esc, shortText, yesNo } from './define';

/** A measurement step: what, where, meter range, unit, expected value and tolerance. */
export const readingAttrs = z
  .object({
    id: blockId,
    label: shortText(200),
    testPoint: shortText(120),
    meterRange: shortText(60),
    unit: z.enum(READING_UNITS),
    /** For volts and amps: what the meter is set to read. Documents saved before it existed are upgraded on load. */
    measure: z.enum(READING_MEASURES).nullable().optional(),
    /** A literal as typed ("350 V") or a reckoner output ("bplus.averageDc"). */
    expected: z.union([
      z.object({ literal: shortText(40) }).strict(),
      z.object({ ref: shortText(80) }).strict(),
    ]),
    /**
     * For a typed expected value: true scales it with measured ÷ nominal mains (a winding, a rail fed
     * from one); false states it does not (a regulated rail, the mains itself); absent is unstated.
     */
    followsMains: z.boolean().nullable().optional(),
    /** Tolerance as people write it: "±5 %", "±10 V", "-5 %/+10 %". Parsed by the reading-tolerance reckoner. */
    tolerance: shortText(40),
    /** Taken on a powered unit. Absent: live when the unit is V, A, W or Hz (see isLiveReading). */
    live: yesNo(),
    /** A hold point: out of band here, the bench run stops until a senior decides (continue or abandon). */
    holdPoint: yesNo(),
  })
  .strict()
  .superRefine((r, ctx) => {
    if (r.measure != null && !takesMeasure(r.unit)) {
      ctx.addIssue({
        code: 'custom',
        path: ['measure'],
        message: `a reading in ${r.unit} takes no measure (rms, peak, DC are for volts and amps)`,
      });
    }
  });
export type ReadingAttrs = z.infer<typeof readingAttrs>;

/**
 * Whether a reading is live work. Volts, amps, watts and hertz are read on a powered unit, so a
 * reading in them is live unless the author marks it otherwise (a residual voltage on a switched-off
 * unit); resistance, capacitance, time and percentages are read cold unless marked live.
 */
export const isLiveReading = (r: Pick<ReadingAttrs, 'unit' | 'live'>): boolean =>
  r.live ?? readingUnitSpec(r.unit)?.live ?? false;

type ReadingMeasure = NonNullable<ReadingAttrs['measure']>;

/** The measure a reading states, or the one its meter range implies. Undefined for units without one. */
export function readingMeasure(
  r: Pick<ReadingAttrs, 'unit' | 'measure' | 'meterRange'>,
): ReadingMeasure | undefined {
  if (!takesMeasure(r.unit)) return undefined;
  if (r.measure) return r.measure;
  if (/\bAC\b|~|\brms\b/i.test(r.meterRange)) return 'rms';
  if (/\bp-?p\b/i.test(r.meterRange)) return 'peak-to-peak';
  return 'dc';
}

/** What a hold point means, in one sentence for the reader, the editor and the bench. */
export const HOLD_POINT_WORDS =
  'out of band here, the bench run stops until a reviewer or admin decides to continue or abandon';

export const reading = defineNode({
  attrs: readingAttrs,
  content: 'none',
  label: 'reading',
  many: 'readings',
  defaults: {
    id: '',
    label: '',
    testPoint: '',
    meterRange: '',
    unit: 'V',
    measure: null,
    expected: { literal: '' },
    followsMains: null,
    tolerance: '',
    // Null: live by its unit (V, A, W, Hz); true or false as the author marks it.
    live: null,
    holdPoint: null,
  },
  inserted: { measure: 'dc', tolerance: '±10 %' },
  text: (a) => [
    `${a.holdPoint ? 'Hold point reading' : 'Reading'}${a.live === true ? ' (live)' : ''}: ${a.label} at ${a.testPoint} (${a.meterRange}), tolerance ${a.tolerance}`,
  ],
  html: (a, { reading }) => {
    const r = reading(a.id);
    const band = r?.bandText ?? `not resolved: ${r?.error ?? 'unknown'}`;
    const live = isLiveReading(a) ? '<tr><th>Live work</th><td>yes</td></tr>' : '';
    const hold = a.holdPoint ? `<tr><th>Hold point</th><td>${esc(HOLD_POINT_WORDS)}</td></tr>` : '';
    const row = (th: string, td: string) => `<tr><th>${th}</th><td>${td}</td></tr>`;
    return `<table class="reading"><tbody>${row('Measure', esc(a.label))}${row('At', esc(a.testPoint))}${row('Meter range', esc(a.meterRange))}${row('Expected', `${esc(band)} (${esc(a.tolerance)})`)}${live}${hold}</tbody></table>`;
  },
  // A reading in volts or amps saved before measures existed gets one from its meter range, else DC.
  upgrade: (a) => {
    const measure = readingMeasure(a);
    return measure && a.measure !== measure ? { ...a, measure } : undefined;
  },
  step: (a, { reading, section, position }) => {
    const r = reading(a.id);
    if (!r) return null;
    return {
      id: r.id,
      kind: 'reading',
      position,
      section,
      text: r.label,
      reading: {
        testPoint: r.testPoint,
        meterRange: r.meterRange,
        unit: r.unit,
        ...(r.measure && r.measure !== 'scalar' ? { measure: r.measure } : {}),
        toleranceText: r.toleranceText,
        expectedSource: r.expectedSource,
        expected: r.expected,
        low: r.low,
        high: r.high,
        bandText: r.bandText,
        ...(r.error ? { error: r.error } : {}),
      },
      ...(isLiveReading(a) ? { live: true } : {}),
      ...(a.holdPoint ? { holdPoint: true } : {}),
    };
  },
});
