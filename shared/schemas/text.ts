import { z } from 'zod';

/**
 * A one-line name or label (title, model, serial, display name, tag): trimmed, no line breaks or
 * tabs. Control and text-direction characters are refused for every field by the server's input
 * guard; this adds what only a single-line field refuses.
 */
export const oneLine = (max: number, opts: { min?: number; minMessage?: string; label?: string } = {}) =>
  z
    .string()
    .trim()
    .min(opts.min ?? 0, opts.minMessage ?? 'required')
    .max(max, `${opts.label ? `${opts.label}: ` : ''}at most ${max} characters`)
    .refine((s) => !/[\t\n\r]/.test(s), 'must be on one line (no line breaks or tabs)');
