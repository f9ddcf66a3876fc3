/**
 * A deterministic corpus of invented procedures for search relevance tests and the search
 * benchmark. Same seed, same corpus: every run measures the same thing.
 */
import type { IndexedProcedure } from '../../server/search/search-index';

/** mulberry32: a tiny seeded PRNG (public-domain algorithm). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A copy in a seeded random order (Fisher–Yates). */
export function shuffled<T>(items: readonly T[], seed: number): T[] {
  const r = rng(seed);
  const out = [...items];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

const FAMILIES = [
  'Guitar amplifier',
  'Hi-fi amplifier',
  'Table radio',
  'Bass amplifier',
  'Organ amplifier',
  'Communications receiver',
  'Test oscillator',
  'Public-address amplifier',
];
const TASKS = [
  'first power-up on a current-limited supply',
  'mains fuse and inrush check',
  'no-load and loaded B+ rail check',
  'heater supply check',
  'reservoir capacitor replacement and re-test',
  'rectifier swap and re-test',
  'bleeder retrofit',
  'dropping resistor ladder check',
  'output stage bias check',
  'hum and ripple check',
];
const TAGS = [
  'fuse',
  'b+',
  'heater',
  'capacitor',
  'rectifier',
  'bleeder',
  'ripple',
  'bias',
  'first power-up',
  'recap',
  'mains',
  'ladder',
];
const READINGS = [
  'B+ at the reservoir',
  'B+2 at the screen node',
  'Heater winding unloaded',
  'Primary current at switch-on',
  'Ripple at the first node',
  'Bias voltage at the grid',
  'Cathode voltage',
  'HT winding each half',
  'Bleeder discharge time',
  'Dropper resistor drop',
];
const SENTENCES = [
  (r: () => number) =>
    `Measure B+ at the reservoir capacitor: expect ${300 + Math.round(r() * 150)} V loaded.`,
  (r: () => number) =>
    `The heater winding supplies 6.3 V at ${(1 + Math.round(r() * 40) / 10).toFixed(1)} A to the valve line-up.`,
  (r: () => number) =>
    `Fit a time-delay fuse rated ${[0.5, 0.63, 0.8, 1, 1.25, 1.6, 2][Math.floor(r() * 7)]} A in the mains inlet.`,
  (r: () => number) =>
    `Replace the reservoir with ${[22, 32, 47, 68, 100, 220][Math.floor(r() * 6)]} µF rated at least 450 V.`,
  (r: () => number) =>
    `Check the dropping resistor of ${[1, 2.2, 4.7, 10, 22][Math.floor(r() * 5)]} kΩ between B+1 and B+2 for heat.`,
  () => 'Discharge the filter capacitors and verify below 60 V with a meter before touching.',
  () => 'Bring the unit up on a series lamp and watch the primary current.',
  (r: () => number) =>
    `Ripple at the first filter node should stay under ${1 + Math.round(r() * 9)} V peak to peak.`,
  () => 'Inspect the power transformer for overheating and a smell of varnish.',
  () => 'Confirm the rectifier valve glows evenly and shows no flashover.',
];

export function generateCorpus(count: number, seed = 20261202): IndexedProcedure[] {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)]!;
  const out: IndexedProcedure[] = [];
  for (let i = 0; i < count; i++) {
    const model = `${String.fromCharCode(65 + Math.floor(r() * 26))}${String.fromCharCode(65 + Math.floor(r() * 26))}-${100 + i}`;
    const family = pick(FAMILIES);
    const task = pick(TASKS);
    const body = Array.from({ length: 4 + Math.floor(r() * 5) }, () => pick(SENTENCES)(r)).join('\n');
    out.push({
      id: `gen-${i}`,
      revisionId: `gen-rev-${i}`,
      revisionNumber: 1 + Math.floor(r() * 4),
      title: `${model} ${task}`,
      family,
      model,
      tags: [...new Set([pick(TAGS), pick(TAGS)])],
      body,
      readings: Array.from(
        { length: 1 + Math.floor(r() * 3) },
        () => `${pick(READINGS)} — TP${1 + Math.floor(r() * 9)}`,
      ).join('\n'),
      reckoners: `fuse: recommended fuse ${pick(['800 mA', '1 A', '1.25 A', '1.6 A'])} time-delay (T)`,
    });
  }
  return out;
}

