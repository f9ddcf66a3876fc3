import { useId, type ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'quiet' | 'danger';

const styles: Record<Variant, string> = {
  primary: 'bg-accent text-white hover:bg-accent-deep border-accent-deep',
  quiet: 'bg-card text-graphite hover:bg-paper-deep border-rule',
  danger: 'bg-card text-out hover:bg-out-wash border-out',
};

/** Why a control cannot be used now, shown beside it and read with it (its aria-describedby). */
export function WhyDisabled({ id, why }: { id: string; why: string | false | null | undefined }) {
  if (!why) return null;
  return (
    <span id={id} data-why-disabled className="text-xs text-graphite-soft">
      {why}
    </span>
  );
}

export function Button({
  variant = 'primary',
  className = '',
  whyDisabled,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: Variant;
  /** Shown beside the button while it is disabled: a greyed-out button says why. */
  whyDisabled?: string;
}) {
  const id = useId();
  const why = props.disabled && whyDisabled;
  return (
    <>
      <button
        type="button"
        className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-md border px-4 py-2 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${styles[variant]} ${className}`}
        {...props}
        aria-describedby={why ? id : props['aria-describedby']}
      />
      <WhyDisabled id={id} why={why} />
    </>
  );
}
