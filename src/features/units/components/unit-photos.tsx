import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { UnitPhotoView } from '@shared/schemas/units';
import { unitKeys } from '../api/keys';
import { uploadUnitPhoto } from '../api/upload-photo';
import { PhotoPicker } from '@/components/ui/photo-picker';

export function UnitPhotos({
  unitId,
  photos,
  canAdd,
}: {
  unitId: string;
  photos: UnitPhotoView[];
  canAdd: boolean;
}) {
  const queryClient = useQueryClient();
  const [caption, setCaption] = useState('');
  const add = useMutation({
    mutationFn: (file: File) => uploadUnitPhoto(unitId, file, caption),
    onSuccess: () => {
      setCaption('');
      return queryClient.invalidateQueries({ queryKey: unitKeys.detail(unitId) });
    },
  });
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-3">
        {photos.map((p) => (
          <figure key={p.id} className="w-40">
            <img
              src={p.url}
              alt={p.caption || 'Unit photo'}
              className="h-32 w-40 rounded border border-rule object-cover"
            />
            <figcaption className="text-xs text-graphite-soft">
              {p.caption || new Date(p.addedAt).toLocaleDateString()}
            </figcaption>
          </figure>
        ))}
        {!photos.length && <p className="text-sm text-graphite-soft">No photos yet.</p>}
      </div>
      {canAdd && (
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1 text-sm font-semibold">
            Caption
            <input
              value={caption}
              onChange={(e) => setCaption(e.target.value)}
              className="min-h-12 rounded-md border border-rule bg-card px-3 font-normal"
            />
          </label>
          <PhotoPicker
            onPick={(file) => add.mutate(file)}
            pending={add.isPending}
            error={add.error}
            pendingText="Sending…"
          />
        </div>
      )}
    </div>
  );
}
