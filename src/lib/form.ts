import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type FieldValues, type Path, type UseFormProps, type UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';
import type { ApiError, FieldProblem } from './api-client';

/** A form whose state lives in react-hook-form and whose rules are a zod schema (the server's, where one exists). */
export function useZodForm<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
  options: Omit<UseFormProps<z.input<S>, unknown, z.output<S>>, 'resolver'> = {},
) {
  return useForm<z.input<S>, unknown, z.output<S>>({ ...options, resolver: zodResolver(schema) });
}

// Each form's own type parameters are not needed to set errors on it.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyForm<T extends FieldValues> = UseFormReturn<T, any, any>;

/**
 * Puts each field problem beside its field (the server's `body.model` is the form's `model`, or
 * `rename[...]` of it, "body.tags.2" is `tags`); returns those with no field on this form, readably.
 */
export function setFieldProblems<T extends FieldValues>(
  form: AnyForm<T>,
  problems: readonly FieldProblem[],
  rename: Record<string, string> = {},
  /** One message written for people, to show beside the one field instead of its reason. */
  written = '',
): string[] {
  const elsewhere: string[] = [];
  for (const problem of problems) {
    const path = problem.field.replace(/^body\./, '').replace(/(\.\d+)+$/, '');
    const name = (rename[path] ?? path) as Path<T>;
    if (form.getValues(name) === undefined) elsewhere.push(`${path.split('.').pop()}: ${problem.reason}`);
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
  // The server joins zod's field problems into its message ("body.model: required"): not for people.
  const generated = error.fields.map((f) => `${f.field}: ${f.reason}`).join('; ');
  const written = error.message === generated ? '' : error.message;
  const one = written && error.fields.length === 1;
  const elsewhere = setFieldProblems(form, error.fields, rename, one ? written : '');
  const message = [one && !elsewhere.length ? '' : written, ...elsewhere].filter(Boolean).join(' ');
  if (message) form.setError('root.server', { type: String(error.status), message });
}
