/**
 * What a page or panel shows while its data is on the way: a few grey lines where the content will
 * be (still when the person asked for reduced motion) and the words for screen readers.
 */
export function Loading({ what = 'this page', lines = 4 }: { what?: string; lines?: number }) {
  return (
    <div role="status" className="flex flex-col gap-3 py-2" data-loading>
      <span className="sr-only">Loading {what}…</span>
      <div aria-hidden="true" className="h-7 w-2/5 rounded bg-paper-deep motion-safe:animate-pulse" />
      {Array.from({ length: lines }, (_, i) => (
        <div
          key={i}
          aria-hidden="true"
          className={`h-4 rounded bg-paper-deep motion-safe:animate-pulse ${i % 3 === 2 ? 'w-3/5' : 'w-full'}`}
        />
      ))}
    </div>
  );
}
