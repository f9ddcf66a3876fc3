/**
 * The procedure check reads the document's structure. Five sound procedures (valve and silicon
 * rectifiers, with and without a bleeder, 120 V and 230 V mains) give no finding of the check's
 * own; each faulty procedure is one of them with one fault planted, named in the test title, and
 * must be flagged with the right code — and nothing else.
 *
 * Figures the tests state come from outside the code under test:
 * - RC discharge, t = R C ln(V₀ / V_t): any circuit-theory text (the exponential decay of a
 *   capacitor through a resistor).
 * - No-load DC of a capacitor-input filter ≈ √2 × V_rms(winding) − rectifier drop: the peak of a
 *   sine less the drop, as in any rectifier chapter; a rated winding reads up to 10 % high unloaded
 *   (common practice, no source).
 * - Safe voltage 60 V DC: IEC 62368-1 (ES1) and IEC 60204-1 clause 6.2.4 (residual voltage).
 * - High mains +10 %: IEC 60038, 230 V ± 10 % (from memory).
 */
import { describe, expect, it } from 'vitest';
import { validateDocument, type DocNode } from '../../../shared/document/schema';
import { voltagesIn } from '../../../shared/document/check/rules/hazard';
import {
  check,
  checkProcedure,
  doc,
  findingsOf,
  fuse,
  heading,
  LIVE_WORK,
  mains120,
  mains230,
  note,
  para,
  reading,
  reckoner,
  verified,
  wait,
} from '../../support/procedure-docs';
import type { ProcedureParams } from '../../../shared/document/params';

interface Sound {
  mains: 120 | 230;
  rectifier: 'valve' | 'silicon-bridge' | 'silicon-centre-tap';
  /** Bleeder resistance across the filter, or none (the filter is drained with the probe). */
  bleeder?: string;
  /** Capacitor rating stated on the reservoir and ladder, or none. */
  rating?: string;
}

const opening = () =>
  note(
    'Lethal voltages: the HT reaches over 400 V DC and the filter stays charged after switch-off. Work one hand only while the unit is live. ' +
      'Bring it up through an isolation transformer and a series lamp or current-limited supply. Discharge and verify with a meter before touching.',
    LIVE_WORK,
    'danger',
    'hz-opening',
  );

/**
 * A sound first power-up: cold checks, no-load DC, loaded B+, switch-off — each powered section
 * behind its hazard note, each ending with the discharge verified below 60 V.
 */
