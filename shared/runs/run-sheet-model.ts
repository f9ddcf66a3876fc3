import { RUN_SHEET_CAUTION, type Caution } from '../safety-caution';
import { decisionFields, recordStatus } from './decision-fields';
import type { SignalLevel } from '../safety-signs';
import { INSTRUMENT_KINDS, type InstrumentKind } from '../schemas/registers';
import type { EntryView, RunStep, RunView } from '../schemas/runs';
import { DISPOSITION_WORDS, type FollowUpView } from '../schemas/follow-ups';
import { formatNumber, formatQuantity } from '../units/format';
import { MARK_WORDS, markOf, type MarkKind } from './marks';
import { readingsPlot, type ReadingsPlot } from './readings-plot';

/**
 * The run sheet as words, once: the page and the PDF both draw this, so a date, a mark, a deviation
 * or the meaning of the signature reads the same on screen and on paper.
 */

/** Nothing there (no value, no band, not signed). */
export const NONE = '—';

/** Run-sheet times: UTC to the second, as the database recorded them, with the zone named. */
export const formatUtc = (iso: string | null) => (iso ? `${iso.slice(0, 19).replace('T', ' ')} UTC` : NONE);

export { MARK_WORDS, markOf, type MarkKind } from './marks';

const signed = (x: number) => (x > 0 ? '+' : '');
/** "+2 V (+0.8 %)": measured minus expected, and as a share of the expected value. */
export function deviationText(deviation: number | null, percent: number | null, unit: string): string {
  if (deviation === null) return NONE;
  const pct = percent === null ? '' : ` (${signed(percent)}${formatNumber(percent, 2)} %)`;
  return `${signed(deviation)}${formatQuantity(deviation, unit, 3)}${pct}`;
}

/** What the technician's signature on a run means; the sign form says the same. */
export const RUN_SIGNATURE_MEANING = {
  performed: 'I performed this bench run and recorded these readings.',
} as const;

/** What a witness's co-signature on a trainee's run means; the witness form says the same. */
export const WITNESS_MEANING = 'I watched this bench run being performed and these readings being recorded.';

/** What the release signature means; the release form says the same. */
export const RELEASE_MEANING =
  'I checked this run sheet against the procedure and release the unit: the work is complete and its readings are accepted.';

export const SHEET_HEADINGS = {
  unit: 'Unit',
  procedure: 'Procedure followed and its approval record',
  bench: 'Bench conditions',
  readings: 'Readings',
  checks: 'Check steps and hazard notes',
  corrections: 'Corrections (originals kept)',
  decisions: 'Hold points, steps not applicable and deviations',
  instruments: 'Instruments used',
  signature: 'Signature',
  release: 'Checked and released',
  followUp: 'Follow-up of out-of-band readings',
} as const;

export const READING_COLUMNS = [
  'Reading',
  'Expected',
  'Measured',
  'Deviation',
  'Mark',
  'Recorded by',
] as const;

/** One labelled line; `tag` names it for the page (a data attribute). */
export interface SheetField {
  label: string;
  value: string;
  mono?: boolean;
  tone?: 'ok' | 'out';
  tag?:
    | 'handover'
    | 'performer'
    | 'closed'
    | 'hold'
    | 'witness'
    | 'paper'
    | 'release'
    | 'follow-up'
    | 'hold-point'
    | 'step-record';
}

export interface SheetNotice {
  kind: 'signed' | 'in-progress' | 'abandoned' | 'hold' | 'out';
  text: string;
}

export interface SheetReading {
  stepId: string;
  position: number;
  label: string;
  testPoint: string;
  unit: string;
  /** Expected value, and its band (or why there is none) beneath it. */
  expected: string;
  band: string;
  measured: string;
  /** What the technician typed, when it reads differently from the measured value. */
  asTyped: string | null;
  corrected: boolean;
  deviation: string;
  mark: MarkKind;
  markText: string;
  note: string | null;
  recordedBy: string | null;
  recordedAt: string | null;
}

export interface SheetCheck {
  stepId: string;
  position: number;
  kind: 'check' | 'hazard';
  /** "Check" or "Hazard note". */
  kindText: string;
  /** A hazard note's safety sign (shared/safety-signs.ts), drawn beside it on the page and the PDF. */
  signal: SignalLevel | null;
  text: string;
  done: boolean;
  /** "done by …, time", "acknowledged by …, time" or "not done". */
  status: string;
  note: string | null;
}

export interface SheetCorrection {
  stepId: string;
  position: number | null;
  text: string;
  /** Every version, oldest first: "v1: 352 V by …, time". */
  versions: string[];
}

