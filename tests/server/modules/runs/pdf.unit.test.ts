import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { renderRunSheetPdf } from '../../../../server/modules/runs/pdf';
import type { EntryView, RunStep, RunView } from '../../../../shared/schemas/runs';
import { pdfText } from '../../../support/pdf-text';
import { snapshotAt } from '../../../shared/plots/run-snapshot';

const tom = { id: 't', displayName: 'Tom Achterberg' };
const at = '2026-03-04T05:06:07.890Z';

/** A signed run of `n` readings, each 250 V ±5 % measured at 240 V + i V. */
function run(n: number): RunView {
  const steps: RunStep[] = Array.from({ length: n }, (_, i) => ({
    id: `rd-${i}`,
    kind: 'reading',
    position: i + 1,
    section: 'Power supply',
    text: `Node ${i + 1} voltage`,
    reading: {
      testPoint: `TP${i + 1}`,
      meterRange: '1000 V DC',
      unit: 'V',
      measure: 'dc',
      toleranceText: '±5 %',
      expectedSource: 'number',
      expected: 250,
      low: 237.5,
      high: 262.5,
      bandText: '±5 %',
    },
  }));
  const entries: EntryView[] = steps.map((s, i) => ({
    stepId: s.id,
    kind: 'reading',
    raw: `${240 + i} V`,
    measured: 240 + i,
    unit: 'V',
    expected: 250,
    low: 237.5,
    high: 262.5,
    within: 240 + i <= 262.5,
    deviation: 240 + i - 250,
    deviationPercent: ((240 + i - 250) / 250) * 100,
    done: false,
    note: '',
    version: 1,
    lastKey: 'k',
    enteredBy: tom,
    enteredAt: at,
    history: [],
  }));
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
      changeReason: 'Bleeder value corrected',
      approvedAt: at,
      author: tom,
      contentHash: 'a'.repeat(64),
      signOffs: [],
    },
    params: { mainsVoltage: 230, mainsFrequency: 50, mainsNominal: 230 } as RunView['params'],
    snapshot: { params: {}, blocks: [], readings: [], errors: [] } as unknown as RunView['snapshot'],
    steps,
    entries,
    photos: [],
    signature: null,
    startedBy: tom,
    performedBy: tom,
    handovers: [],
    hold: null,
    closed: null,
    startedAt: at,
    signedAt: at,
    progress: { done: n, total: n, outOfTolerance: 1 },
    locked: [],
  };
}

/**
 * Where svg-to-pdfkit put the plot on its page, in points from the top left: it moves to the drawing's
 * corner (`1 0 0 1 x y cm`), scales pixels to points (0.75) and clips to the viewport's rectangle:
 * nothing of the drawing shows outside it.
 */
function plotBoxes(pdf: Buffer) {
  const raw = pdf.toString('latin1');
  const boxes: { x: number; y: number; width: number; height: number }[] = [];
  for (const m of raw.matchAll(/stream\r?\n/g)) {
    const start = m.index + m[0].length;
    let content: string;
    try {
      content = inflateSync(pdf.subarray(start, raw.indexOf('endstream', start))).toString('latin1');
    } catch {
      continue;
    }
    const n = String.raw`(-?[\d.]+)`;
    // Every drawing on the page, not only the first.
    const box = new RegExp(
      String.raw`1 0 0 1 ${n} ${n} cm\s+0\.75 0 0 0\.75 0 0 cm\s+q\s+0 0 m\s+${n} 0 l\s+\3 ${n} l\s+0 \4 l\s+h\s+W n`,
      'g',
    );
    for (const b of content.matchAll(box))
      boxes.push({ x: +b[1]!, y: +b[2]!, width: +b[3]! * 0.75, height: +b[4]! * 0.75 });
  }
  return boxes;
}

describe('the run-sheet PDF’s plot', () => {
  const A4 = { width: 595.28, height: 841.89, margin: 40 };

  it.each([3, 30, 60])('with %i readings lies within one page’s margins', async (n) => {
    const pdf = await renderRunSheetPdf(run(n));
    const boxes = plotBoxes(pdf);
    expect(boxes).toHaveLength(1);
    const b = boxes[0]!;
    expect(b.x).toBeCloseTo(A4.margin, 3);
    expect(b.x + b.width).toBeLessThanOrEqual(A4.width - A4.margin + 0.01);
    expect(b.y).toBeGreaterThanOrEqual(A4.margin);
    expect(b.y + b.height).toBeLessThanOrEqual(A4.height - A4.margin + 0.01);
    if (n <= 30) expect(b.width).toBeCloseTo(A4.width - 2 * A4.margin, 1);
    const lines = pdfText(pdf);
    expect(lines).toContain('Deviation from expected (%)');
    expect(lines).toContain(`${n}. Node ${n} voltage`);
  });

  it('prints a long hazard note whole, as the page shows it', async () => {
    const r = run(2);
    const text =
      'Lethal voltages. ' +
      Array.from(
        { length: 12 },
        (_, i) => `Caution sentence ${i + 1} about the stored charge on the reservoir.`,
      ).join(' ');
    expect(text.length).toBeGreaterThan(600);
    r.steps.push({ id: 'hz', kind: 'hazard', position: 3, section: 'Start', text });
    const lines = pdfText(await renderRunSheetPdf(r));
    expect(lines.join(' ').replace(/\s+/g, ' ')).toContain(`${text} [not done]`);
  });

  it('draws the run’s ladder and discharge pictures at its mains, each inside the page’s margins', async () => {
    const r = { ...run(3), snapshot: snapshotAt(207), params: { ...run(3).params, mainsVoltage: 207 } };
    const pdf = await renderRunSheetPdf(r);
    const boxes = plotBoxes(pdf);
    expect(boxes).toHaveLength(3); // the readings, then the two pictures
    for (const b of boxes) {
      expect(b.x).toBeCloseTo(A4.margin, 3);
      expect(b.x + b.width).toBeLessThanOrEqual(A4.width - A4.margin + 0.01);
      expect(b.y).toBeGreaterThanOrEqual(A4.margin);
      expect(b.y + b.height).toBeLessThanOrEqual(A4.height - A4.margin + 0.01);
    }
    const lines = pdfText(pdf).join('\n');
    expect(lines).toContain('ladder: node voltages down the ladder (at 207 V mains)');
    expect(lines).toContain('Node voltage (V DC)');
    expect(lines).toMatch(/bleed: discharge after switch-off \(at 207 V mains\)/);
  });
});
