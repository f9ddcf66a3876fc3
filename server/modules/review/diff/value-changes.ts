/**
 * The numbers a reviewer must see change: each reckoner output (by block name and output label),
 * each reading's expected value, tolerance and band (by reading id), and the procedure parameters.
 */
import type { Snapshot } from '../../../../shared/document/evaluate';
import { PARAM_SPECS } from '../../../../shared/document/params';
import type { ValueChange } from '../../../../shared/schemas/review';
import { formatQuantity } from '../../../../shared/units/format';

export type { ValueChange };

type Values = Map<string, { kind: ValueChange['kind']; subject: string; label: string; value: string }>;

function values(snapshot: Snapshot | null): Values {
  const out: Values = new Map();
  if (!snapshot) return out;
  for (const p of PARAM_SPECS) {
    const v = snapshot.params?.[p.key];
    if (typeof v === 'number') out.set(`param:${p.key}`, { kind: 'parameter', subject: 'Parameters', label: p.label, value: formatQuantity(v, p.unit) });
  }
  for (const block of snapshot.blocks) {
    if (!block.ok) {
      out.set(`block:${block.name}:error`, { kind: 'output', subject: block.name, label: 'errors', value: block.errors.map((e) => `${e.field} ${e.reason}`).join('; ') });
      continue;
    }
    for (const output of Object.values(block.outputs)) {
      out.set(`block:${block.name}:${output.label}`, { kind: 'output', subject: block.name, label: output.label, value: output.formatted });
    }
  }
  for (const r of snapshot.readings) {
    const subject = r.label || r.id;
    const expected = r.expected === null ? `unresolved (${r.error ?? 'no value'})` : formatQuantity(r.expected, r.unit);
    out.set(`reading:${r.id}:expected`, { kind: 'reading', subject, label: 'expected', value: expected });
    out.set(`reading:${r.id}:tolerance`, { kind: 'reading', subject, label: 'tolerance', value: r.toleranceText });
    out.set(`reading:${r.id}:band`, { kind: 'reading', subject, label: 'band', value: r.bandText ?? '—' });
  }
  return out;
}

export function valueChanges(before: Snapshot | null, after: Snapshot): ValueChange[] {
  const a = values(before);
  const b = values(after);
  const changes: ValueChange[] = [];
  for (const [key, v] of b) {
    const old = a.get(key);
    if (old?.value === v.value) continue;
    changes.push({ kind: v.kind, subject: v.subject, label: v.label, before: old?.value ?? null, after: v.value });
  }
  for (const [key, v] of a) {
    if (!b.has(key)) changes.push({ kind: v.kind, subject: v.subject, label: v.label, before: v.value, after: null });
  }
  const order = { parameter: 0, output: 1, reading: 2 } as const;
  return changes.sort((x, y) => order[x.kind] - order[y.kind]);
}