export interface RunSheetModel {
  title: string;
  reference: string;
  notices: SheetNotice[];
  caution: Caution;
  unit: SheetField[];
  procedure: SheetField[];
  bench: SheetField[];
  readings: SheetReading[];
  checks: SheetCheck[];
  corrections: SheetCorrection[];
  /** Hold points reached (and their decisions), steps not applicable, deviations (and theirs). */
  decisions: SheetField[];
  /** The readings against their bands, drawn on the page and in the PDF (readings-plot.ts). */
  plot: ReadingsPlot;
  /** Each instrument that took a reading, with its calibration due date when it did and the readings it took. */
  instruments: SheetField[];
  photos: string | null;
  signature: SheetField[];
  /** The second signature ("checked and released"), or why there is none yet. */
  release: SheetField[];
  /** The follow-up this run opened, and any it closed as a passing re-run ([] when neither). */
  followUp: SheetField[];
}

/** When an entry was recorded, and the paper sheet's date when it was copied from one. */
const recorded = (e: { enteredAt: string; takenOn?: string | null }) =>
  `${formatUtc(e.enteredAt)}${e.takenOn ? `, entered from a paper sheet dated ${e.takenOn}` : ''}`;

/** "Entered from a paper sheet dated …" for each paper sheet the entries came from, and the one in use. */
function paperFields(run: RunView): SheetField[] {
  const dates = new Set(run.entries.map((e) => e.takenOn).filter((d): d is string => !!d));
  if (run.paperSheet) dates.add(run.paperSheet.date);
  return [...dates].sort().map((d) => ({
    label: 'Paper sheet',
    value:
      `Entered from a paper sheet dated ${d}` +
      (run.paperSheet?.date === d && run.paperSheet.reference ? ` (sheet ${run.paperSheet.reference})` : ''),
    tag: 'paper',
  }));
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const note = (e: EntryView | undefined) => e?.note.trim() || null;

function readingRow(step: RunStep, e: EntryView | undefined): SheetReading {
  const r = step.reading!;
  const measured = e?.measured != null ? formatQuantity(e.measured, r.unit, 4) : NONE;
  const mark = markOf(e?.measured, e?.within ?? null);
  return {
    stepId: step.id,
    position: step.position,
    label: step.text,
    testPoint: r.testPoint,
    unit: r.unit,
    expected: r.expected !== null ? formatQuantity(r.expected, r.unit, 4) : NONE,
    band: r.bandText ?? r.error ?? NONE,
    measured,
    asTyped: e?.raw && ![measured, measured.split(' ')[0]].includes(e.raw.trim()) ? e.raw : null,
    corrected: (e?.version ?? 1) > 1,
    deviation: e ? deviationText(e.deviation, e.deviationPercent, r.unit) : NONE,
    mark,
    markText: MARK_WORDS[mark],
    note: note(e),
    recordedBy: e?.enteredBy.displayName ?? null,
    recordedAt: e ? recorded(e) : null,
  };
}

function checkRow(step: RunStep, e: EntryView | undefined): SheetCheck {
  const hazard = step.kind === 'hazard';
  return {
    stepId: step.id,
    position: step.position,
    kind: hazard ? 'hazard' : 'check',
    kindText: hazard ? 'Hazard note' : 'Check',
    // Runs started before notes had levels were all DANGER notes.
    signal: hazard ? (step.hazard?.level ?? 'danger') : null,
    text: step.text,
    done: !!e?.done,
    status: e?.done
      ? `${hazard ? 'acknowledged' : 'done'} by ${e.enteredBy.displayName}, ${recorded(e)}`
      : 'not done',
    note: note(e),
  };
}

function notices(run: RunView): SheetNotice[] {
  const out: SheetNotice[] = [
    run.status === 'signed'
      ? { kind: 'signed', text: 'Signed' }
      : run.status === 'abandoned'
        ? { kind: 'abandoned', text: 'Closed as abandoned, not signed' }
        : { kind: 'in-progress', text: 'Not signed: bench run in progress' },
  ];
  if (run.hold) out.push({ kind: 'hold', text: `On hold: revision ${run.hold.revisionNumber} withdrawn` });
  if (run.outOfTolerance)
    out.push({ kind: 'out', text: `${plural(run.progress.outOfTolerance, 'reading')} ${MARK_WORDS.out}` });
  return out;
}

function instrumentFields(run: RunView): SheetField[] {
  const used = new Map<string, { label: string; due: string; positions: number[] }>();
  for (const s of run.steps) {
    const i = run.entries.find((e) => e.stepId === s.id)?.instrument;
    if (!i) continue;
    const key = `${i.id} ${i.calibrationDue}`;
    const kind = INSTRUMENT_KINDS[i.kind as InstrumentKind] ?? i.kind;
    const row = used.get(key) ?? {
      label: `${i.identifier} (${kind.toLowerCase()})`,
      due: i.calibrationDue,
      positions: [],
    };
    row.positions.push(s.position);
    used.set(key, row);
  }
  return [...used.values()].map((u) => ({
    label: u.label,
    value: `calibration due ${u.due}; ${u.positions.length === 1 ? 'step' : 'steps'} ${u.positions.join(', ')}`,
  }));
}

function witnessFields(run: RunView): SheetField[] {
  const w = run.witness;
  if (!w) return [];
  if (!w.signature)
    return [{ label: 'Witness', value: `${w.person.displayName}, not co-signed yet`, tag: 'witness' }];
  return [
    { label: 'Witnessed by', value: w.person.displayName, tag: 'witness' },
    { label: 'Witness meaning', value: `witnessed: ${WITNESS_MEANING}` },
    { label: 'Witnessed at', value: formatUtc(w.signature.signedAt) },
    w.signature.current
      ? { label: 'Witness check', value: 'Yes: co-signed over the run content as it stands.', tone: 'ok' }
      : { label: 'Witness check', value: 'NO: entries changed after the witness co-signed.', tone: 'out' },
  ];
}

function releaseFields(run: RunView): SheetField[] {
  const r = run.release;
  if (!r) return [{ label: 'Released by', value: run.status === 'signed' ? 'not released yet' : NONE }];
  return [
    { label: 'Released by', value: `${r.signer.displayName} (${r.signerRole})`, tag: 'release' },
    { label: 'Meaning', value: `checked and released: ${RELEASE_MEANING}` },
    { label: 'Released at', value: formatUtc(r.signedAt) },
    r.matchesRun
      ? { label: 'Check', value: 'Yes: the release covers the signed run content hash.', tone: 'ok' }
      : { label: 'Check', value: 'NO: the release covers another content hash.', tone: 'out' },
  ];
}

/** A follow-up in words: its readings, owner, disposition and closure. */
export function followUpFields(f: FollowUpView): SheetField[] {
  const band = (r: FollowUpView['readings'][number]) =>
    r.band ??
    (r.low !== null && r.high !== null
      ? `${formatQuantity(r.low, r.unit ?? '', 4)} … ${formatQuantity(r.high, r.unit ?? '', 4)}`
      : 'no band');
  return [
    ...f.readings.map((r) => ({
      label: 'Out of band',
      value: `${r.label}: ${r.measured !== null ? formatQuantity(r.measured, r.unit ?? '', 4) : (r.raw ?? NONE)} (band ${band(r)})`,
      tone: 'out' as const,
    })),
    { label: 'Opened', value: formatUtc(f.openedAt) },
    { label: 'Owner', value: f.owner.displayName },
    {
      label: 'Disposition',
      value: f.disposition
        ? `${DISPOSITION_WORDS[f.disposition.value]}${f.disposition.reason ? `: ${f.disposition.reason}` : ''} (${f.disposition.by.displayName}, ${formatUtc(f.disposition.at)})`
        : 'none yet',
    },
    f.closed
      ? {
          label: 'Closed',
          value: f.closed.run
            ? `${formatUtc(f.closed.at)} by a passing re-run signed ${formatUtc(f.closed.run.signedAt)}`
            : `${formatUtc(f.closed.at)} by ${f.closed.by.displayName}`,
          tone: 'ok' as const,
          tag: 'follow-up' as const,
        }
      : { label: 'Status', value: 'open', tone: 'out' as const, tag: 'follow-up' as const },
  ];
}

export function runSheetModel(run: RunView): RunSheetModel {
  const entries = new Map(run.entries.map((e) => [e.stepId, e]));
  const stepOf = new Map(run.steps.map((s) => [s.id, s]));
  const rev = run.revision;
  const sig = run.signature;
  return {
    title: `Run sheet: ${run.title}`,
    reference: `Benchwright bench run ${run.id}`,
    notices: notices(run),
    caution: RUN_SHEET_CAUTION,
    unit: [
      { label: 'Model', value: run.unit.model },
      { label: 'Serial', value: run.unit.serial, mono: true },
      { label: 'Owner', value: run.unit.owner || NONE },
      { label: 'Job number', value: run.unit.jobNumber || NONE, mono: true },
    ],
    procedure: [
      { label: 'Procedure', value: rev.title },
      { label: 'Revision', value: `${rev.number} (${rev.state.replace('_', ' ')})` },
      { label: 'Change reason', value: rev.changeReason || 'not recorded for this revision' },
      { label: 'Approved', value: formatUtc(rev.approvedAt) },
      { label: 'Author', value: rev.author.displayName },
      ...(rev.signOffs.length
        ? rev.signOffs.map((s) => ({
            label: 'Reviewer sign-off',
            value: `${s.name}, ${s.meaning}, ${formatUtc(s.signedAt)}`,
          }))
        : [{ label: 'Reviewer sign-off', value: 'none recorded for this revision' }]),
      { label: 'Revision content SHA-256', value: rev.contentHash, mono: true },
    ],
    bench: [
      { label: 'Measured mains', value: formatQuantity(run.params.mainsVoltage, 'V', 4), mono: true },
      { label: 'Mains frequency', value: formatQuantity(run.params.mainsFrequency, 'Hz', 3), mono: true },
      {
        label: 'Procedure nominal mains',
        value: formatQuantity(run.params.mainsNominal, 'V', 4),
        mono: true,
      },
      { label: 'Started', value: `${formatUtc(run.startedAt)} by ${run.startedBy.displayName}` },
      ...paperFields(run),
      ...run.handovers.map((h): SheetField => ({
        label: 'Handed over',
        value:
          `${h.from.displayName} handed the run over to ${h.to.displayName}, ${formatUtc(h.at)}` +
          `${h.by.id !== h.from.id ? ` (reassigned by ${h.by.displayName})` : ''}. Reason: ${h.reason}`,
        tag: 'handover',
      })),
      ...(run.status === 'in_progress'
        ? [{ label: 'Performed by', value: run.performedBy.displayName, tag: 'performer' as const }]
        : []),
      ...(run.closed
        ? [
            {
              label: 'Closed',
              value: `${formatUtc(run.closed.at)} by ${run.closed.by.displayName}, as abandoned: ${run.closed.reason}`,
              tone: 'out' as const,
              tag: 'closed' as const,
            },
          ]
        : []),
      ...(run.hold
        ? [
            {
              label: 'On hold',
              value: `revision ${run.hold.revisionNumber} withdrawn by ${run.hold.by}, ${formatUtc(run.hold.at)}: ${run.hold.reason}`,
              tone: 'out' as const,
              tag: 'hold' as const,
            },
          ]
        : []),
    ],
    readings: run.steps
      .filter((s) => s.kind === 'reading')
      .map((s) => {
        const row = readingRow(s, entries.get(s.id));
        const record = recordStatus(run, s.id);
        return record && row.measured === NONE ? { ...row, markText: record } : row;
      }),
    checks: run.steps
      .filter((s) => s.kind !== 'reading')
      .map((s) => {
        const row = checkRow(s, entries.get(s.id));
        const record = recordStatus(run, s.id);
        return record && !row.done ? { ...row, status: record } : row;
      }),
    corrections: run.entries
      .filter((e) => e.history.length > 1)
      .map((e) => {
        const step = stepOf.get(e.stepId);
        return {
          stepId: e.stepId,
          position: step?.position ?? null,
          text: step?.text ?? e.stepId,
          versions: e.history.map(
            (h) =>
              `v${h.version}: ${h.raw ?? (h.done ? 'ticked' : 'unticked')} by ${h.enteredBy.displayName}, ` +
              `${recorded(h)}${h.reason ? `; reason: ${h.reason}` : ''}`,
          ),
        };
      }),
    decisions: decisionFields(run),
    plot: readingsPlot(run.steps, run.entries),
    instruments: instrumentFields(run),
    photos: run.photos.length
      ? `${plural(run.photos.length, 'photo')} kept with the run in Benchwright`
      : null,
    signature: (sig
      ? ([
          { label: 'Signed by', value: `${sig.signer.displayName} (${sig.signerRole})` },
          { label: 'Meaning', value: `${sig.meaning}: ${RUN_SIGNATURE_MEANING[sig.meaning]}` },
          { label: 'Signed at', value: formatUtc(sig.signedAt) },
          { label: 'Run content SHA-256', value: sig.contentHash, mono: true },
          sig.verified
            ? { label: 'Check', value: 'Yes: the stored run content matches the signed hash.', tone: 'ok' }
            : {
                label: 'Check',
                value: 'NO: the stored run content does not match the signed hash.',
                tone: 'out',
              },
        ] as SheetField[])
      : [{ label: 'Signed by', value: 'not signed yet' }]
    ).concat(witnessFields(run)),
    release: releaseFields(run),
    followUp: [
      ...(run.followUp ? followUpFields(run.followUp) : []),
      ...(run.closesFollowUps ?? []).map((f) => ({
        label: 'Closes follow-up',
        value: `This passing run closed the follow-up opened ${formatUtc(f.openedAt)} on ${f.readings.map((r) => r.label).join(', ')}.`,
        tone: 'ok' as const,
      })),
    ],
  };
}
