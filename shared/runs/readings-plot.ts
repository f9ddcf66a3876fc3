import type { EntryView, RunStep } from '../schemas/runs';
import { formatNumber } from '../units/format';
import { MARK_WORDS } from './marks';

/**
 * The run sheet's plot of readings against their bands, as data: each measured reading's deviation
 * from its expected value in percent, beside its own band in percent. The page, its table alternative
 * and the PDF draw this; the figures are the ones the readings table shows.
 */
export const DEVIATION_AXIS_LABEL = 'Deviation from expected (%)';

export interface PlotReading {
  stepId: string;
  position: number;
  label: string;
  /** (measured − expected) ÷ |expected| × 100: the table's deviation percentage. */
  deviation: number;
  /** The band's edges on the same scale. */
  low: number;
  high: number;
  /** From the recorded check (checkReading), not worked out again here. */
  out: boolean;
  /** The same figures as words, for the table alternative: "+2.4 %", "−5 … +5 %", "out of band". */
  text: { deviation: string; band: string; mark: string };
}

export interface ReadingsPlot {
  title: string;
  /** One paragraph saying what the plot shows, for its accessible description. */
  description: string;
  axisLabel: string;
  readings: PlotReading[];
  /** Measured readings the plot cannot place, with why. */
  notPlotted: string[];
  caption: string;
}

const tidy = (x: number) => Number(x.toPrecision(12));
const pct = (x: number) => `${x > 0 ? '+' : ''}${formatNumber(x, 3)} %`;
const name = (step: RunStep) => `${step.position}. ${step.text}`;

export function readingsPlot(steps: RunStep[], entries: EntryView[]): ReadingsPlot {
  const byStep = new Map(entries.map((e) => [e.stepId, e]));
  const readings: PlotReading[] = [];
  const notPlotted: string[] = [];
  for (const step of steps) {
    const e = byStep.get(step.id);
    if (step.kind !== 'reading' || e?.measured == null) continue;
    if (e.expected === null || e.low === null || e.high === null || e.within === null) {
      notPlotted.push(`${name(step)}: no expected value or band`);
      continue;
    }
    if (e.expected === 0 || e.deviationPercent === null) {
      notPlotted.push(`${name(step)}: the expected value is zero, so there is no percentage`);
      continue;
    }
    const scale = Math.abs(e.expected) / 100;
    const low = tidy((e.low - e.expected) / scale);
    const high = tidy((e.high - e.expected) / scale);
    readings.push({
      stepId: step.id,
      position: step.position,
      label: step.text,
      deviation: e.deviationPercent,
      low,
      high,
      out: !e.within,
      text: {
        deviation: pct(e.deviationPercent),
        band: `${pct(low)} … ${pct(high)}`,
        mark: MARK_WORDS[e.within ? 'within' : 'out'],
      },
    });
  }
  const out = readings.filter((r) => r.out);
  const description =
    readings.length === 0
      ? 'No reading with a band has been measured yet.'
      : `${readings.length} ${readings.length === 1 ? 'reading' : 'readings'} plotted as the deviation from the ` +
        `expected value in percent, each against its own tolerance band. ` +
        (out.length
          ? `Out of band: ${out.map((r) => `${r.position}. ${r.label} (${r.text.deviation}, band ${r.text.band})`).join('; ')}.`
          : 'Every plotted reading is within its band.');
  return {
    title: 'Readings against their bands',
    description,
    axisLabel: DEVIATION_AXIS_LABEL,
    readings,
    notPlotted,
    caption:
      'Each row is one reading: the shaded bar is its tolerance band, the line at 0 % its expected value. ' +
      'A reading beyond the axis is drawn at the edge with an arrow; its figure is in the table.',
  };
}