function soundNodes(o: Sound): DocNode[] {
  const valve = o.rectifier === 'valve';
  const drop = valve ? { valveDrop: '15 V' } : { diodeDrop: '0.9 V' };
  const mainsText = `${o.mains} V`;
  const ht = o.mains === 230 ? '290 V' : '280 V';
  const drain = o.bleeder
    ? [
        reckoner(
          'bleed',
          'bleeder',
          {
            capacitance: '80 µF',
            chargedVoltage: { ref: 'noLoad.noLoadDcHigh' },
            bleederResistance: o.bleeder,
            targetTime: '60 s',
          },
          'rk-bleed',
        ),
        wait(120, 'bleeder', 'ck-wait-bleeder'),
      ]
    : [wait(10, 'probe', 'ck-wait-probe')];
  return [
    opening(),
    para('Use after any repair to the power supply.'),
    heading('1. Cold checks and mains fuse'),
    note(
      'Unplugged for this whole section. The filter may still hold charge: measure it first.',
      undefined,
      'warning',
      'hz-cold',
    ),
    verified('60 V', 'ck-cold-verified'),
    fuse(
      [
        { label: 'HT', volts: ht, amps: '150 mA' },
        { label: 'Heaters', volts: '6.3 V', amps: '3 A' },
      ],
      { fuseType: 'T' },
      'rk-fuse',
    ),
    check('Fitted fuse matches the reckoner (type T), in the live conductor.', {}, 'ck-fuse'),
    reading('Primary winding resistance', 'Ω', { literal: '22 Ω' }, {}, 'rd-primary'),
    heading('2. No-load DC, valves out'),
    note(
      'Every filter node charges to the full no-load DC, over 400 V. Clip on, switch on, read, switch off.',
      undefined,
      'danger',
      'hz-noload',
    ),
    reckoner(
      'noLoad',
      'peak-no-load',
      {
        windingVoltage: ht,
        mainsNominal: { param: 'mainsNominal' },
        mainsActual: { param: 'mainsVoltage' },
        rectifier: o.rectifier,
        ...drop,
        filterNodes: 3,
      },
      'rk-noload',
    ),
    check('Series lamp glows then dims; no arcing in the rectifier.', { live: true }, 'ck-lamp'),
    reading(
      'Mains at the bench',
      'V',
      { literal: mainsText },
      { measure: 'rms', followsMains: false },
      'rd-mains',
    ),
    reading(
      'Heater winding, unloaded',
      'V',
      { literal: '6.9 V' },
      { measure: 'rms', followsMains: true },
      'rd-heater',
    ),
    reading('No-load DC at the reservoir', 'V', { ref: 'noLoad.noLoadDc' }, { measure: 'dc' }, 'rd-noload'),
    check('Unit switched off and unplugged.', {}, 'ck-off-1'),
    ...drain,
    verified('60 V', 'ck-noload-verified'),
    heading('3. Loaded B+'),
    note(
      'All rails live at over 300 V with the valves fitted. Keep the speaker or a dummy load connected.',
      { oneHand: true },
      'danger',
      'hz-loaded',
    ),
    reckoner(
      'bplus',
      'loaded-bplus',
      {
        windingVoltage: { ref: 'noLoad.windingUnloadedHigh' },
        sourceResistance: valve ? '300 Ω' : '60 Ω',
        reservoir: '47 µF',
        ...(o.rating ? { reservoirRating: o.rating } : {}),
        loadCurrent: '90 mA',
        rectifier: o.rectifier,
        ...drop,
      },
      'rk-bplus',
    ),
    reckoner(
      'ladder',
      'dropper-ladder',
      {
        startVoltage: { ref: 'bplus.averageDc' },
        stages: [
          {
            label: 'B+2',
            targetVoltage: '280 V',
            current: '6 mA',
            capacitance: '22 µF',
            ...(o.rating ? { capacitorRating: o.rating } : {}),
            fittedResistance: '4k7',
          },
          {
            label: 'B+3',
            targetVoltage: '250 V',
            current: '3 mA',
            capacitance: '22 µF',
            ...(o.rating ? { capacitorRating: o.rating } : {}),
            fittedResistance: '10k',
          },
        ],
      },
      'rk-ladder',
    ),
    reading('Loaded B+ at the reservoir', 'V', { ref: 'bplus.averageDc' }, { measure: 'dc' }, 'rd-bplus'),
    reading(
      'Cathode voltage',
      'V',
      { literal: '10.5 V' },
      { measure: 'dc', followsMains: true },
      'rd-cathode',
    ),
    heading('4. Switch-off and discharge'),
    note(
      'The filter stays charged after switch-off; never rely on the bleeder.',
      { discharge: true },
      'danger',
      'hz-off',
    ),
    check('Unit switched off and unplugged.', {}, 'ck-off-2'),
    wait(5, 'probe', 'ck-probe-final'),
    verified('60 V', 'ck-final-verified'),
  ];
}

const SOUND: Record<string, Sound> = {
  '230 V, valve rectifier, bleeder, capacitors rated 500 V': {
    mains: 230,
    rectifier: 'valve',
    bleeder: '220k',
    rating: '500 V',
  },
  '230 V, silicon bridge, no bleeder': { mains: 230, rectifier: 'silicon-bridge' },
  '120 V, silicon bridge, bleeder, capacitors rated 500 V': {
    mains: 120,
    rectifier: 'silicon-bridge',
    bleeder: '100k',
    rating: '500 V',
  },
  '120 V, valve rectifier, no bleeder': { mains: 120, rectifier: 'valve' },
  '230 V, silicon centre-tap, bleeder, no ratings stated': {
    mains: 230,
    rectifier: 'silicon-centre-tap',
    bleeder: '150k',
  },
};

