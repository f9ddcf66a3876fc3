import type { ValueChange } from '@shared/schemas/review';
import { DataTable } from '@/components/ui/data-table';

const KIND_LABELS: Record<ValueChange['kind'], string> = { parameter: 'Parameter', input: 'Input', output: 'Result', block: 'Reckoner', reading: 'Reading' };

/** Every number that moved: reckoner outputs, reading expectations, tolerances and bands, parameters. */
export function ValueChangesTable({ changes }: { changes: ValueChange[] }) {
  if (!changes.length) return <p className="text-sm text-graphite-soft">No calculated value, reading or parameter changed.</p>;
  return (
    <DataTable columns={['Kind', 'Block', 'Value', 'Before', 'After']} label="Value changes">
      {changes.map((c, i) => (
        <tr key={i} className="border-b border-rule last:border-0">
          <td className="px-3 py-2 text-graphite-soft">{KIND_LABELS[c.kind]}</td>
          <td className="px-3 py-2 font-semibold">{c.subject}</td>
          <td className="px-3 py-2">{c.label}</td>
          <td className="px-3 py-2">{c.before === null ? <em className="text-graphite-soft">new</em> : <span className="value">{c.before}</span>}</td>
          <td className="px-3 py-2">
            {c.after === null ? <em className="text-graphite-soft">removed</em> : <span className="value font-semibold">{c.after}</span>}
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
