/** Small procedure documents for the block-description and review-diff tests. */
import { evaluateDocument, type Snapshot } from '../../../shared/document/evaluate';
import type { ProcedureDoc } from '../../../shared/document/schema';

export const params = { mainsNominal: 230, mainsVoltage: 240, mainsFrequency: 50 };

export const reckoner = (id: string, name: string, kind: string, inputs: Record<string, unknown>) => ({
  type: 'reckoner',
  attrs: { id, name, kind, inputs },
});

/** A centre-tapped HT winding: 250 V rated at nominal mains; "Actual mains" left empty, so it follows the measured mains. */
export const htBlock = (name = 'ht', volts = '250 V') =>
  reckoner('blk-ht', name, 'peak-no-load', {
    windingVoltage: volts,
    rectifier: 'silicon-centre-tap',
    mainsNominal: { param: 'mainsNominal' },
  });

export const bleedBlock = (from = 'ht') =>
  reckoner('blk-bleed', 'bleed', 'bleeder', {
    capacitance: '47 µF',
    chargedVoltage: { ref: `${from}.noLoadDc` },
    bleederResistance: '220 kΩ',
  });

export const fuseBlock = (efficiency: unknown = '85 %', mainsVoltage: unknown = '230 V') =>
  reckoner('blk-fuse', 'fuse', 'mains-fuse', {
    windings: [
      { label: 'HT', volts: '250 V', amps: '100 mA' },
      { label: 'Heaters', volts: '6.3 V', amps: '2 A' },
    ],
    mainsVoltage,
    efficiency,
  });

export const reading = (expected: string, tolerance = '±5 %') => ({
  type: 'reading',
  attrs: {
    id: 'rd-b1',
    label: 'B+1',
    testPoint: 'reservoir',
    meterRange: '1000 V DC',
    unit: 'V',
    expected: { ref: expected },
    tolerance,
  },
});

export const doc = (...blocks: unknown[]): ProcedureDoc =>
  ({
    type: 'doc',
    content: [
      { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'First power-up' }] },
      ...blocks,
    ],
  }) as ProcedureDoc;

/**
 * A value after a round trip through a PostgreSQL jsonb column, which keeps no key order: it
 * stores keys shorter first, then bytewise (PostgreSQL manual, "JSON Types": jsonb "does not
 * preserve the order of object keys"; the shorter-first order is what it does, from memory).
 */
export function likeJsonb<T>(value: T): T {
  if (Array.isArray(value)) return value.map(likeJsonb) as T;
  if (typeof value !== 'object' || value === null) return value;
  const keys = Object.keys(value).sort((a, b) => a.length - b.length || (a < b ? -1 : a > b ? 1 : 0));
  return Object.fromEntries(keys.map((k) => [k, likeJsonb((value as Record<string, unknown>)[k])])) as T;
}

/** The snapshot as the server stores and reads it back. */
export const stored = (d: ProcedureDoc, p = params): Snapshot =>
  likeJsonb(JSON.parse(JSON.stringify(evaluateDocument(d, p))) as Snapshot);

/** A snapshot as stored before blocks carried their validated input and sources. */
export function withoutInputs(s: Snapshot): Snapshot {
  return {
    ...s,
    blocks: s.blocks.map((b) => (b.ok ? (({ input: _i, sources: _s, ...rest }) => rest)(b) : b)),
  } as unknown as Snapshot;
}