const paramsOf = (o: Sound): ProcedureParams => (o.mains === 230 ? mains230 : mains120);
const BASE: Sound = SOUND['230 V, valve rectifier, bleeder, capacitors rated 500 V']!;

/** The base sound procedure with one change: a node replaced, removed or inserted by id. */
function plant(change: (nodes: DocNode[]) => DocNode[], o: Sound = BASE) {
  return checkProcedure(doc(...change(soundNodes(o))), paramsOf(o));
}
const idOf = (n: DocNode) => n.attrs?.id;
const replace = (id: string, by: DocNode | DocNode[]) => (nodes: DocNode[]) =>
  nodes.flatMap((n) => (idOf(n) === id ? by : [n]));
const remove = (id: string) => replace(id, []);
const editAttrs = (id: string, patch: Record<string, unknown>) => (nodes: DocNode[]) =>
  nodes.map((n) => (idOf(n) === id ? { ...n, attrs: { ...n.attrs, ...patch } } : n));
const editInputs =
  (id: string, patch: (inputs: Record<string, unknown>) => Record<string, unknown>) => (nodes: DocNode[]) =>
    nodes.map((n) =>
      idOf(n) === id
        ? { ...n, attrs: { ...n.attrs, inputs: patch(n.attrs!.inputs as Record<string, unknown>) } }
        : n,
    );

/** Exactly one finding, of this code, on this block. */
function expectOnly(
  warnings: ReturnType<typeof checkProcedure>['warnings'],
  code: string,
  blockId: string | null,
) {
  const findings = findingsOf(warnings);
  expect(findings.map((w) => [w.code, w.blockId])).toEqual([[code, blockId]]);
  const message = findings[0]!.message;
  // For people: no dotted input paths, no internal keys.
  expect(message).not.toMatch(/\b[a-z]+\.\d+\.[a-z]+\b/i);
  return message;
}

describe('sound procedures give no finding of the check’s own', () => {
  it.each(Object.entries(SOUND))('%s', (_, o) => {
    const { warnings, snapshot } = checkProcedure(doc(...soundNodes(o)), paramsOf(o));
    for (const b of snapshot.blocks)
      expect(b.ok, `${b.name}: ${b.ok ? '' : JSON.stringify(b.errors)}`).toBe(true);
    expect(findingsOf(warnings)).toEqual([]);
  });
});

