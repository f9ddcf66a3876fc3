import { nodeDef, type DocNode, type ProcedureDoc } from '@shared/document/schema';
import type { FieldProblem } from '@/lib/api-client';

/** "body.document.content.3.attrs.kind" → "block 4 (reckoner “fuse”), kind". */
export function describeField(field: string, doc: ProcedureDoc): string {
  if (!field.startsWith('body.document')) return field.replace(/^body\./, '');
  const parts = field
    .replace(/^body\.document\.?/, '')
    .split('.')
    .filter(Boolean);
  let node: DocNode | undefined = doc;
  const where: string[] = [];
  let i = 0;
  while (i < parts.length && parts[i] === 'content' && node) {
    const index = Number(parts[i + 1]);
    node = node.content?.[index];
    const a = (node?.attrs ?? {}) as Record<string, unknown>;
    const label = node ? (nodeDef(node.type)?.label ?? node.type) : 'missing block';
    where.push(
      `block ${index + 1} (${label}${typeof a.name === 'string' ? ` “${a.name}”` : typeof a.label === 'string' && a.label ? ` “${a.label}”` : ''})`,
    );
    i += 2;
  }
  const rest = parts
    .slice(i)
    .filter((p) => p !== 'attrs')
    .join('.');
  return [where.join(' › ') || 'the document', rest].filter(Boolean).join(', ');
}

/** The server's reasons for refusing a save, in words, beside the draft that is still on screen. */
export function SaveProblems({
  message,
  problems,
  doc,
}: {
  message: string;
  problems: FieldProblem[];
  doc: ProcedureDoc;
}) {
  return (
    <div role="alert" className="rounded-md border border-out bg-out-wash px-4 py-3 text-sm text-out">
      <p className="font-semibold">
        The draft was not saved. Your text is still here and kept on this device.
      </p>
      {problems.length ? (
        <ul className="mt-1 list-disc pl-5">
          {problems.slice(0, 20).map((p) => (
            <li key={p.field + p.reason}>
              <span className="font-semibold">{describeField(p.field, doc)}</span>: {p.reason}
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-1">{message}</p>
      )}
    </div>
  );
}
