import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { UnitPhotoView } from '@shared/schemas/units';
import { unitKeys } from '../api/keys';
import { uploadUnitPhoto } from '../api/upload-photo';

export function UnitPhotos({
  unitId,
  photos,
  canAdd,
}: {
  unitId: string;
  photos: UnitPhotoView[];
  canAdd: boolean;
}) {
  const id = useId();
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
          <label
            htmlFor={id}
            className="inline-flex min-h-12 cursor-pointer items-center rounded-md border border-rule bg-card px-4 text-sm font-semibold hover:bg-paper-deep"
          >
            {add.isPending ? 'Sending…' : 'Add photo'}
            <input
              id={id}
              type="file"
              accept="image/png,image/jpeg,image/webp"
              capture="environment"
              className="sr-only"
              onChange={(e) => {
                const f = e.target.files?.[0];
                if (f) add.mutate(f);
                e.target.value = '';
              }}
            />
          </label>
          {add.error && <span className="text-sm text-out">{add.error.message}</span>}
        </div>
      )}
    </div>
  );
}