describe('faulty procedures: one planted fault each, flagged with its code', () => {
  it('a live reading after the last discharge verification, the only later step saying "do not discharge the caps yet" (discharge-check-missing)', () => {
    const { warnings } = plant((nodes) => [
      ...remove('ck-final-verified')(nodes),
      reading(
        'Bias after warm-up',
        'V',
        { literal: '-40 V' },
        { measure: 'dc', followsMains: true },
        'rd-late',
      ),
      check('Do not discharge the caps yet: leave the meter clipped on.', {}, 'ck-words'),
    ]);
    const message = expectOnly(warnings, 'discharge-check-missing', 'rd-late');
    expect(message).toContain('Bias after warm-up');
  });

  it('a cold procedure with a 400 V reckoner and no discharge-verified step, only a confirmation mentioning discharge (discharge-check-missing)', () => {
    const { warnings } = checkProcedure(
      doc(
        opening(),
        heading('Capacitor check, unplugged'),
        note('The reservoir may hold 400 V after switch-off.', { discharge: true }),
        fuse([{ label: 'HT', volts: '290 V', amps: '150 mA' }]),
        reckoner('noLoad', 'peak-no-load', {
          windingVoltage: '290 V',
          mainsNominal: { param: 'mainsNominal' },
          rectifier: 'silicon-bridge',
        }),
        check('Capacitors discharged — tick when done.'),
        reading('Reservoir capacitance', 'F', { literal: '47 µF' }),
      ),
      mains230,
    );
    expectOnly(warnings, 'discharge-check-missing', null);
  });

  it('a discharge verified only below 100 V (discharge-threshold-high)', () => {
    const { warnings } = plant(
      editAttrs('ck-final-verified', { threshold: '100 V', text: 'Capacitors below 100 V on the meter.' }),
    );
    // The text states 100 V, so the step also needs a note before it in its section: it has one (hz-off).
    const message = expectOnly(warnings, 'discharge-threshold-high', 'ck-final-verified');
    expect(message).toContain('100 V');
    expect(message).toContain('60 V');
  });

  it('a bleeder that needs 443 s to reach 60 V beside a step that waits 10 s (wait-shorter-than-bleeder)', () => {
    // R C ln(V0/Vt) = 443 s with V0 = 500 V, Vt = 60 V: R C = 443 / ln(500/60), C = 100 µF → R ≈ 2.09 MΩ.
    const C = 100e-6;
    const R = 443 / Math.log(500 / 60) / C;
    const { warnings } = plant((nodes) =>
      replace(
        'rk-bleed',
        reckoner(
          'bleed',
          'bleeder',
          {
            capacitance: '100 µF',
            chargedVoltage: '500 V',
            bleederResistance: `${Math.round(R)} Ω`,
            targetTime: '600 s',
          },
          'rk-bleed',
        ),
      )(replace('ck-wait-bleeder', wait(10, 'bleeder', 'ck-wait-bleeder'))(nodes)),
    );
    const message = expectOnly(warnings, 'wait-shorter-than-bleeder', 'ck-wait-bleeder');
    const t = Math.round(R) * C * Math.log(500 / 60);
    expect(t).toBeCloseTo(443, 0);
    expect(message).toContain('waits 10 s');
    expect(message).toContain(`${Math.round(t)} s`);
    expect(message).toContain('60 V');
  });

  it('a 10 s wait on a bleeder whose time the reckoner gives as longer (wait-shorter-than-bleeder)', () => {
    const { warnings } = plant(replace('ck-wait-bleeder', wait(10, undefined, 'ck-wait-bleeder')));
    // A wait drains through the bleeder unless it says otherwise. 220 kΩ × 80 µF = 17.6 s time
    // constant; from √2 × 290 V × 1.1 − 15 V ≈ 436 V down to 60 V takes ln(436/60) ≈ 1.98 of them.
    const t = 220e3 * 80e-6 * Math.log((Math.SQRT2 * 290 * 1.1 - 15) / 60);
    const message = expectOnly(warnings, 'wait-shorter-than-bleeder', 'ck-wait-bleeder');
    expect(message).toContain('waits 10 s');
    expect(message).toContain(`${t.toPrecision(3)} s`);
  });

  it('a live step whose only note is about a hot soldering iron (live-step-unguarded)', () => {
    const { warnings } = checkProcedure(
      doc(
        heading('Bias check'),
        note('The soldering iron is hot: park it in its stand.', undefined, 'warning'),
        fuse([{ label: 'Bias', volts: '50 V', amps: '20 mA' }]),
        reading('Bias rail', 'V', { literal: '-40 V' }, { measure: 'dc', followsMains: true }, 'rd-bias'),
        verified(),
      ),
      mains230,
    );
    const message = expectOnly(warnings, 'live-step-unguarded', 'rd-bias');
    expect(message).toMatch(/one hand/);
    expect(message).toMatch(/isolation transformer or current-limited/);
  });

  it('a live check step after an opening note flagged one hand only, with no isolated or current-limited bring-up (live-step-unguarded)', () => {
    const { warnings } = plant(
      replace(
        'hz-opening',
        note(
          'Lethal voltages. Work one hand only.',
          { oneHand: true, discharge: true },
          'danger',
          'hz-opening',
        ),
      ),
    );
    const findings = findingsOf(warnings);
    expect(new Set(findings.map((w) => w.code))).toEqual(new Set(['live-step-unguarded']));
    // Every live step of the base procedure: the lamp check and the powered readings.
    expect(findings.map((w) => w.blockId)).toEqual([
      'ck-lamp',
      'rd-mains',
      'rd-heater',
      'rd-noload',
      'rd-bplus',
      'rd-cathode',
    ]);
    for (const w of findings) expect(w.message).not.toMatch(/one hand only;/);
  });

  it('a B+ of 495 V mentioned only in a check step, in a section without a note (hazard-note-missing)', () => {
    const { warnings } = plant((nodes) => [
      ...nodes,
      heading('5. Paperwork'),
      check('Record on the job card that B+ read 495 V at high mains.', {}, 'ck-495'),
    ]);
    const message = expectOnly(warnings, 'hazard-note-missing', 'ck-495');
    expect(message).toContain('495 V');
  });

  it('a reading expecting 350 V whose section note comes after it (hazard-note-missing)', () => {
    const { warnings } = plant((nodes) => [
      ...nodes,
      heading('5. Spot check'),
      reading('B+ spot check', 'V', { literal: '350 V' }, { measure: 'dc', followsMains: true }, 'rd-spot'),
      note('B+ is live at 350 V.'),
      verified('60 V', 'ck-spot-verified'),
    ]);
    const message = expectOnly(warnings, 'hazard-note-missing', 'rd-spot');
    expect(message).toContain('350 V');
  });

  it('a no-load section above 400 V with no hazard note (hazard-note-missing)', () => {
    const { warnings } = plant(remove('hz-noload'));
    // The reckoner and both readings above 60 V in that section; the heater reading (6.9 V) is not.
    expect(findingsOf(warnings).map((w) => [w.code, w.blockId])).toEqual([
      ['hazard-note-missing', 'rk-noload'],
      ['hazard-note-missing', 'rd-mains'],
      ['hazard-note-missing', 'rd-noload'],
    ]);
  });

  it('a reservoir rated 450 V under a no-load DC that reaches about 481 V at high mains (capacitor-rating-low)', () => {
    // 290 V rated winding, 10 % unloaded rise, mains +10 %: √2 × 290 × 1.1 × 1.1 − 15 V.
    const high = Math.SQRT2 * 290 * 1.1 * 1.1 - 15;
    expect(high).toBeGreaterThan(450);
    const { warnings } = plant(editInputs('rk-bplus', (i) => ({ ...i, reservoirRating: '450 V' })));
    const message = expectOnly(warnings, 'capacitor-rating-low', 'rk-bplus');
    expect(message).toContain('Reservoir voltage rating');
    expect(message).toContain('450 V');
    expect(message).toContain(`${Math.round(high)} V`);
    expect(message).toContain('253 V');
  });

  it('a ladder capacitor rated 400 V on a 120 V supply whose no-load DC reaches about 477 V at high mains (capacitor-rating-low)', () => {
    const o = SOUND['120 V, silicon bridge, bleeder, capacitors rated 500 V']!;
    // 280 V winding, 10 % rise, mains +10 %, two bridge diodes of 0.9 V.
    const high = Math.SQRT2 * 280 * 1.1 * 1.1 - 1.8;
    const { warnings } = plant(
      editInputs('rk-ladder', (i) => ({
        ...i,
        stages: (i.stages as Record<string, unknown>[]).map((s, k) =>
          k === 1 ? { ...s, capacitorRating: '400 V' } : s,
        ),
      })),
      o,
    );
    const message = expectOnly(warnings, 'capacitor-rating-low', 'rk-ladder');
    // Named by the registry's labels, row counted from one.
    expect(message).toContain('Node 2 capacitor voltage rating is 400 V');
    expect(message).toContain(`${Math.round(high)} V`);
    expect(message).toContain('132 V');
  });

  it('two blocks giving the same rectifier valve a 20 V and a 15 V drop (part-values-differ)', () => {
    const { warnings } = plant(editInputs('rk-noload', (i) => ({ ...i, valveDrop: '20 V' })));
    const message = expectOnly(warnings, 'part-values-differ', 'rk-bplus');
    expect(message).toContain('20 V');
    expect(message).toContain('15 V');
    // Blocks by their labels, never by the internal names references use.
    expect(message).toContain('the Peak and no-load DC block');
    expect(message).toContain('the Loaded B+ (capacitor input) block');
    expect(message).not.toMatch(/noLoad|bplus/);
  });

  it('a typed voltage reading that does not say whether it follows the mains (reading-mains-unstated)', () => {
    const { warnings } = plant(editAttrs('rd-heater', { followsMains: undefined }));
    const message = expectOnly(warnings, 'reading-mains-unstated', 'rd-heater');
    expect(message).toContain('will not follow the bench mains');
  });

  it('a hold point reading with no tolerance, so no band that could stop the run (hold-point-without-band)', () => {
    const { warnings } = plant(editAttrs('rd-primary', { tolerance: '', holdPoint: true }));
    const held = warnings.filter((w) => w.code === 'hold-point-without-band');
    expect(held.map((w) => w.blockId)).toEqual(['rd-primary']);
    expect(held[0]!.message).toContain('no reading there can stop the run');
    // With its band the same hold point is not reported.
    const banded = plant(editAttrs('rd-primary', { holdPoint: true }));
    expect(banded.warnings.filter((w) => w.code === 'hold-point-without-band')).toEqual([]);
  });

  it('a quick-acting fuse on the transformer primary (reckoner-caution quick-acting-fuse)', () => {
    const { warnings } = plant(editInputs('rk-fuse', (i) => ({ ...i, fuseType: 'F' })));
    expect(findingsOf(warnings)).toEqual([]);
    const quick = warnings.filter((w) => w.caution === 'quick-acting-fuse');
    expect(quick).toHaveLength(1);
    expect(quick[0]!.code).toBe('reckoner-caution');
    expect(quick[0]!.level).not.toBe('note');
  });

  it('a reading with no tolerance (reading-without-tolerance)', () => {
    const { warnings } = plant(editAttrs('rd-primary', { tolerance: '' }));
    expectOnly(warnings, 'reading-without-tolerance', 'rd-primary');
  });

  it('a reading bound to an output its block does not have (reading-unresolved)', () => {
    const { warnings } = plant(editAttrs('rd-bplus', { expected: { ref: 'bplus.loadedDc' } }));
    expectOnly(warnings, 'reading-unresolved', 'rd-bplus');
  });

  it('a hazard note with no words, its flags kept (block-empty)', () => {
    const { warnings } = plant(replace('hz-opening', note('  ', LIVE_WORK, 'danger', 'hz-opening')));
    expect(expectOnly(warnings, 'block-empty', 'hz-opening')).toMatch(/hazard note at the top .* is empty/);
  });

  it('a check step with no words (block-empty)', () => {
    const { warnings } = plant((nodes) => [...nodes, check('', {}, 'ck-empty')]);
    expect(expectOnly(warnings, 'block-empty', 'ck-empty')).toMatch(/check step under “.+” is empty/);
  });

  it('a powered procedure without a mains-fuse reckoner (fuse-reckoner-missing)', () => {
    const { warnings } = plant((nodes) => nodes.filter((n) => n.attrs?.kind !== 'mains-fuse'));
    expectOnly(warnings, 'fuse-reckoner-missing', null);
  });

  it('a winding voltage that is not a number, named by its label, not its path (reckoner-input-error)', () => {
    const { warnings } = plant(
      editInputs('rk-fuse', (i) => ({
        ...i,
        windings: (i.windings as Record<string, unknown>[]).map((w, k) =>
          k === 0 ? { ...w, volts: 'lots' } : w,
        ),
      })),
    );
    const message = expectOnly(warnings, 'reckoner-input-error', 'rk-fuse');
    expect(message).toContain('Winding 1 voltage is not a number ("lots")');
    expect(message).toMatch(/^The Mains fuse block/);
    expect(message).not.toContain('windings.0.volts');
    expect(message).not.toContain('“fuse”');
  });

  it('two reckoners referring to each other in a cycle (procedure-error)', () => {
    const { warnings } = plant((nodes) => [
      ...nodes,
      heading('5. Spare'),
      note('Cold bench only.', undefined, 'warning'),
      reckoner('a', 'bleeder', {
        capacitance: '1 µF',
        chargedVoltage: '10 V',
        bleederResistance: { ref: 'b.maxBleeder' },
      }),
      reckoner('b', 'bleeder', {
        capacitance: '1 µF',
        chargedVoltage: '10 V',
        bleederResistance: { ref: 'a.maxBleeder' },
      }),
    ]);
    const findings = findingsOf(warnings);
    expect(
      findings.some((w) => w.code === 'procedure-error' && w.blockId === null && /cycle/.test(w.message)),
    ).toBe(true);
    expect(new Set(findings.map((w) => w.code))).toEqual(
      new Set(['procedure-error', 'reckoner-input-error']),
    );
  });
});

