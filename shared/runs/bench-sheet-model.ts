import { RUN_SHEET_CAUTION, type Caution } from '../safety-caution';
import type { SignalLevel } from '../safety-signs';
import type { ProcedureParams } from '../document/params';
import type { RunStep } from '../schemas/runs';
import { formatQuantity } from '../units/format';
import { NONE, type SheetField } from './run-sheet-model';

/**
 * A blank bench sheet: an approved revision's steps on paper, with every expected value and band
 * worked out for one mains, for a bench without the tablet. Its identifier names the revision's
 * content hash, the mains and the day it was printed, so the paper can be matched to the revision
 * and mains when its readings are copied into a run.
 */

export interface BenchSheetStep {
  position: number;
  kind: RunStep['kind'];
  /** A hazard note's sign (shared/safety-signs.ts), as on the run sheet. */
  signal: SignalLevel | null;
  text: string;
  /** A reading: where, on what range, what to expect and the band it must fall in, with units. */
  reading: {
    testPoint: string;
    meterRange: string;
    unit: string;
    expected: string;
    band: string;
    tolerance: string;
  } | null;
  live: boolean;
}

export interface BenchSheetModel {
  title: string;
  sheetId: string;
  caution: Caution;
  procedure: SheetField[];
  steps: BenchSheetStep[];
  /** Lines left blank for the bench to fill in. */
  blanks: { label: string; wide?: boolean }[][];
}

const HASH_CHARS = 12;
/** "236" or "236.5": the mains as written in a sheet identifier. */
const figure = (n: number) => String(Number(n.toFixed(2)));

/** "BS-3f2a9c1b7d04-236V-50Hz-20261203" */
export const benchSheetId = (revisionHash: string, params: ProcedureParams, printedOn: string) =>
  `BS-${revisionHash.slice(0, HASH_CHARS)}-${figure(params.mainsVoltage)}V-${figure(params.mainsFrequency)}Hz-${printedOn.replaceAll('-', '')}`;

/** The parts of a sheet identifier as typed from the paper (case and spaces forgiven), or null. */
export function parseBenchSheetId(text: string) {
  const m = /^BS-([0-9a-f]{12})-(\d+(?:\.\d+)?)V-(\d+(?:\.\d+)?)HZ-(\d{4})(\d{2})(\d{2})$/i.exec(
    text.replace(/\s+/g, '').toUpperCase(),
  );
  if (!m) return null;
  return {
    hashPrefix: m[1]!.toLowerCase(),
    mainsVoltage: Number(m[2]),
    mainsFrequency: Number(m[3]),
    printedOn: `${m[4]}-${m[5]}-${m[6]}`,
  };
}

export function benchSheetModel(input: {
  revision: {
    title: string;
    number: number;
    contentHash: string;
    changeReason: string;
    approvedAt: string | null;
    equipmentModel: string;
  };
  params: ProcedureParams;
  steps: RunStep[];
  /** The day it is printed (UTC, YYYY-MM-DD) and by whom. */
  printedOn: string;
  printedBy: string;
}): BenchSheetModel {
  const { revision: rev, params } = input;
  return {
    title: `Bench sheet: ${rev.title}`,
    sheetId: benchSheetId(rev.contentHash, params, input.printedOn),
    caution: RUN_SHEET_CAUTION,
    procedure: [
      { label: 'Procedure', value: `${rev.title} (${rev.equipmentModel})` },
      { label: 'Revision', value: `${rev.number}, approved ${rev.approvedAt?.slice(0, 10) ?? NONE}` },
      { label: 'Revision content SHA-256', value: rev.contentHash, mono: true },
      { label: 'Change reason', value: rev.changeReason || 'not recorded for this revision' },
      {
        label: 'Worked out for mains',
        value:
          `${formatQuantity(params.mainsVoltage, 'V', 4)} rms, ${formatQuantity(params.mainsFrequency, 'Hz', 3)}` +
          ` (procedure nominal ${formatQuantity(params.mainsNominal, 'V', 4)})`,
        mono: true,
      },
      { label: 'Printed', value: `${input.printedOn} by ${input.printedBy}` },
    ],
    steps: input.steps.map((s) => ({
      position: s.position,
      kind: s.kind,
      signal: s.kind === 'hazard' ? (s.hazard?.level ?? 'danger') : null,
      text: s.check?.heading && s.check.heading !== s.text ? `${s.check.heading}: ${s.text}` : s.text,
      reading: s.reading
        ? {
            testPoint: s.reading.testPoint,
            meterRange: s.reading.meterRange,
            unit: s.reading.unit,
            expected:
              s.reading.expected !== null ? formatQuantity(s.reading.expected, s.reading.unit, 4) : NONE,
            band: s.reading.bandText ?? `no band: ${s.reading.error ?? 'none given'}`,
            tolerance: s.reading.toleranceText,
          }
        : null,
      live: !!s.live,
    })),
    blanks: [
      [{ label: 'Unit model' }, { label: 'Serial' }],
      [{ label: 'Owner or job number', wide: true }],
      [{ label: 'Technician' }, { label: 'Date filled in' }],
      [{ label: 'Instrument' }, { label: 'Calibration due' }],
      [{ label: 'Mains measured at the bench' }, { label: 'Signature' }],
    ],
  };
}
