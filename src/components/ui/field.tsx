import { useId, type ComponentProps, type ReactNode } from 'react';

interface Labelled {
  label: string;
  /** Shown beside the field and announced; replaces the hint while present. */
  error?: string;
  hint?: string;
}

/** The label, the control and its hint or error, tied together for screen readers. */
function FieldShell({
  label,
  error,
  hint,
  children,
}: Labelled & { children: (control: ComponentProps<'input'>) => ReactNode }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      {children({
        id,
        'aria-invalid': error ? true : undefined,
        'aria-describedby': error ? `${id}-error` : hint ? `${id}-hint` : undefined,
      })}
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

const control = (error: string | undefined, className = 'bg-card') =>
  `rounded-md border px-3 py-2 text-base ${className} ${error ? 'border-out' : 'border-rule'}`;

/** A labelled input with its error underneath (takes react-hook-form's `register(...)` spread). */
export function Field({ label, error, hint, className, ...input }: ComponentProps<'input'> & Labelled) {
  return (
    <FieldShell label={label} error={error} hint={hint}>
      {(aria) => <input {...aria} className={`min-h-11 ${control(error, className)}`} {...input} />}
    </FieldShell>
  );
}

export function TextareaField({
  label,
  error,
  hint,
  className,
  ...textarea
}: ComponentProps<'textarea'> & Labelled) {
  return (
    <FieldShell label={label} error={error} hint={hint}>
      {(aria) => (
        <textarea
          {...(aria as ComponentProps<'textarea'>)}
          className={`min-h-20 ${control(error, className)}`}
          {...textarea}
        />
      )}
    </FieldShell>
  );
}

export function SelectField({
  label,
  error,
  hint,
  className,
  ...select
}: ComponentProps<'select'> & Labelled) {
  return (
    <FieldShell label={label} error={error} hint={hint}>
      {(aria) => (
        <select
          {...(aria as ComponentProps<'select'>)}
          className={`min-h-11 ${control(error, className)}`}
          {...select}
        />
      )}
    </FieldShell>
  );
}