describe('reckoner cautions reach the check', () => {
  it('every caution of every block appears with its level and block id; identical ones once', () => {
    const { warnings, snapshot } = checkProcedure(doc(...soundNodes(BASE)), mains230);
    const cautions = warnings.filter((w) => w.code === 'reckoner-caution');
    for (const block of snapshot.blocks) {
      if (!block.ok) continue;
      for (const c of block.cautions) {
        expect(
          cautions.some((w) => w.caution === c.code && w.level === c.level && w.message.endsWith(c.message)),
        ).toBe(true);
      }
    }
    expect(cautions.filter((w) => w.caution === 'local-codes')).toHaveLength(1);
    expect(cautions.find((w) => w.caution === 'local-codes')!.level).toBe('note');
    const own = new Map(snapshot.blocks.map((b) => [b.id, b.ok ? b.cautions.map((c) => c.code) : []]));
    for (const w of cautions) expect(own.get(w.blockId!)).toContain(w.caution);
  });

  it('a slow bleeder’s own caution appears on its block as a warning', () => {
    const { warnings } = plant(editInputs('rk-bleed', (i) => ({ ...i, bleederResistance: '2.2M' })));
    const slow = warnings.find((w) => w.caution === 'slow-discharge');
    expect(slow).toMatchObject({ code: 'reckoner-caution', level: 'warning', blockId: 'rk-bleed' });
  });
});