/** Procedures with distinctive content, planted among the generated ones, that labelled queries target. */
export const PLANTED: IndexedProcedure[] = [
  {
    id: 'planted-squeal',
    revisionId: 'planted-squeal-r',
    revisionNumber: 2,
    title: 'Output transformer squeal under load on the MV-77 organ',
    family: 'Organ amplifier',
    model: 'MV-77',
    tags: ['output transformer', 'oscillation'],
    body: 'A high-pitched squeal from the output transformer appears once B+ passes 380 V.\nCheck the feedback loop phasing and the grid stoppers.',
    readings: 'B+ at the reservoir — TP2',
    reckoners: '',
  },
  {
    id: 'planted-filament',
    revisionId: 'planted-filament-r',
    revisionNumber: 1,
    title: 'Series filament string check on the KR-4 five-valve receiver',
    family: 'Communications receiver',
    model: 'KR-4',
    tags: ['series heater', 'dropper'],
    body: 'The filament string runs in series from the mains through a 150 Ω dropper resistor.\nMeasure 12.6 V across the converter valve filament.',
    readings: 'Filament string current — dropper, mains end',
    reckoners: 'string: total current 150 mA; dropper 150 Ω',
  },
  {
    id: 'planted-slowblow',
    revisionId: 'planted-slowblow-r',
    revisionNumber: 3,
    title: 'Inlet fuse upgrade for the PB-900 bass head',
    family: 'Bass amplifier',
    model: 'PB-900',
    tags: ['fuse', 'inrush'],
    body: 'Replace the quick-acting inlet fuse with a slow-blow 3.15 A type; the 470 µF reservoir charge surge blows the quick type at switch-on.\nThe soft-start thermistor is optional.',
    readings: 'Primary current at switch-on — inlet',
    reckoners: 'fuse: recommended fuse 3.15 A time-delay (T)',
  },
  {
    id: 'planted-xfmr',
    revisionId: 'planted-xfmr-r',
    revisionNumber: 1,
    title: 'Mains transformer rewind acceptance test for the GT-12',
    family: 'Test oscillator',
    model: 'GT-12',
    tags: ['transformer', 'insulation'],
    body: 'After the rewind, check each winding unloaded and the insulation between primary and the HT winding at 500 V DC.\nThe 6.3V heater winding must read within 5 % unloaded.',
    readings: 'HT winding unloaded — secondary tags',
    reckoners: '',
  },
  {
    id: 'planted-cap',
    revisionId: 'planted-cap-r',
    revisionNumber: 2,
    title: 'Can capacitor restuffing on the DL-5 public-address amplifier',
    family: 'Public-address amplifier',
    model: 'DL-5',
    tags: ['recap', 'can capacitor'],
    body: 'Restuff the 40+40 µF can capacitor with two 47uF 500 V parts and keep the original can for appearance.\nReform any doubtful capacitor slowly on a current-limited supply.',
    readings: 'Leakage current at 450 V — each section',
    reckoners: '',
  },
  {
    id: 'planted-rectvalve',
    revisionId: 'planted-rectvalve-r',
    revisionNumber: 1,
    title: 'Rectifier valve to silicon conversion on the RS-40 organ amplifier',
    family: 'Organ amplifier',
    model: 'RS-40',
    tags: ['rectifier', 'conversion'],
    body: 'The 5AR4 rectifier valve is replaced by two 1N4007 diodes in series in each leg, fitted on a tag strip beside the valve base.\nExpect B+ to rise by about 25 V without the valve drop; add a 100 Ω series resistor to bring it back.\nThe GZ34 is the same type and may be fitted instead when the original sound is wanted.',
    readings: 'B+ at the reservoir after conversion — TP1',
    reckoners: '',
  },
  {
    id: 'planted-outputpair',
    revisionId: 'planted-outputpair-r',
    revisionNumber: 2,
    title: 'EL34 output pair matching and bias set on the QA-8 hi-fi amplifier',
    family: 'Hi-fi amplifier',
    model: 'QA-8',
    tags: ['bias', 'output valves'],
    body: 'Fit a matched pair of EL34 output valves and set each cathode current with the bias trimmer.\nThe ECC83 phase splitter shares the 6.3 V heater winding; check it glows before setting bias.',
    readings: 'Cathode current, each EL34 — 1 Ω sense resistor',
    reckoners: '',
  },
];
