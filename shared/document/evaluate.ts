/**
 * Evaluates a procedure document: every reckoner block (in dependency order, through the shared
 * registry) and every reading's expected band. The server stores the result as the revision's
 * snapshot; bench runs call it again with the measured mains; the editor calls it on each change.
 */
import {
  evaluateProcedure,
  getReckoner,
  parseTolerance,
  toleranceBand,
  type BlockResult,
  type ProcedureError,
} from '../reckoners';
import { readMeasured } from '../reckoners/measurement';
import { unitWithMeasure } from '../reckoners/measures';
import type { Measure } from '../reckoners/types';
import { formatQuantity } from '../units';
import { extractBlocks } from './extract';
import type { ProcedureParams } from './params';
import type { ProcedureDoc, ReadingAttrs } from './schema';
import { effectiveMeasure, upgradeDocument } from './upgrade';

/** A block's result as stored: with its id, section and the reckoner's label (so readers need no registry). */
export type BlockSnapshot = BlockResult & { id: string; section: string; label?: string };

export interface ResolvedReading {
  id: string;
  label: string;
  testPoint: string;
  meterRange: string;
  unit: string;
  /** rms, peak, peak-to-peak or dc for volts and amps; 'scalar' otherwise. */
  measure: Measure;
  section: string;
  toleranceText: string;
  /** A typed expected value: scaled with the mains (true), stated fixed (false), or not said. */
  followsMains?: boolean;
  /** Measured ÷ nominal mains applied to a typed expected value that follows the mains. */
  mainsRatio?: number;
  /** Where the expected value came from: a literal or "block.output" (for matching; not shown). */
  expectedSource: string;
  /** The same in words: the literal, or the result's label and its block ("B+ at node C, from the Loaded B+ block"). */
  expectedText?: string;
  expected: number | null;
  low: number | null;
  high: number | null;
  /** Printed band ("340 V … 360 V"), or null with error set. */
  bandText: string | null;
  error?: string;
}

export interface Snapshot {
  params: ProcedureParams;
  blocks: BlockSnapshot[];
  readings: ResolvedReading[];
  errors: ProcedureError[];
}

function expectedValue(
  reading: ReadingAttrs,
  measure: Measure,
  blocks: Map<string, BlockResult>,
  ratio: number,
): number {
  if ('literal' in reading.expected) {
    // Read as a bench value is read: the reading's unit and measure, within what a meter shows.
    const read = readMeasured(reading.expected.literal, reading.unit, measure);
    if (!read.ok) throw new Error(`the expected value ${read.reason}`);
    return reading.followsMains ? read.measured * ratio : read.measured;
  }
  const ref = reading.expected.ref;
  const dot = ref.indexOf('.');
  if (dot < 1) throw new Error('the expected value refers to no calculation; choose a result');
  const [name, key] = [ref.slice(0, dot), ref.slice(dot + 1)];
  const block = blocks.get(name);
  if (!block) throw new Error('the calculation its expected value comes from is not in this procedure');
  const of = `the ${blockLabel(block)} block`;
  if (!block.ok) throw new Error(`${of} has input problems, so its result has no value`);
  const out = block.outputs[key];
  if (!out) throw new Error(`${of} no longer gives the result its expected value comes from`);
  if (typeof out.value !== 'number') throw new Error(`“${out.label}” of ${of} is not a number`);
  if (out.unit !== reading.unit || out.measure !== measure) {
    throw new Error(
      `“${out.label}” of ${of} is in ${unitWithMeasure(out.unit || 'no unit', out.measure)}, but the reading is in ${unitWithMeasure(reading.unit, measure)}`,
    );
  }
  return out.value;
}

const blockLabel = (b: { kind: string }) => getReckoner(b.kind)?.label ?? 'calculation';

/** A reading's expected value in words: what was typed, or which result of which block. */
function expectedText(reading: ReadingAttrs, blocks: Map<string, BlockResult>): string {
  if ('literal' in reading.expected) return reading.expected.literal;
  const ref = reading.expected.ref;
  const block = blocks.get(ref.slice(0, ref.indexOf('.')));
  if (!block) return 'a calculation that is not in this procedure';
  const out = block.ok ? block.outputs[ref.slice(ref.indexOf('.') + 1)] : undefined;
  return out
    ? `${out.label}, from the ${blockLabel(block)} block`
    : `a result of the ${blockLabel(block)} block`;
}

export function resolveReading(
  reading: ReadingAttrs & { section?: string },
  blocks: Map<string, BlockResult>,
  params?: Partial<ProcedureParams>,
): ResolvedReading {
  const measure = effectiveMeasure(reading);
  const literal = 'literal' in reading.expected;
  const ratio = params?.mainsVoltage && params?.mainsNominal ? params.mainsVoltage / params.mainsNominal : 1;
  const base = {
    id: reading.id,
    label: reading.label,
    testPoint: reading.testPoint,
    meterRange: reading.meterRange,
    unit: reading.unit,
    measure,
    section: reading.section ?? '',
    toleranceText: reading.tolerance,
    expectedSource: 'literal' in reading.expected ? reading.expected.literal : reading.expected.ref,
    expectedText: expectedText(reading, blocks),
    ...(literal && reading.followsMains != null && { followsMains: reading.followsMains }),
    ...(literal && reading.followsMains && { mainsRatio: Number(ratio.toPrecision(6)) }),
  };
  try {
    const expected = expectedValue(reading, measure, blocks, ratio);
    if (!reading.tolerance.trim()) {
      return { ...base, expected, low: null, high: null, bandText: null, error: 'no tolerance given' };
    }
    const band = toleranceBand(expected, parseTolerance(reading.tolerance, reading.unit));
    return {
      ...base,
      expected,
      ...band,
      bandText: `${formatQuantity(band.low, reading.unit)} … ${formatQuantity(band.high, reading.unit)}`,
    };
  } catch (err) {
    return {
      ...base,
      expected: null,
      low: null,
      high: null,
      bandText: null,
      error: err instanceof Error ? err.message : String(err),
    };
  }
}

export function evaluateDocument(doc: ProcedureDoc, params: ProcedureParams): Snapshot {
  const { reckoners, readings } = extractBlocks(upgradeDocument(doc, { reckoners: false }));
  const result = evaluateProcedure(
    reckoners.map((r) => ({ name: r.name, kind: r.kind, inputs: r.inputs })),
    params,
  );
  const blocks = result.blocks.map((b, i) => ({
    ...b,
    id: reckoners[i]!.id,
    section: reckoners[i]!.section,
    label: getReckoner(b.kind)?.label ?? b.kind,
  }));
  const byName = new Map(result.blocks.map((b) => [b.name, b]));
  return {
    params,
    blocks,
    readings: readings.map((r) => resolveReading(r, byName, params)),
    errors: result.errors,
  };
}
