import { inputLabel } from '@shared/document/block-view';
import { nodeDef, type DocNode, type ProcedureDoc } from '@shared/document/schema';
import { getReckoner } from '@shared/reckoners';
import { humanize, withLabel } from '@shared/schemas/problems';
import type { FieldProblem } from '@/lib/api-client';

/**
 * "body.document.content.3.attrs.inputs.windings.0.volts" → "Block 4 (Mains fuse), Winding 1 voltage":
 * blocks by their kind's label, fields by the labels their forms show.
 */
export function describeField(field: string, doc: ProcedureDoc): string {
  if (!field.startsWith('body.document'))
    return humanize(
      field
        .replace(/^(body|query|params)\./, '')
        .split('.')
        .pop() ?? field,
    );
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
    const kind = typeof a.kind === 'string' ? getReckoner(a.kind)?.label : undefined;
    const label = kind ?? (node ? (nodeDef(node.type)?.label ?? node.type) : 'missing block');
    const named = !kind && typeof a.label === 'string' && a.label ? ` “${a.label}”` : '';
    where.push(`block ${index + 1} (${label}${named})`);
    i += 2;
  }
  const rest = parts.slice(i).filter((p) => p !== 'attrs');
  const a = (node?.attrs ?? {}) as Record<string, unknown>;
  const fields = typeof a.kind === 'string' ? getReckoner(a.kind)?.fields : undefined;
  const what =
    rest[0] === 'inputs' && fields && rest.length > 1
      ? inputLabel(fields, rest.slice(1).join('.'))
      : rest.length
        ? humanize(rest.filter((p) => !/^\d+$/.test(p)).pop() ?? '')
        : '';
  const place = where.join(' › ') || 'the document';
  return [place.charAt(0).toUpperCase() + place.slice(1), what].filter(Boolean).join(', ');
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
              {p.label ? p.reason : withLabel(describeField(p.field, doc), p.reason)}
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-1">{message}</p>
      )}
    </div>
  );
}
