import type { ValueChange } from '@shared/schemas/review';
import { DataTable } from '@/components/ui/data-table';

const KIND_LABELS: Record<ValueChange['kind'], string> = {
  parameter: 'Parameter',
  input: 'Input',
  output: 'Result',
  block: 'Reckoner',
  reading: 'Reading',
};
const BLOCK_ROWS: Record<string, string> = {
  name: 'Name',
  added: 'Added',
  removed: 'Removed',
  problems: 'Input problems',
};

/** The block is named once for its run of rows: a calm table, not a column of repeats. */
const continues = (rows: ValueChange[], i: number) =>
  i > 0 && rows[i - 1]!.subject === rows[i]!.subject && rows[i - 1]!.blockId === rows[i]!.blockId;

/** A block by its label (its internal name is the editor's business); a reading or the parameters by theirs. */
function Subject({ c, repeat }: { c: ValueChange; repeat: boolean }) {
  const name = c.blockLabel ?? c.subject;
  if (repeat) return <span className="sr-only">{name}</span>;
  return <span className="font-semibold">{name}</span>;
}

function What({ c }: { c: ValueChange }) {
  if (c.kind !== 'block') return <>{c.label}</>;
  if (c.renamedFrom) return <em>reference name changed</em>;
  return <em>{BLOCK_ROWS[c.label] ?? c.label}</em>;
}

/** The figure's name with its kind under it: one column fewer, so the values get the room. */
function Figure({ c }: { c: ValueChange }) {
  return (
    <>
      <What c={c} />
      <span className="block text-xs uppercase tracking-wide text-graphite-soft">{KIND_LABELS[c.kind]}</span>
    </>
  );
}

function Value({
  value,
  source,
  empty,
  strong,
}: {
  value: string | null;
  source?: string | null;
  empty: string;
  strong?: boolean;
}) {
  if (value === null) return <em className="text-graphite-soft">{empty}</em>;
  return (
    <>
      {/* A figure with its unit stays on one line; a longer value (a choice, a list) wraps in its column. */}
      <span
        className={`${value.length > 16 ? 'font-mono tabular-nums break-words' : 'value'} ${strong ? 'font-semibold' : ''}`}
      >
        {value}
      </span>
      {source && <span className="block text-xs text-graphite-soft">{source}</span>}
    </>
  );
}

/** Every figure that moved since the compared revision: parameters, each block's inputs (with their sources) and results, readings. */
export function ValueChangesTable({ changes }: { changes: ValueChange[] }) {
  if (!changes.length)
    return (
      <p className="text-sm text-graphite-soft">No input, calculated value, reading or parameter changed.</p>
    );
  return (
    <DataTable
      columns={['Block', 'Figure', 'Before', 'After']}
      widths={['22%', '30%', '24%', '24%']}
      minWidth="34rem"
      label="Value changes"
    >
      {changes.map((c, i) => (
        <tr key={i} data-kind={c.kind} className="border-b border-rule align-top break-words last:border-0">
          <td className="px-3 py-2">
            <Subject c={c} repeat={continues(changes, i)} />
          </td>
          <td className="px-3 py-2">
            <Figure c={c} />
          </td>
          <td className="px-3 py-2">
            <Value value={c.before} source={c.sourceBefore} empty="new" />
          </td>
          <td className="px-3 py-2">
            <Value value={c.after} source={c.sourceAfter} empty="removed" strong />
          </td>
        </tr>
      ))}
    </DataTable>
  );
}

/** A first revision: what it assumes (every input given, with where it came from) and what follows (key results). */
export function FirstRevisionTable({ rows }: { rows: ValueChange[] }) {
  if (!rows.length)
    return (
      <p className="text-sm text-graphite-soft">This revision has no parameters, calculations or readings.</p>
    );
  return (
    <DataTable
      columns={['Block', 'Figure', 'Value', 'From']}
      widths={['22%', '30%', '26%', '22%']}
      minWidth="34rem"
      label="What this revision assumes"
    >
      {rows.map((c, i) => (
        <tr key={i} data-kind={c.kind} className="border-b border-rule align-top break-words last:border-0">
          <td className="px-3 py-2">
            <Subject c={c} repeat={continues(rows, i)} />
          </td>
          <td className="px-3 py-2">
            <What c={c} />
          </td>
          <td className="px-3 py-2">
            <Value value={c.after} empty="—" strong={c.kind === 'output'} />
          </td>
          <td className="px-3 py-2 text-graphite-soft">
            {c.kind === 'input'
              ? c.sourceAfter
              : c.kind === 'output'
                ? 'calculated'
                : c.kind === 'parameter'
                  ? 'procedure parameter'
                  : ''}
          </td>
        </tr>
      ))}
    </DataTable>
  );
}
