import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId } from 'react';
import type { RunPhotoView } from '@shared/schemas/runs';
import { uploadStepPhoto } from '../api/upload-photo';
import { runKeys } from '../api/keys';

/** A photo for one step, taken with the tablet's camera where it has one. */
export function StepPhoto({
  runId,
  stepId,
  photos,
  disabled,
}: {
  runId: string;
  stepId: string;
  photos: RunPhotoView[];
  disabled?: boolean;
}) {
  const id = useId();
  const queryClient = useQueryClient();
  const upload = useMutation({
    mutationFn: (file: File) => uploadStepPhoto(runId, stepId, file),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: runKeys.detail(runId) }),
  });
  return (
    <div className="flex flex-wrap items-center gap-3">
      {photos.map((p) => (
        <a key={p.id} href={p.url} target="_blank" rel="noreferrer" className="block">
          <img
            src={p.url}
            alt={`Photo for this step by ${p.addedBy.displayName}`}
            className="size-16 rounded border border-rule object-cover"
          />
        </a>
      ))}
      {!disabled && (
        <label
          htmlFor={id}
          className="inline-flex min-h-12 cursor-pointer items-center rounded-md border border-rule bg-card px-4 text-sm font-semibold hover:bg-paper-deep"
        >
          {upload.isPending ? 'Sending photo…' : 'Add photo'}
          <input
            id={id}
            type="file"
            accept="image/png,image/jpeg,image/webp"
            capture="environment"
            className="sr-only"
            onChange={(e) => {
              const file = e.target.files?.[0];
              if (file) upload.mutate(file);
              e.target.value = '';
            }}
          />
        </label>
      )}
      {upload.error && <span className="text-sm text-out">{upload.error.message}</span>}
    </div>
  );
}
