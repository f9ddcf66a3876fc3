/**
 * Prints median times for one loaded-B+ evaluation (one filter simulation) and for a 30-block
 * procedure holding every reckoner kind.
 * Goals: under 5 ms and under 20 ms, so the editor can recompute on every keystroke.
 * Figures only; not a timed test.
 */
import { evaluateProcedure, runReckoner, type ProcedureBlock } from '../../shared/reckoners';
import { RECKONER_KINDS } from '../../shared/reckoners/registry';
import { TYPICAL_INPUTS } from '../shared/reckoners/examples';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function time(label: string, runs: number, goalMs: number, fn: (i: number) => void): void {
  for (let i = 0; i < 5; i++) fn(i); // warm up the JIT
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn(i);
    samples.push(performance.now() - t0);
  }
  const med = median(samples);
  const worst = Math.max(...samples);
  console.log(
    `${label.padEnd(38)} median ${med.toFixed(3)} ms   max ${worst.toFixed(3)} ms   goal < ${goalMs} ms   ${med < goalMs ? 'met' : 'NOT MET'}`,
  );
}

// Tallow Creek Valve Works TC-18 supply, varied a little per run so nothing is cached.
const loaded = (i: number) => ({
  windingVoltage: `${300 + (i % 7)} V`,
  sourceResistance: '85R',
  reservoir: '47u',
  mainsFrequency: 50,
  loadCurrent: `${90 + (i % 5)} mA`,
  rectifier: 'silicon-bridge',
});

time('loaded B+ (one filter simulation)', 200, 5, (i) => {
  const r = runReckoner('loaded-bplus', loaded(i));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
});

/**
 * A chain with one block of every registered kind, from an author's typical inputs, linked the way a
 * procedure links them: the winding follows the measured mains, the loaded B+ takes its source
 * resistance from the transformer-loading block, the ladder (an RC and an LC stage) starts from the
 * loaded B+, and the fuse, bleeder, ratings and reading read the others' outputs.
 */
function chain(c: number, i: number): ProcedureBlock[] {
  const p = (s: string) => `c${c}_${s}`;
  const at = (kind: string, inputs: Record<string, unknown>): ProcedureBlock => ({
    name: p(kind.replace(/-/g, '_')),
    kind,
    inputs: { ...TYPICAL_INPUTS[kind], ...inputs },
  });
  const ref = (kind: string, output: string) => ({ ref: `${p(kind.replace(/-/g, '_'))}.${output}` });
  return [
    at('peak-no-load', {
      windingVoltage: `${290 + c} V`,
      mainsActual: { param: 'mainsVoltage' },
      mainsNominal: { param: 'mainsNominal' },
    }),
    at('transformer-loading', { mainsVoltage: { param: 'mainsNominal' } }),
    at('loaded-bplus', {
      ...loaded(i + c),
      windingVoltage: ref('peak-no-load', 'windingVoltage'),
      sourceResistance: ref('transformer-loading', 'winding1.sourceResistance'),
      mainsFrequency: { param: 'mainsFrequency' },
    }),
    at('dropper-ladder', {
      startVoltage: ref('loaded-bplus', 'averageDc'),
      startRipple: ref('loaded-bplus', 'ripplePeakToPeak'),
      mainsFrequency: { param: 'mainsFrequency' },
      stages: [
        { targetVoltage: '330 V', current: '60 mA', capacitance: '47u' },
        {
          targetVoltage: '320 V',
          current: '8 mA',
          capacitance: '47u',
          element: 'choke',
          inductance: '5 H',
          fittedResistance: '150',
        },
        { targetVoltage: '260 V', current: '2 mA', capacitance: '22u' },
      ],
    }),
    at('choke-input', {
      windingVoltage: ref('peak-no-load', 'windingVoltage'),
      loadCurrent: `${150 + (i % 5)} mA`,
      mainsFrequency: { param: 'mainsFrequency' },
    }),
    at('heater-budget', {}),
    at('mains-fuse', {
      windings: [
        { volts: ref('peak-no-load', 'windingVoltage'), amps: ref('loaded-bplus', 'windingRmsCurrent') },
        { volts: '6.3 V', amps: ref('heater-budget', 'totalCurrent') },
      ],
      mainsVoltage: { param: 'mainsNominal' },
    }),
    at('switch-on-surge', {
      windingVoltage: ref('peak-no-load', 'windingVoltage'),
      mainsVoltage: { param: 'mainsNominal' },
      mainsFrequency: { param: 'mainsFrequency' },
    }),
    at('rectifier-substitution', { loadCurrent: `${90 + (i % 5)} mA` }),
    at('part-ratings', { loadCurrent: `${90 + (i % 5)} mA`, mainsFrequency: { param: 'mainsFrequency' } }),
    at('mains-conversion', {}),
    at('bleeder', { chargedVoltage: ref('peak-no-load', 'noLoadDcHigh') }),
    at('reading-tolerance', {
      expected: ref('dropper-ladder', 'stage1.nodeVoltage'),
      measured: 318 + (i % 3),
    }),
  ];
}

/** 30 blocks: two chains of every kind (13 each), and the two solver blocks once more with their sources. */
function procedure(i: number): ProcedureBlock[] {
  const again = new Set(['peak-no-load', 'transformer-loading', 'loaded-bplus', 'part-ratings']);
  return [...chain(0, i), ...chain(1, i), ...chain(2, i).filter((b) => again.has(b.kind))];
}

time('30-block procedure (every kind)', 100, 20, (i) => {
  const blocks = procedure(i);
  const kinds = new Set(blocks.map((b) => b.kind));
  if (blocks.length !== 30 || RECKONER_KINDS.some((k) => !kinds.has(k)))
    throw new Error(
      `${blocks.length} blocks, missing ${RECKONER_KINDS.filter((k) => !kinds.has(k)).join(', ')}`,
    );
  const r = evaluateProcedure(blocks, { mainsVoltage: 236, mainsNominal: 230, mainsFrequency: 50 });
  const bad = r.blocks.filter((b) => !b.ok);
  if (bad.length || r.errors.length) throw new Error(JSON.stringify({ bad, errors: r.errors }));
});
