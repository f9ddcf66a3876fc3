import { describe, expect, it } from 'vitest';
import type { ResolvedReading } from '../../../../shared/document/evaluate';
import {
  isLiveReading,
  reading,
  readingAttrs,
  type ReadingAttrs,
} from '../../../../shared/document/nodes/reading';

const attrs: ReadingAttrs = {
  id: 'reading-01',
  label: 'Heater <AC>',
  testPoint: 'V1 pins 4–5',
  meterRange: 'AC 20 V',
  unit: 'V',
  measure: 'rms',
  expected: { literal: '6.3 V' },
  tolerance: '±10 %',
};
const resolved = {
  id: 'reading-01',
  label: 'Heater <AC>',
  testPoint: 'V1 pins 4–5',
  meterRange: 'AC 20 V',
  unit: 'V',
  measure: 'rms',
  section: 'Heaters',
  toleranceText: '±10 %',
  expectedSource: '6.3 V',
  expected: 6.3,
  low: 5.67,
  high: 6.93,
  bandText: '5.67 V … 6.93 V',
} satisfies ResolvedReading;
const node = { type: 'reading', attrs };
const found = (id: string) => (id === resolved.id ? resolved : undefined);

describe('reading node', () => {
  it('schema: units come from the one unit list; a measure only on volts and amps', () => {
    expect(readingAttrs.safeParse(attrs).success).toBe(true);
    expect(readingAttrs.safeParse({ ...attrs, unit: 'parsec' }).success).toBe(false);
    const ohms = readingAttrs.safeParse({ ...attrs, unit: 'Ω' });
    expect(ohms.success ? [] : ohms.error.issues.map((i) => i.path.join('.'))).toEqual(['measure']);
  });

  it('live work: volts, amps, watts and hertz unless marked otherwise; ohms, farads, seconds, percent if marked', () => {
    const live = (unit: ReadingAttrs['unit'], mark?: boolean) => isLiveReading({ unit, live: mark });
    expect(['V', 'A', 'W', 'Hz', 'Ω', 'F', 's', '%'].map((u) => live(u as ReadingAttrs['unit']))).toEqual([
      true,
      true,
      true,
      true,
      false,
      false,
      false,
      false,
    ]);
    expect(live('V', false)).toBe(false);
    expect(live('Ω', true)).toBe(true);
  });

  it('upgrade: a volts reading stored without a measure takes it from its meter range, else DC', () => {
    const stored = (meterRange: string, unit: ReadingAttrs['unit'] = 'V') =>
      reading.upgrade({ ...attrs, unit, measure: undefined, meterRange })?.measure;
    expect(stored('AC 20 V')).toBe('rms');
    expect(stored('200 V p-p')).toBe('peak-to-peak');
    expect(stored('DC 1000 V')).toBe('dc');
    expect(stored('2 kΩ', 'Ω')).toBeUndefined();
    expect(reading.upgrade(attrs)).toBeUndefined();
  });

  it('plain text: one line with label, test point, meter range and tolerance; "(live)" only when marked', () => {
    expect(reading.text(attrs)).toEqual(['Reading: Heater <AC> at V1 pins 4–5 (AC 20 V), tolerance ±10 %']);
    expect(reading.text({ ...attrs, live: true })[0]).toMatch(/^Reading \(live\): /);
  });

  it('HTML: escaped, with the band from the snapshot and live work for volts', () => {
    const html = reading.html(attrs, { node, children: () => '', reading: found, block: () => undefined });
    expect(html).toContain('<td>Heater &lt;AC&gt;</td>');
    expect(html).toContain('<td>5.67 V … 6.93 V (±10 %)</td>');
    expect(html).toContain('<th>Live work</th>');
    const cold = reading.html(
      { ...attrs, live: false },
      { node, children: () => '', reading: () => undefined, block: () => undefined },
    );
    expect(cold).toContain('not resolved: unknown');
    expect(cold).not.toContain('Live work');
  });

  it('run step: the resolved band at its place; none for a reading the snapshot lacks', () => {
    expect(reading.step(attrs, { node, section: 'Heaters', position: 3, reading: found })).toEqual({
      id: 'reading-01',
      kind: 'reading',
      position: 3,
      section: 'Heaters',
      text: 'Heater <AC>',
      reading: {
        testPoint: 'V1 pins 4–5',
        meterRange: 'AC 20 V',
        unit: 'V',
        measure: 'rms',
        toleranceText: '±10 %',
        expectedSource: '6.3 V',
        expected: 6.3,
        low: 5.67,
        high: 6.93,
        bandText: '5.67 V … 6.93 V',
      },
      live: true,
    });
    expect(reading.step(attrs, { node, section: '', position: 1, reading: () => undefined })).toBeNull();
  });
});