describe('shop options and the rules’ edges', () => {
  it('a shop safe voltage of 50 V flags the 60 V verifications', () => {
    const { warnings } = checkProcedure(doc(...soundNodes(BASE)), mains230, { safeVoltage: 50 });
    const high = findingsOf(warnings).filter((w) => w.code === 'discharge-threshold-high');
    expect(high.map((w) => w.blockId)).toEqual([
      'ck-cold-verified',
      'ck-noload-verified',
      'ck-final-verified',
    ]);
  });

  it('a bare number as the third argument is still the safe voltage', () => {
    const { warnings } = checkProcedure(doc(...soundNodes(BASE)), mains230, 50);
    expect(findingsOf(warnings).some((w) => w.code === 'discharge-threshold-high')).toBe(true);
  });

  it('the high-mains figure follows the shop option: +25 % takes the no-load DC past a 500 V rating', () => {
    // √2 × 290 × 1.1 × 1.25 − 15 ≈ 549 V > 500 V; at +10 % it is about 481 V.
    const { warnings } = checkProcedure(doc(...soundNodes(BASE)), mains230, { highMainsPercent: 25 });
    expect(findingsOf(warnings).filter((w) => w.code === 'capacitor-rating-low').length).toBeGreaterThan(0);
  });

  it('a probe drain is not held against the bleeder’s time, and a wait for nothing is not either', () => {
    for (const drain of ['probe', 'none'] as const) {
      const { warnings } = plant(replace('ck-wait-bleeder', wait(5, drain, 'ck-wait-bleeder')));
      expect(findingsOf(warnings)).toEqual([]);
    }
  });

  it('a reading in volts marked not live (a residual voltage on a switched-off unit) needs no live-work note', () => {
    const { warnings } = checkProcedure(
      doc(
        heading('Residual check'),
        note('The filter may hold charge.', { discharge: true }),
        fuse([{ label: 'HT', volts: '50 V', amps: '20 mA' }]),
        reading(
          'Residual at the reservoir',
          'V',
          { literal: '5 V' },
          { measure: 'dc', followsMains: false, live: false },
        ),
      ),
      mains230,
    );
    expect(findingsOf(warnings)).toEqual([]);
  });

  it('reads voltages written in running text with the one parser', () => {
    expect(
      voltagesIn('B+ of 495 V, bias −42 V, heaters 6V3, HT 300 VAC, 0.5 kV, 2k2 10 W, 0.1 µF 630 V, 60 s'),
    ).toEqual([495, 42, 6.3, 300, 500, 630]);
  });
});

