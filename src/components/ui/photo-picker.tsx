import { useId } from 'react';

/**
 * "Add photo": a labelled file picker for a bench photo (the rear camera on a phone or tablet),
 * handing the chosen file to `onPick` and clearing itself so the same file can be sent again.
 */
export function PhotoPicker({
  onPick,
  pending,
  error,
  pendingText = 'Sending photo…',
}: {
  onPick: (file: File) => void;
  pending: boolean;
  error?: Error | null;
  pendingText?: string;
}) {
  const id = useId();
  // The file input itself is visually hidden: its label, drawn as a button, shows the keyboard focus.
  return (
    <>
      <label
        htmlFor={id}
        className="inline-flex min-h-12 cursor-pointer items-center rounded-md border border-rule bg-card px-4 text-sm font-semibold hover:bg-paper-deep has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-accent"
      >
        {pending ? pendingText : 'Add photo'}
        <input
          id={id}
          type="file"
          accept="image/png,image/jpeg,image/webp"
          capture="environment"
          className="sr-only"
          onChange={(e) => {
            const file = e.target.files?.[0];
            if (file) onPick(file);
            e.target.value = '';
          }}
        />
      </label>
      {error && <span className="text-sm text-out">{error.message}</span>}
    </>
  );
}
