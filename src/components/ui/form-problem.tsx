import type { FieldValues, FormState } from 'react-hook-form';
import { Notice } from './notice';

/** The form's own refusal (set by showServerError): what is not about one field. */
export function FormProblem<T extends FieldValues>({ formState }: { formState: FormState<T> }) {
  const message = formState.errors.root?.server?.message;
  return message ? <Notice tone="error">{message}</Notice> : null;
}
