import type { ValueChange } from '@shared/schemas/review';

const KIND_LABELS: Record<ValueChange['kind'], string> = { parameter: 'Parameter', output: 'Reckoner', reading: 'Reading' };

/** Every number that moved: reckoner outputs, reading expectations, tolerances and bands, parameters. */
export function ValueChangesTable({ changes }: { changes: ValueChange[] }) {
  if (!changes.length) return <p className="text-sm text-graphite-soft">No calculated value, reading or parameter changed.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-card">
      <table aria-label="Value changes" className="w-full text-left text-sm">
        <thead className="border-b border-rule bg-paper-deep">
          <tr>
            <th className="px-3 py-2">Kind</th>
            <th className="px-3 py-2">Block</th>
            <th className="px-3 py-2">Value</th>
            <th className="px-3 py-2">Before</th>
            <th className="px-3 py-2">After</th>
          </tr>
        </thead>
        <tbody>
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
        </tbody>
      </table>
    </div>
  );
}
