import { z } from 'zod';
import { BLOCK_NAME, BLOCK_NAME_RULE, withFollowedParams } from '../../reckoners/field-paths';
import { getReckoner } from '../../reckoners/registry';
import { blockId, defineNode, esc, shortText } from './define';

// ── values inside reckoner inputs: literals, rows, references ─────────────────
export type InputValue =
  | number
  | string
  | boolean
  | null
  | { ref: string }
  | { param: string }
  | InputValue[]
  | { [key: string]: InputValue };

export const inputValueSchema: z.ZodType<InputValue> = z.lazy(() =>
  z.union([
    z.number().refine(Number.isFinite, 'must be a finite number'),
    shortText(200),
    z.boolean(),
    z.null(),
    z.array(inputValueSchema).max(100, 'at most 100 rows'),
    z.record(z.string().max(40), inputValueSchema),
  ]),
);

/** A live calculation block: kind, name, inputs; outputs are computed, never stored in the node. */
export const reckonerAttrs = z
  .object({
    id: blockId,
    /** Short name other blocks use to refer to this one's outputs ("bplus" → "bplus.averageDc"). */
    name: z.string().regex(BLOCK_NAME, BLOCK_NAME_RULE),
    kind: z.string().max(40),
    inputs: z.record(z.string().max(40), inputValueSchema),
  })
  .strict();
export type ReckonerAttrs = z.infer<typeof reckonerAttrs>;

export const reckoner = defineNode({
  attrs: reckonerAttrs,
  content: 'none',
  label: 'reckoner',
  many: 'reckoners',
  defaults: { id: '', name: '', kind: '', inputs: {} },
  // Summarised from the snapshot by whoever needs it.
  text: () => [],
  // An empty field that follows a procedure parameter is pointed at it, so a block inserted before
  // the declarations follows the bench's measured mains.
  upgrade: (a, { reckoners }) => {
    const def = reckoners ? getReckoner(String(a.kind)) : undefined;
    if (!def || !a.inputs || typeof a.inputs !== 'object') return undefined;
    const up = withFollowedParams(a.inputs, def.fields);
    return up.followed.size ? { ...a, inputs: up.inputs } : undefined;
  },
  html: (a, { block }) => {
    const b = block(a.id);
    if (!b) return '';
    const rows = b.ok
      ? Object.values(b.outputs)
          .map((o) => `<tr><th>${esc(o.label)}</th><td>${esc(o.formatted)}</td></tr>`)
          .join('')
      : b.errors.map((e) => `<tr><th>${esc(e.field)}</th><td>${esc(e.reason)}</td></tr>`).join('');
    return `<table class="reckoner"><caption>${esc(b.name)}</caption><tbody>${rows}</tbody></table>`;
  },
});
