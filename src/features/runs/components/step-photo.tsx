import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunPhotoView } from '@shared/schemas/runs';
import { uploadStepPhoto } from '../api/upload-photo';
import { runKeys } from '../api/keys';
import { PhotoPicker } from '@/components/ui/photo-picker';

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
        <PhotoPicker onPick={(file) => upload.mutate(file)} pending={upload.isPending} error={upload.error} />
      )}
    </div>
  );
}
