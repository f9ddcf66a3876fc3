import { useMemo } from 'react';
import type { ValueChange } from '@shared/schemas/review';
import { LazyReckonerPlotPairs } from '@/components/plots/lazy-reckoner-plot';
import { useRevision } from '@/features/procedures/api/get-revision';

/**
 * The picture of each reckoner block that changed since the compared revision, before beside after,
 * drawn from each revision's stored results (blocks followed by their stable id across renames).
 */
export function ChangedPictures({
  base,
  revision,
  changes,
}: {
  base: { id: string; number: number };
  revision: { id: string; number: number };
  changes: ValueChange[];
}) {
  const before = useRevision(base.id).data?.revision.snapshot;
  const after = useRevision(revision.id).data?.revision.snapshot;
  const pairs = useMemo(() => {
    if (!before || !after) return [];
    const labels = new Map(
      changes.flatMap((c) => (c.blockId ? [[c.blockId, c.blockLabel ?? c.subject]] : [])),
    );
    return [...labels].map(([id, title]) => ({
      key: id,
      title,
      before: {
        label: `Before: revision ${base.number}`,
        block: before.blocks.find((b) => b.id === id),
        readings: before.readings,
      },
      after: {
        label: `After: revision ${revision.number}`,
        block: after.blocks.find((b) => b.id === id),
        readings: after.readings,
      },
    }));
  }, [before, after, changes, base.number, revision.number]);
  return <LazyReckonerPlotPairs heading="Pictures of the changed calculations" pairs={pairs} />;
}
