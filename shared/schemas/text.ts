import { z } from 'zod';

/**
 * A one-line name or label (title, model, serial, display name, tag): trimmed, no line breaks or
 * tabs. Control and text-direction characters are refused for every field by the server's input
 * guard; this adds what only a single-line field refuses. `label` is the field's label on its form:
 * refusals name the field by it (shared/schemas/problems.ts).
 */
export const oneLine = (max: number, opts: { min?: number; label?: string } = {}) => {
  const schema = z
    .string()
    .trim()
    .min(opts.min ?? 0)
    .max(max)
    .refine((s) => !/[\t\n\r]/.test(s), 'must be on one line (no line breaks or tabs)');
  return opts.label ? schema.meta({ title: opts.label }) : schema;
};
