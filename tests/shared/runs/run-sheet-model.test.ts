import { describe, expect, it } from 'vitest';
import { formatUtc, MARK_WORDS, runSheetModel } from '../../../shared/runs/run-sheet-model';
import { RUN_SHEET_CAUTION } from '../../../shared/safety-caution';
import type { EntryView, RunStep, RunView } from '../../../shared/schemas/runs';

const tom = { id: 't', displayName: 'Tom Achterberg' };
const priya = { id: 'p', displayName: 'Priya Lindqvist' };
const at = '2026-03-04T05:06:07.890Z';

function reading(id: string, position: number, expected: number | null, band: number): RunStep {
  return {
    id,
    kind: 'reading',
    position,
    section: 'Power supply',
    text: `Reading ${id}`,
    reading: {
      testPoint: `TP ${id}`,
      meterRange: '1000 V DC',
      unit: 'V',
      toleranceText: `±${band} %`,
      expectedSource: 'number',
      expected,
      low: expected === null ? null : expected * (1 - band / 100),
      high: expected === null ? null : expected * (1 + band / 100),
      bandText: expected === null ? null : `±${band} %`,
      ...(expected === null ? { error: 'no expected value' } : {}),
    },
  };
}

/** An entry whose deviation is worked out here by plain arithmetic: measured − expected, and that over expected. */
function measured(step: RunStep, value: number, note = '', by = tom): EntryView {
  const r = step.reading!;
  const dev = r.expected === null ? null : value - r.expected;
  return {
    stepId: step.id,
    kind: 'reading',
    raw: `${value} V`,
    measured: value,
    unit: 'V',
    expected: r.expected,
    low: r.low,
    high: r.high,
    within: r.expected === null ? null : value >= r.low! && value <= r.high!,
    deviation: dev,
    deviationPercent: dev === null ? null : (dev / r.expected!) * 100,
    done: false,
    note,
    version: 1,
    lastKey: 'k',
    enteredBy: by,
    enteredAt: at,
    history: [],
  };
}

const steps: RunStep[] = [
  reading('ht', 1, 250, 5),
  reading('heater', 2, 6.3, 10),
  reading('bias', 3, null, 5),
  reading('screen', 4, 240, 5),
  { id: 'discharge', kind: 'check', position: 5, section: 'End', text: 'Reservoir discharged' },
  { id: 'live', kind: 'hazard', position: 6, section: 'Start', text: 'HT is live' },
];

function runView(over: Partial<RunView> = {}): RunView {
  const entries = [
    measured(steps[0]!, 290, 'Reservoir cap bulging; replaced after this run.'),
    measured(steps[1]!, 6.4, '', priya),
    measured(steps[2]!, -12.5),
    { ...measured(steps[0]!, 0), stepId: 'live', kind: 'hazard' as const, done: true, note: 'Checked twice' },
  ];
  return {
    id: 'run-1',
    title: 'TC-18 combo',
    status: 'signed',
    outOfTolerance: true,
    unit: { id: 'u', model: 'TC-18', serial: 'TC18-0457', owner: '', jobNumber: 'J-12' },
    revision: {
      id: 'r',
      number: 2,
      state: 'approved',
      title: 'TC-18 power supply',
      approvedAt: at,
      changeReason: 'B+ band widened after the choke change',
      author: priya,
      contentHash: 'a'.repeat(64),
      signOffs: [],
    },
    params: { mainsVoltage: 230, mainsFrequency: 50, mainsNominal: 230 } as RunView['params'],
    snapshot: {} as RunView['snapshot'],
    steps,
    entries,
    photos: [],
    signature: {
      signer: tom,
      signerRole: 'technician',
      meaning: 'performed',
      reason: null,
      signedAt: at,
      contentHash: 'b'.repeat(64),
      verified: true,
    },
    startedBy: tom,
    performedBy: tom,
    handovers: [],
    hold: null,
    closed: null,
    startedAt: at,
    signedAt: at,
    progress: { done: 5, total: 6, outOfTolerance: 1 },
    locked: [],
    ...over,
  };
}

