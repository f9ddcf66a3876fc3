import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type FieldValues, type Path, type UseFormProps, type UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';
import type { ApiError } from './api-client';

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
 * Puts a refusal on the form: each field problem of a 400 beside its field (the server's `body.model`
 * is the form's `model`, or `rename[...]` of it); a message written for people, and any problem with no
 * field on this form, as the form's own error (`root.server`, shown by FormProblem).
 */
export function showServerError<T extends FieldValues>(
  form: AnyForm<T>,
  error: ApiError,
  rename: Record<string, string> = {},
) {
  // The server joins zod's field problems into its message ("body.model: required"): not for people.
  const generated = error.fields.map((f) => `${f.field}: ${f.reason}`).join('; ');
  const written = error.message === generated ? '' : error.message;
  const elsewhere: string[] = [];
  for (const problem of error.fields) {
    // "body.tags.2" is about the tags field (a list typed as one line, or checkboxes).
    const path = problem.field.replace(/^body\./, '').replace(/(\.\d+)+$/, '');
    const name = (rename[path] ?? path) as Path<T>;
    if (form.getValues(name) === undefined) elsewhere.push(`${path.split('.').pop()}: ${problem.reason}`);
    // One field refused with a message written for people: that message, beside the field.
    else if (written && error.fields.length === 1)
      return form.setError(name, { type: 'server', message: written });
    else form.setError(name, { type: 'server', message: problem.reason });
  }
  const message = [written, ...elsewhere].filter(Boolean).join(' ');
  if (message) form.setError('root.server', { type: String(error.status), message });
}
