import { toNestErrors } from '@hookform/resolvers';
import {
  useForm,
  type FieldError,
  type FieldValues,
  type Path,
  type Resolver,
  type UseFormProps,
  type UseFormReturn,
} from 'react-hook-form';
import type { z } from 'zod';
import { labelOf, problemsMessage, problemsOf } from '@shared/schemas/problems';
import type { ApiError, FieldProblem } from './api-client';
import { problemSentence } from './problem-sentence';

export { labelOf, problemSentence };

/**
 * react-hook-form's resolver over a zod schema, with each problem worded as the server words it
 * (shared/schemas/problems.ts): "Model is required", never zod's own message.
 */
function wordedResolver<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
): Resolver<z.input<S>, unknown, z.output<S>> {
  return async (values, _context, options) => {
    const result = await schema.safeParseAsync(values, { reportInput: true });
    if (result.success) return { values: result.data, errors: {} };
    const errors: Record<string, FieldError> = {};
    for (const p of problemsOf(schema, result.error.issues))
      errors[p.field] ??= { type: 'zod', message: p.reason };
    return { values: {}, errors: toNestErrors(errors, options) };
  };
}

/** A form whose state lives in react-hook-form and whose rules are a zod schema (the server's, where one exists). */
export function useZodForm<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
  options: Omit<UseFormProps<z.input<S>, unknown, z.output<S>>, 'resolver'> = {},
) {
  return useForm<z.input<S>, unknown, z.output<S>>({ ...options, resolver: wordedResolver(schema) });
}

// Each form's own type parameters are not needed to set errors on it.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyForm<T extends FieldValues> = UseFormReturn<T, any, any>;

/**
 * Puts each field problem beside its field (the server's `body.model` is the form's `model`, or
 * `rename[...]` of it, "body.tags.2" is `tags`); returns those with no field on this form, as sentences.
 */
export function setFieldProblems<T extends FieldValues>(
  form: AnyForm<T>,
  problems: readonly FieldProblem[],
  rename: Record<string, string> = {},
  /** One message written for people, to show beside the one field instead of its reason. */
  written = '',
): string[] {
  const elsewhere: string[] = [];
  for (const problem of problems.map(problemSentence)) {
    const path = problem.field.replace(/^body\./, '').replace(/(\.\d+)+$/, '');
    const name = (rename[path] ?? path) as Path<T>;
    if (form.getValues(name) === undefined) elsewhere.push(problem.reason);
    else form.setError(name, { type: 'server', message: written || problem.reason });
  }
  return elsewhere;
}

/**
 * Puts a refusal on the form: its field problems beside their fields; a message written for people
 * beside the one field it is about, or else (with any problem this form has no field for) as the
 * form's own error (`root.server`, shown by FormProblem).
 */
export function showServerError<T extends FieldValues>(
  form: AnyForm<T>,
  error: ApiError,
  rename: Record<string, string> = {},
) {
  // A message that only joins the field problems says nothing the fields do not.
  const generated = problemsMessage(error.fields);
  const written = error.message === generated ? '' : error.message;
  const one = written && error.fields.length === 1;
  const elsewhere = setFieldProblems(form, error.fields, rename, one ? written : '');
  const message = [one && !elsewhere.length ? '' : written, ...elsewhere]
    .filter(Boolean)
    .map((m) => (/[.?!]$/.test(m) ? m : `${m}.`))
    .join(' ');
  if (message) form.setError('root.server', { type: String(error.status), message });
}
