/**
 * Source notes are read by technicians beside results and cautions: they cite the standard and
 * clause. Whether a figure was recalled rather than re-read is recorded in docs/references.md and
 * in each test's tag, not on screen.
 */
import { describe, expect, it } from 'vitest';
import * as fuses from '../../../shared/standards/fuses';
import * as thresholds from '../../../shared/standards/thresholds';
import { SRC } from '../../../shared/reckoners/outputs';
import { run } from '../helpers';

const windings = [
  { label: 'HT', volts: '300 V', amps: '0.1 A' },
  { label: 'Heaters', volts: '6.3 V', amps: '3 A' },
];
const noteOf = (notes: (string | undefined)[]) => notes.filter(Boolean).join('\n');

describe('source notes shown to people', () => {
  it('every standard’s source note cites the standard, without "(from memory)"', () => {
    const notes = Object.entries({ ...fuses, ...thresholds, ...SRC }).filter(
      ([k, v]) => typeof v === 'string' && (k.endsWith('_SOURCE') || k in SRC),
    );
    expect(notes.length).toBeGreaterThan(4);
    for (const [k, v] of notes) expect(v, k).not.toMatch(/memory/i);
    expect(fuses.TIME_LAG_GATES_SOURCE).toBe('IEC 60127-2, standard sheet 3');
  });

  it('results and cautions of a quick-acting mains fuse, a hazardous node and an off-rating heater carry no "(from memory)"', () => {
    const fuse = run('mains-fuse', { windings, mainsVoltage: '230 V', fuseType: 'F' });
    const node = run('peak-no-load', { windingVoltage: 300, filterNodes: 3 });
    const heaters = run('heater-budget', {
      windingVoltage: '6.3 V',
      windingCurrent: '3 A',
      heaters: [{ label: 'V1', volts: '12.6 V', amps: '0.15 A' }],
    });
    const all = [fuse, node, heaters].flatMap((r) => [
      ...Object.values(r.outputs).map((o) => o.source),
      ...r.cautions.flatMap((c) => [c.source, c.message]),
    ]);
    // The cautions this test is about were raised, so their notes were read.
    expect(fuse.cautions.map((c) => c.code)).toContain('quick-acting-fuse');
    expect(node.cautions.map((c) => c.code)).toContain('hazardous-voltage');
    expect(heaters.cautions.map((c) => c.code)).toContain('heater-voltage');
    expect(noteOf(all)).not.toMatch(/memory/i);
  });
});
