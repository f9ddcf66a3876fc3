import { useId, type InputHTMLAttributes } from 'react';

/** A labelled input with its error underneath, announced to screen readers. */
export function Field({
  label,
  error,
  hint,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: string }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        className={`min-h-11 rounded-md border bg-card px-3 py-2 text-base ${error ? 'border-out' : 'border-rule'}`}
        {...input}
      />
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-graphite-soft">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} role="alert" className="text-sm text-out">
          {error}
        </p>
      )}
    </div>
  );
}
