/**
 * Prints median times for one loaded-B+ evaluation and for a 30-block procedure.
 * Goals: under 5 ms and under 20 ms, so the editor can recompute on every keystroke.
 * Figures only; not a timed test.
 */
import { evaluateProcedure, runReckoner, type ProcedureBlock } from '../../shared/reckoners';

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

time('loaded B+ (one evaluation)', 200, 5, (i) => {
  const r = runReckoner('loaded-bplus', loaded(i));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
});

/** A 30-block procedure: five chains of six blocks each, linked by references and parameters. */
function procedure(i: number): ProcedureBlock[] {
  const blocks: ProcedureBlock[] = [];
  for (let c = 0; c < 5; c++) {
    const p = (s: string) => `c${c}_${s}`;
    blocks.push(
      {
        name: p('peak'),
        kind: 'peak-no-load',
        inputs: {
          windingVoltage: 290 + c,
          mainsActual: { param: 'mainsVoltage' },
          mainsNominal: { param: 'mainsNominal' },
        },
      },
      {
        name: p('bplus'),
        kind: 'loaded-bplus',
        inputs: {
          ...loaded(i + c),
          windingVoltage: { ref: `${p('peak')}.windingVoltage` },
          mainsFrequency: { param: 'mainsFrequency' },
        },
      },
      {
        name: p('ladder'),
        kind: 'dropper-ladder',
        inputs: {
          startVoltage: { ref: `${p('bplus')}.averageDc` },
          startRipple: { ref: `${p('bplus')}.ripplePeakToPeak` },
          stages: [
            { targetVoltage: '330 V', current: '60 mA', capacitance: '47u' },
            { targetVoltage: '300 V', current: '8 mA', capacitance: '22u' },
            { targetVoltage: '260 V', current: '2 mA', capacitance: '22u' },
          ],
        },
      },
      {
        name: p('fuse'),
        kind: 'mains-fuse',
        inputs: {
          windings: [
            {
              volts: { ref: `${p('peak')}.windingVoltage` },
              amps: { ref: `${p('bplus')}.windingRmsCurrent` },
            },
            { volts: '6.3 V', amps: '2.1 A' },
          ],
          mainsVoltage: { param: 'mainsVoltage' },
        },
      },
      {
        name: p('bleed'),
        kind: 'bleeder',
        inputs: {
          capacitance: '47u',
          chargedVoltage: { ref: `${p('peak')}.noLoadDcHigh` },
          bleederResistance: '220k',
        },
      },
      {
        name: p('reading'),
        kind: 'reading-tolerance',
        inputs: {
          unit: 'V',
          expected: { ref: `${p('ladder')}.stage1.nodeVoltage` },
          tolerance: '±10 %',
          measured: 318 + (i % 3),
        },
      },
    );
  }
  return blocks;
}

time('30-block procedure (5 × 6 blocks)', 100, 20, (i) => {
  const r = evaluateProcedure(procedure(i), { mainsVoltage: 236, mainsNominal: 230, mainsFrequency: 50 });
  const bad = r.blocks.filter((b) => !b.ok);
  if (bad.length || r.errors.length) throw new Error(JSON.stringify({ bad, errors: r.errors }));
});
