import { getReckoner } from '../../../shared/reckoners';
import { validateDocument, walk, type ProcedureDoc } from '../../../shared/document/schema';
import type { FieldProblem } from '../../http/errors';

/**
 * Server-side check of a submitted document: the allowed node/mark/attribute set, then each
 * reckoner's kind and input names against the registry. Values out of range are not refused here:
 * the evaluated snapshot carries them as block errors and the procedure check lists them.
 */
export function checkDocument(
  input: unknown,
  where = 'body.document',
): { ok: true; doc: ProcedureDoc } | { ok: false; problems: FieldProblem[] } {
  const result = validateDocument(input);
  if (!result.ok) {
    return {
      ok: false,
      problems: result.problems.map((p) => ({ field: `${where}.${p.path}`, reason: p.reason })),
    };
  }
  const problems: FieldProblem[] = [];
  walk(result.doc, (node, path) => {
    if (node.type !== 'reckoner') return;
    const attrs = node.attrs as { kind: string; inputs: Record<string, unknown> };
    const def = getReckoner(attrs.kind);
    if (!def) {
      problems.push({
        field: `${where}.${path}.attrs.kind`,
        reason: `unknown reckoner kind "${attrs.kind.slice(0, 40)}"`,
      });
      return;
    }
    const known = new Set(def.fields.map((f) => f.key));
    for (const key of Object.keys(attrs.inputs)) {
      if (!known.has(key))
        problems.push({
          field: `${where}.${path}.attrs.inputs.${key}`,
          reason: `the ${def.kind} reckoner has no input "${key}"`,
        });
    }
  });
  return problems.length ? { ok: false, problems } : { ok: true, doc: result.doc };
}
