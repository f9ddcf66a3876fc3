import type { ReactNode } from 'react';
import type { FieldValues, FormState } from 'react-hook-form';
import { Notice } from './notice';

/** The form's own refusal (set by showServerError): what is not about one field, with any detail. */
export function FormProblem<T extends FieldValues>({
  formState,
  children,
}: {
  formState: FormState<T>;
  children?: ReactNode;
}) {
  const message = formState.errors.root?.server?.message;
  return message ? (
    <Notice tone="error">
      {message}
      {children}
    </Notice>
  ) : null;
}