describe('run sheet model', () => {
  it('writes every time as UTC to the second, with the zone named', () => {
    expect(formatUtc(at)).toBe('2026-03-04 05:06:07 UTC');
    expect(formatUtc(null)).toBe('—');
    const sheet = runSheetModel(runView());
    expect(sheet.procedure.find((f) => f.label === 'Approved')!.value).toBe('2026-03-04 05:06:07 UTC');
    expect(sheet.readings[0]!.recordedAt).toBe('2026-03-04 05:06:07 UTC');
  });

  it('names the change reason of the revision the run followed, or says none was recorded', () => {
    const sheet = runSheetModel(runView());
    expect(sheet.procedure.find((f) => f.label === 'Change reason')!.value).toBe(
      'B+ band widened after the choke change',
    );
    const old = runView();
    const legacy = runSheetModel({ ...old, revision: { ...old.revision, changeReason: '' } });
    expect(legacy.procedure.find((f) => f.label === 'Change reason')!.value).toMatch(/not recorded/);
  });

  it('gives each reading its value, expected value with band, deviation, mark and note', () => {
    const [ht, heater, bias, screen] = runSheetModel(runView()).readings;
    // 290 V against 250 V ±5 %: 40 V over, 16 % of the expected value.
    expect(ht).toMatchObject({
      measured: '290 V',
      unit: 'V',
      expected: '250 V',
      band: '±5 %',
      deviation: '+40 V (+16 %)',
      mark: 'out',
      markText: 'out of band',
      note: 'Reservoir cap bulging; replaced after this run.',
      recordedBy: 'Tom Achterberg',
    });
    // 6.4 V against 6.3 V ±10 %: 0.1 V over, 1.587… % rounded to two significant figures.
    expect(heater).toMatchObject({
      measured: '6.4 V',
      deviation: '+100 mV (+1.6 %)',
      mark: 'within',
      markText: 'in band',
      note: null,
      recordedBy: 'Priya Lindqvist',
    });
    expect(bias).toMatchObject({
      expected: '—',
      band: 'no expected value',
      deviation: '—',
      markText: 'no band',
    });
    expect(screen).toMatchObject({
      measured: '—',
      mark: 'missing',
      markText: 'not recorded',
      recordedBy: null,
    });
  });

  it('keeps what was typed when it reads differently from the value shown', () => {
    const row = (raw: string) =>
      runSheetModel(runView({ entries: [{ ...measured(steps[0]!, 290), raw }] })).readings[0]!;
    expect(row('0.29 kV').asTyped).toBe('0.29 kV');
    expect(row('290').asTyped).toBeNull();
    expect(row('290 V').asTyped).toBeNull();
  });

  it('says a negative deviation with its sign and an exact one with none', () => {
    const low = measured(steps[0]!, 240);
    const exact = measured(steps[0]!, 250);
    const rows = (e: EntryView) => runSheetModel(runView({ entries: [e] })).readings[0]!;
    expect(rows(low).deviation).toBe('-10 V (-4 %)');
    expect(rows(exact).deviation).toBe('0 V (0 %)');
  });

  it('lists check steps and hazard notes with who did them and their notes', () => {
    const [check, hazard] = runSheetModel(runView()).checks;
    expect(check).toMatchObject({ kindText: 'Check', done: false, status: 'not done', note: null });
    expect(hazard).toMatchObject({
      kindText: 'Hazard note',
      done: true,
      status: 'acknowledged by Tom Achterberg, 2026-03-04 05:06:07 UTC',
      note: 'Checked twice',
    });
  });

  it('draws a hazard note with its own signal word, a note from before levels as DANGER', () => {
    const levelled = steps.map((s) =>
      s.kind === 'hazard' ? { ...s, hazard: { level: 'warning' as const } } : s,
    );
    const [check, hazard] = runSheetModel(runView({ steps: levelled })).checks;
    expect(check!.signal).toBeNull();
    expect(hazard!.signal).toBe('warning');
    expect(runSheetModel(runView()).checks[1]!.signal).toBe('danger');
  });

  it('states the signature meaning, the hash check, and the run-sheet caution', () => {
    const sheet = runSheetModel(runView());
    const field = (label: string) => sheet.signature.find((f) => f.label === label)?.value;
    expect(field('Meaning')).toBe('performed: I performed this bench run and recorded these readings.');
    expect(field('Check')).toBe('Yes: the stored run content matches the signed hash.');
    expect(sheet.caution).toBe(RUN_SHEET_CAUTION);
    expect(sheet.caution.lead).toBe('Lethal voltages.');
    const tampered = runSheetModel(runView({ signature: { ...runView().signature!, verified: false } }));
    expect(tampered.signature.find((f) => f.label === 'Check')).toMatchObject({ tone: 'out' });
    expect(runSheetModel(runView({ signature: null, status: 'in_progress' })).signature).toEqual([
      { label: 'Signed by', value: 'not signed yet' },
    ]);
  });

  it('names the state of the run, a hold, and how many readings are out of band', () => {
    const hold = { reason: 'Wrong bleeder', by: 'Marek Nowak', at, revisionNumber: 2 };
    const sheet = runSheetModel(
      runView({
        status: 'abandoned',
        signature: null,
        hold,
        closed: { by: priya, reason: 'unit left', at },
        progress: { done: 3, total: 6, outOfTolerance: 2 },
      }),
    );
    expect(sheet.notices.map((n) => n.text)).toEqual([
      'Closed as abandoned, not signed',
      'On hold: revision 2 withdrawn',
      `2 readings ${MARK_WORDS.out}`,
    ]);
    expect(sheet.bench.find((f) => f.tag === 'closed')!.value).toBe(
      '2026-03-04 05:06:07 UTC by Priya Lindqvist, as abandoned: unit left',
    );
  });

  it('lists a hold point with its decision and step records with theirs, and marks the step rows', () => {
    const record = (over: Partial<NonNullable<RunView['exceptions']>[number]>) => ({
      id: 'x1',
      stepId: 'discharge',
      position: 5,
      text: 'Reservoir discharged',
      kind: 'deviation' as const,
      reason: 'Discharged through the probe, 2 V read',
      recordedBy: tom,
      recordedAt: at,
      decision: 'approved' as const,
      decisionNote: 'Fine with a reading',
      decidedBy: priya,
      decidedAt: at,
      current: true,
      ...over,
    });
    const sheet = runSheetModel(
      runView({
        holdPoints: [
          {
            id: 'h1',
            stepId: 'ht',
            position: 1,
            text: 'Reading ht',
            raw: '290 V',
            measured: 290,
            unit: 'V',
            low: 237.5,
            high: 262.5,
            openedBy: tom,
            openedAt: at,
            decision: 'continue',
            reason: 'Cap replaced after the run',
            decidedBy: priya,
            decidedAt: at,
          },
        ],
        exceptions: [
          record({ id: 'x0', decision: 'refused', decisionNote: 'Use the bleeder wait', current: false }),
          record({}),
          record({
            id: 'x2',
            stepId: 'screen',
            position: 4,
            text: 'Reading screen',
            kind: 'not_applicable',
            reason: 'No screen supply on this chassis',
            decision: null,
            decisionNote: null,
            decidedBy: null,
            decidedAt: null,
          }),
        ],
      }),
    );
    expect(sheet.decisions.map((f) => f.label)).toEqual([
      'Hold point',
      'Deviation (replaced)',
      'Deviation',
      'Not applicable',
    ]);
    expect(sheet.decisions[0]!.value).toBe(
      '1. Reading ht: measured 290 V, expected 237.5 V … 262.5 V, 2026-03-04 05:06:07 UTC. Priya Lindqvist decided to continue, 2026-03-04 05:06:07 UTC: Cap replaced after the run',
    );
    expect(sheet.decisions[1]!.tone).toBe('out');
    expect(sheet.decisions[2]!.value).toMatch(/Approved by Priya Lindqvist, .*: Fine with a reading$/);
    expect(sheet.checks.find((c) => c.stepId === 'discharge')!.status).toBe(
      'deviation, approved (see below)',
    );
    expect(sheet.readings.find((r) => r.stepId === 'screen')!.markText).toBe('not applicable (see below)');
  });
});
