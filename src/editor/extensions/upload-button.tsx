import { useRef, useState } from 'react';
import type { AttachmentView } from '@shared/schemas/procedures';
import { uploadAttachment } from '@/features/procedures/api/upload-attachment';

interface Props {
  label: string;
  accept: string;
  onUploaded: (attachment: AttachmentView) => void;
  className?: string;
}

/** A button that picks a file, uploads it and reports the stored attachment, or shows why it failed. */
export function UploadButton({ label, accept, onUploaded, className = '' }: Props) {
  const input = useRef<HTMLInputElement>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const upload = async (file: File | undefined) => {
    if (!file) return;
    setBusy(true);
    setError(null);
    try {
      onUploaded(await uploadAttachment(file));
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(false);
      if (input.current) input.current.value = '';
    }
  };
  return (
    <span className="inline-flex items-center gap-2">
      <input
        ref={input}
        type="file"
        accept={accept}
        className="sr-only"
        tabIndex={-1}
        aria-hidden
        onChange={(e) => void upload(e.target.files?.[0])}
      />
      <button
        type="button"
        className={className || 'min-h-9 rounded border border-rule bg-card px-2 text-xs hover:bg-paper-deep'}
        disabled={busy}
        onClick={() => input.current?.click()}
      >
        {busy ? 'Uploading…' : label}
      </button>
      {error && (
        <span role="alert" className="text-xs text-out">
          {error} Nothing else in the draft changed.
        </span>
      )}
    </span>
  );
}