describe('the new attributes are validated with a field message', () => {
  const problems = (node: DocNode) => {
    const v = validateDocument(doc(node));
    return v.ok ? [] : v.problems;
  };
  it.each([
    [check('x', { kind: 'discharge-verified' }), 'content.0.attrs.threshold', /needs the voltage/],
    [
      check('x', { kind: 'discharge-verified', threshold: 'sixty' }),
      'content.0.attrs.threshold',
      /not a voltage/,
    ],
    [
      check('x', { kind: 'discharge-verified', threshold: '60 V rms' }),
      'content.0.attrs.threshold',
      /DC voltage/,
    ],
    [
      check('x', { kind: 'discharge-verified', threshold: '5 kV' }),
      'content.0.attrs.threshold',
      /at most 1000 V/,
    ],
    [check('x', { kind: 'wait' }), 'content.0.attrs.seconds', /duration in seconds/],
    [check('x', { kind: 'wait', seconds: 0 }), 'content.0.attrs.seconds', /more than 0 s/],
    [check('x', { kind: 'wait', seconds: '10 s' }), 'content.0.attrs.seconds', /number of seconds/],
    [
      check('x', { kind: 'confirm', threshold: '60 V' }),
      'content.0.attrs.threshold',
      /only a discharge-verified step/,
    ],
    [check('x', { drain: 'probe' }), 'content.0.attrs.drain', /only a wait step/],
    [check('x', { kind: 'later' }), 'content.0.attrs.kind', /one of: confirm, discharge-verified, wait/],
    [check('x', { live: 'yes' }), 'content.0.attrs.live', /true|false/],
    [reading('r', 'V', { literal: '5 V' }, { live: 1 }), 'content.0.attrs.live', /true|false/],
    [note('n', { twoHands: true } as never), 'content.0.attrs.flags', /unknown flag "twoHands"/],
    [note('n', { oneHand: 'yes' } as never), 'content.0.attrs.flags.oneHand', /true|false/],
  ])('%# refuses bad input at %s', (node, path, reason) => {
    const found = problems(node).find((p) => p.path === path);
    expect(found?.reason).toMatch(reason);
  });

  it('keeps documents stored before the attributes existed, and reads the editor’s nulls as absent', () => {
    const old = doc(
      check('Capacitors discharged.', {}, 'ck-old-1'),
      note('Danger.', undefined, 'danger', 'hz-old-1'),
    );
    expect(validateDocument(old).ok).toBe(true);
    const fromEditor = validateDocument(
      doc(check('x', { kind: null, threshold: null, seconds: null, drain: null, live: null }, 'ck-null-1')),
    );
    expect(fromEditor.ok && fromEditor.doc.content[0]!.attrs).toEqual({ id: 'ck-null-1', text: 'x' });
  });
});

describe('the check runs on the editor’s unsaved document', () => {
  it('does not throw on a threshold that is not a voltage yet, or on the editor’s nulls', async () => {
    const { lintProcedure } = await import('../../../shared/document/lint');
    const { evaluateDocument } = await import('../../../shared/document/evaluate');
    const d = doc(
      ...soundNodes(BASE),
      check('x', { kind: 'discharge-verified', threshold: 'sixty', seconds: null, drain: null, live: null }),
      check('y', { kind: 'wait', seconds: null, threshold: null, drain: null, live: null }),
      note('n', null as never),
    );
    const warnings = lintProcedure(d, evaluateDocument(d, mains230));
    expect(findingsOf(warnings)).toEqual([]);
  });
});
